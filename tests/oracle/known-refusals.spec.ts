import { describe, expect, it } from 'vitest';
import { DRILL_CHECKS } from './checks';
import { failuresOf, runCard } from './run';

/**
 * Cards an earlier engine refused although the oracle's feasibility reasoning finds nothing
 * against them. A refusal must mean the rules cannot all hold: each card here either gives a
 * drill that keeps every rule, or its refusal is explained by the reasoner.
 */
const CARDS: { label: string; card: unknown; seed: string }[] = [
  {
    // A ghosted hi-hat on the "&" of every sixteenth-note beat, and a 7-bar phrase whose fill is
    // a whole bar on the floor tom: the leading hand may leave the hi-hat one note early to start
    // the fill (common practice), so nothing forces the arms to cross both ways.
    label: 'hi-hat ostinato with a 7-bar floor-tom phrase at 145 BPM in 4/16',
    card: {
      meter: { beats: 4, unit: 16 },
      bars: 7,
      subdivision: 2,
      tempo: 145,
      voices: ['hihatFoot', 'hihat', 'tomHigh', 'snare', 'tomFloor'],
      density: 0,
      ostinato: { voice: 'hihat', slots: [1], dynamic: 'ghost' },
      roles: { tomHigh: 'embellishment' },
      rules: [{ kind: 'phrase', every: 7, voices: ['tomFloor'], crash: false }],
    },
    seed: 'T',
  },
];

describe('rule oracle: cards once refused without cause', () => {
  it.each(CARDS)('$label generates, or its refusal is explained', ({ card, seed, label }) => {
    const outcome = runCard(card, seed, { label });
    const unexplained = outcome.kind === 'refused' && outcome.reasons.length === 0;
    expect(
      unexplained ? `${outcome.kind}: ${'message' in outcome ? outcome.message : ''}` : '',
    ).toBe('');
    expect(outcome.kind === 'crashed' || outcome.kind === 'invalid').toBe(false);
    for (const check of DRILL_CHECKS) expect(failuresOf([outcome], check), check).toBeNull();
  });
});
