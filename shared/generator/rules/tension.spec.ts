import { describe, expect, it } from 'vitest';
import { generateDrill, measureTension, parseRuleCard, RuleConflictError } from '../index';
import { rankOrderBreaks, tensionLevels, tensionTargets } from './tension';

describe('tension', () => {
  it('repeats the curve cyclically over the bars', () => {
    const card = parseRuleCard({ bars: 5, rules: [{ kind: 'tension', curve: [0.2, 0.8] }] });
    expect(tensionTargets(card, 5)).toEqual([0.2, 0.8, 0.2, 0.8, 0.2]);
    expect(tensionTargets(parseRuleCard({}), 3)).toBeNull();
  });

  it('groups bars of equal target and orders the groups', () => {
    expect(tensionLevels([0.5, 0.1, 0.5, 0.9])).toEqual([[1], [0, 2], [3]]);
  });

  it('asks strictly rising tension across levels, nothing within a level', () => {
    expect(rankOrderBreaks([0.1, 0.9], [0.2, 0.3])).toEqual([]);
    expect(rankOrderBreaks([0.1, 0.9], [0.3, 0.3])).toEqual([[0, 1]]);
    expect(rankOrderBreaks([0.5, 0.5], [0.9, 0.1])).toEqual([]);
  });

  it('keeps the rank order of [0.1, 0.9, 0.4, 0.7] at every one of 100 seeds', () => {
    const card = parseRuleCard({
      bars: 4,
      subdivision: 4,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.3,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'tension', curve: [0.1, 0.9, 0.4, 0.7] },
      ],
    });
    for (let s = 0; s < 100; s++) {
      // The card is feasible: a refusal or a give-up at any seed fails the test.
      const t = generateDrill(card, `rank-${s}`).bars.map((bar) => measureTension(bar));
      expect(
        t[0]! < t[2]! && t[2]! < t[3]! && t[3]! < t[1]!,
        `seed rank-${s}: ${t.join(', ')}`,
      ).toBe(true);
    }
  });

  it('refuses a curve the fill cannot reach, naming the tension rule', () => {
    // One beat of quarters: no slot can be syncopated, so every bar measures 0.
    const card = parseRuleCard({
      meter: { beats: 1, unit: 4 },
      bars: 2,
      subdivision: 1,
      voices: ['kick'],
      density: 1,
      rules: [{ kind: 'tension', curve: [0.1, 0.9] }],
    });
    expect(() => generateDrill(card, 'flat')).toThrow(RuleConflictError);
    expect(() => generateDrill(card, 'flat')).toThrow(
      /tension rule asks bar 2 to be more tense than bar 1/,
    );
  });
});
