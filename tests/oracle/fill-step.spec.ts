import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { readCard } from './card';
import { DRILL_CHECKS } from './checks';
import { planOf } from './plan';
import { failuresOf, runCard } from './run';
import { cardReach } from './tension';

/**
 * Cards with a fill step (docs/engine.md, Fill steps) through the oracle: every drill check,
 * the fill step included, and the tension reach the oracle works out on its own from the slots
 * the step leaves open (on a card with a tension curve the reach the engine reports must be
 * that one: a reach from all the slots would promise tensions the card cannot play).
 */
const SEEDS = Array.from({ length: 20 }, (_, i) => `step-${i}`);

/** A sixteenth groove whose kick fills keep to the eighths, shaped by a tension curve. */
function eighthKicks(curve: number[]) {
  return {
    bars: 4,
    tempo: 90,
    voices: ['kick', 'snare', 'hihat'],
    ostinato: { voice: 'hihat', slots: [0, 2] },
    fillStep: { kick: 2 },
    density: 0.4,
    rules: [
      { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
      { kind: 'tension', curve },
    ],
  };
}

const CARDS: [string, Record<string, unknown>][] = [
  ['eighth kicks under a sixteenth groove with a curve', eighthKicks([0.1, 0.5, 0.9, 0.1])],
  [
    'kicks on the first and last triplet',
    {
      bars: 2,
      tempo: 80,
      subdivision: 3,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0] },
      fillStep: { kick: 2 },
      density: 0.5,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'tension', curve: [0.3, 0.8] },
      ],
    },
  ],
];

describe.each(CARDS)('oracle: %s', (_, card) => {
  const outcomes = SEEDS.map((seed) => runCard(card, seed));

  it.each([...DRILL_CHECKS])('%s holds at every seed', (check) => {
    expect(outcomes.every((o) => o.kind === 'drill')).toBe(true);
    expect(failuresOf(outcomes, check), '').toBeNull();
  });

  it('reports the reach of the slots the step leaves open', () => {
    const parsed = parseRuleCard(card);
    const reach = cardReach(planOf(readCard(card, parsed)));
    const wide = cardReach(planOf(readCard({ ...card, fillStep: undefined }, parsed)));
    // Where the kick is the only fill voice and its step leaves out the slots the greatest
    // syncopation needs (the sixteenths' "e" and "a"), the reach is narrower; the engine reports
    // the reach of the open slots either way.
    if (parsed.subdivision === 4) expect(reach.most).toBeLessThan(wide.most);
    for (const seed of SEEDS) expect(generateDrill(parsed, seed).tensionReach).toEqual(reach);
  });
});

describe('oracle: a curve the fill step puts out of reach', () => {
  // Kick fills on the eighths alone leave three tensions a bar (the oracle's own count); a curve
  // of four levels is refused, and the same card without the step is not.
  const card = eighthKicks([0.2, 0.5, 0.9, 0.1]);
  it('is refused with the step and generated without it', () => {
    const parsed = parseRuleCard(card);
    expect(parsed.fillStep).toEqual({ kick: 2 });
    const refused = runCard(card, 'step-0');
    expect(refused.kind).toBe('refused');
    expect(runCard({ ...card, fillStep: undefined }, 'step-0').kind).toBe('drill');
  });
});
