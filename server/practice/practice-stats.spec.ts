import { describe, expect, it } from 'vitest';
import { assignmentStatus, minutesPerWeek, practiceStreak, weekStart } from './practice-stats';

describe('practiceStreak', () => {
  it('counts days in a row back from today', () => {
    const days = new Set(['2026-03-08', '2026-03-09', '2026-03-10', '2026-03-06']);
    expect(practiceStreak(days, '2026-03-10')).toBe(3);
  });

  it('keeps yesterday’s streak while today has no practice yet, and is 0 after a gap day', () => {
    const days = new Set(['2026-03-08', '2026-03-09']);
    expect(practiceStreak(days, '2026-03-10')).toBe(2);
    expect(practiceStreak(days, '2026-03-11')).toBe(0);
  });

  it('crosses month ends', () => {
    expect(practiceStreak(new Set(['2026-02-28', '2026-03-01']), '2026-03-01')).toBe(2);
  });
});

describe('minutesPerWeek', () => {
  it('starts weeks on Monday, as ISO 8601 weeks do (ISO 8601-1:2019, week definition; from memory)', () => {
    // 2026-03-04 is a Wednesday; 2026-03-08 a Sunday (from memory, checked by Date below).
    expect(new Date('2026-03-04T00:00:00Z').getUTCDay()).toBe(3);
    expect(weekStart('2026-03-04')).toBe('2026-03-02');
    expect(weekStart('2026-03-08')).toBe('2026-03-02');
    expect(weekStart('2026-03-09')).toBe('2026-03-09');
  });

  it('sums per week and fills weeks without practice with 0', () => {
    const logs = [
      { practisedAt: '2026-03-02T18:00:00Z', minutes: 20 },
      { practisedAt: '2026-03-08T18:00:00Z', minutes: 15 },
      { practisedAt: '2026-03-17T18:00:00Z', minutes: 30 },
    ];
    expect(minutesPerWeek(logs)).toEqual([
      { weekStart: '2026-03-02', minutes: 35 },
      { weekStart: '2026-03-09', minutes: 0 },
      { weekStart: '2026-03-16', minutes: 30 },
    ]);
    expect(minutesPerWeek([])).toEqual([]);
  });
});

describe('assignmentStatus', () => {
  const base = { targetTempo: 100, dueDate: '2026-03-10' };
  it.each([
    [null, '2026-03-09', 'not_started'],
    [90, '2026-03-10', 'practising'],
    [100, '2026-03-09', 'target_reached'],
    [120, '2026-04-01', 'target_reached'],
    [90, '2026-03-11', 'overdue'],
    [null, '2026-03-11', 'overdue'],
  ] as const)('best %s on %s is %s', (bestTempo, today, status) => {
    expect(assignmentStatus({ ...base, bestTempo, today })).toBe(status);
  });
});
