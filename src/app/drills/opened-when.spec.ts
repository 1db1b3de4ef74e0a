import { describe, expect, it } from 'vitest';

import { openedWhen } from './opened-when';

describe('openedWhen', () => {
  // Local times, so calendar days are the reader's own.
  const now = new Date(2026, 2, 14, 18, 30).getTime();
  const when = (y: number, mo: number, d: number, h: number, mi: number) =>
    openedWhen(new Date(y, mo, d, h, mi).toISOString(), now);

  it('says "just now" within the minute', () => {
    expect(when(2026, 2, 14, 18, 30)).toBe('just now');
  });

  it('counts minutes, then hours, on the same day', () => {
    expect(when(2026, 2, 14, 18, 18)).toBe('12 minutes ago');
    expect(when(2026, 2, 14, 18, 29)).toBe('1 minute ago');
    expect(when(2026, 2, 14, 15, 0)).toBe('3 hours ago');
  });

  it('calls the previous calendar day "yesterday", then counts days for a week', () => {
    expect(when(2026, 2, 13, 9, 0)).toBe('yesterday');
    expect(when(2026, 2, 11, 20, 0)).toBe('3 days ago');
  });

  it('gives the date past a week, with the year only when it differs', () => {
    expect(when(2026, 1, 2, 10, 0)).toBe('Feb 2');
    expect(when(2025, 11, 24, 10, 0)).toBe('Dec 24, 2025');
  });

  it('says nothing for a time it cannot read', () => {
    expect(openedWhen('not a date', now)).toBe('');
  });
});
