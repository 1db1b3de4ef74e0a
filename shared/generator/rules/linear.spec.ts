import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, RuleConflictError } from '../index';
import { countOverlaps, overlapBudget } from './linear';

describe('linear', () => {
  it('takes the strictest of several linear rules, none meaning no limit', () => {
    expect(
      overlapBudget(
        parseRuleCard({
          rules: [
            { kind: 'linear', maxOverlaps: 3 },
            { kind: 'linear', maxOverlaps: 1 },
          ],
        }),
      ),
    ).toBe(1);
    expect(overlapBudget(parseRuleCard({}))).toBe(Number.POSITIVE_INFINITY);
    const sizes = [1, 2, 0, 3, 1];
    expect(countOverlaps(0, sizes.length, (i) => sizes[i] ?? 0)).toBe(2);
    expect(countOverlaps(2, 4, (i) => sizes[i] ?? 0)).toBe(1);
  });

  it('keeps every bar within its overlap budget, the ostinato counted', () => {
    const card = parseRuleCard({
      bars: 4,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 1,
      rules: [{ kind: 'linear', maxOverlaps: 1 }],
    });
    for (let s = 0; s < 10; s++) {
      for (const bar of generateDrill(card, `l${s}`).bars) {
        const perInstant = new Map<string, number>();
        for (const h of bar.hits)
          perInstant.set(`${h.beat}.${h.slot}`, (perInstant.get(`${h.beat}.${h.slot}`) ?? 0) + 1);
        // Counted here, not with the engine's own helper.
        expect([...perInstant.values()].filter((n) => n >= 2).length).toBeLessThanOrEqual(1);
      }
    }
  });

  it('refuses a backbeat on the ostinato under linear 0, naming both rules', () => {
    const card = parseRuleCard({
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      rules: [
        { kind: 'linear', maxOverlaps: 0 },
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
      ],
    });
    let error: unknown;
    try {
      generateDrill(card, 'x');
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(RuleConflictError);
    expect((error as Error).message).toBe(
      'The linear rule allows no overlaps, but the backbeat on 2 and 4 lands on the hi-hat ostinato (bar 1, beat 2).',
    );
    expect((error as RuleConflictError).rules).toEqual(['linear', 'backbeat', 'ostinato']);
  });
});
