import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, RuleConflictError } from './index';

const curve16 = [
  0.1, 0.9, 0.4, 0.7, 0.2, 0.8, 0.3, 0.6, 0.5, 0.95, 0.05, 0.85, 0.15, 0.75, 0.25, 0.65,
];

function refusal(raw: unknown, seed = 'x'): RuleConflictError {
  try {
    generateDrill(parseRuleCard(raw), seed);
  } catch (error) {
    if (error instanceof RuleConflictError) return error;
    throw error;
  }
  throw new Error('The card produced a drill.');
}

describe('tension reach (refusals proved before the search)', () => {
  it('refuses more rising levels than a bar grid has tension values', () => {
    // 4/4 in sixteenths: the Longuet-Higgins & Lee syncopation of one bar takes the whole
    // values 0..11, so 16 strictly rising levels cannot all differ.
    const error = refusal({
      bars: 16,
      voices: ['kick', 'snare', 'hihat'],
      density: 0.5,
      rules: [{ kind: 'tension', curve: curve16 }],
    });
    expect(error.message).toMatch(/climbs through 13 different targets/);
    expect(error.message).toMatch(/only 12 different tensions \(from 0 to 1\)/);
    expect(error.rules).toContain('tension');
  });

  it('refuses a curve whose upper bars are held down by obligatory hits, for every seed', () => {
    const card = {
      meter: { beats: 4, unit: 4 },
      bars: 16,
      subdivision: 4,
      tempo: 100,
      voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
      ostinato: { voice: 'hihat', slots: [0, 1, 2, 3] },
      density: 0,
      rules: [
        { kind: 'tension', curve: curve16 },
        { kind: 'polyrhythm', voices: ['hihatFoot'], against: 2, span: 3 },
      ],
    };
    const first = refusal(card, 'a');
    expect(first.message).toMatch(/tension rule asks bar 8 to be more tense than bar 9/);
    expect(first.message).toMatch(/2-over-3 polyrhythm on the hi-hat foot/);
    // A proof, not a search: the same words whatever the seed.
    expect(refusal(card, 'b').message).toBe(first.message);
  });

  it('leaves a reachable curve to the search', () => {
    const drill = generateDrill(
      parseRuleCard({ bars: 4, density: 0.4, rules: [{ kind: 'tension', curve: [0.2, 0.8] }] }),
      'ok',
    );
    expect(drill.bars[0]!.tension).toBeLessThan(drill.bars[1]!.tension);
  });
});
