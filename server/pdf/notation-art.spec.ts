import { describe, expect, it } from 'vitest';
import { clearNotationCache, notationArt } from './notation-art';
import { ALL_AIDS, presetDrill } from './testing/sample-print';

describe('notationArt', () => {
  const drill = presetDrill('early-backbeat', 4, 'cache-1').drill;

  it('keeps a drawing for the same drill, aids and room, and draws anew for any other', () => {
    clearNotationCache();
    const first = notationArt(drill, ALL_AIDS, 0.6);
    expect(notationArt(drill, ALL_AIDS, 0.6)).toBe(first);
    // A copy of the drill (as read again from the database) finds the same drawing.
    expect(notationArt(structuredClone(drill), ALL_AIDS, 0.6)).toBe(first);
    const withoutCounts = notationArt(drill, { ...ALL_AIDS, counts: false }, 0.6);
    expect(withoutCounts).not.toBe(first);
    expect(withoutCounts.svg).not.toBe(first.svg);
    const other = presetDrill('early-backbeat', 4, 'cache-2').drill;
    expect(notationArt(other, ALL_AIDS, 0.6).svg).not.toBe(first.svg);
  }, 60_000);

  it('gives from its cache what a fresh engraving gives', () => {
    const kept = notationArt(drill, ALL_AIDS, 0.6);
    clearNotationCache();
    const fresh = notationArt(drill, ALL_AIDS, 0.6);
    expect(fresh).not.toBe(kept);
    // VexFlow numbers its elements from a running counter; print drawings carry no ids.
    expect(fresh).toEqual(kept);
  }, 60_000);
});
