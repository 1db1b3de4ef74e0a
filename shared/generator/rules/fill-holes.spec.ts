import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../index';
import { createRng } from '../random';
import type { FillHolesRule } from '../schema';
import { embellishmentDynamics, shareCounts } from './fill-holes';

const rule = (ghost: number, accent: number): FillHolesRule => ({
  kind: 'fillHoles',
  voices: ['snare'],
  ghost,
  accent,
});

describe('fillHoles', () => {
  it('rounds the ghost and accent shares, accents taking what ghosts leave', () => {
    expect(shareCounts(rule(0.5, 0.1), 10)).toEqual({ ghost: 5, accent: 1 });
    expect(shareCounts(rule(0.5, 0.5), 3)).toEqual({ ghost: 2, accent: 1 });
    expect(shareCounts(rule(0, 0), 7)).toEqual({ ghost: 0, accent: 0 });
  });

  it('marks exactly those counts, in a seeded order', () => {
    const dynamics = embellishmentDynamics(rule(0.5, 0.25), 8, createRng('a'));
    expect(dynamics.filter((d) => d === 'ghost')).toHaveLength(4);
    expect(dynamics.filter((d) => d === 'accent')).toHaveLength(2);
    expect(embellishmentDynamics(rule(0.5, 0.25), 8, createRng('a'))).toEqual(dynamics);
  });

  // common practice: the quintuplet ostinato masks [0, 2, 4] and [0, 2, 3] leave holes {1, 3}
  // and {1, 4}; the embellishments may only sit in those holes.
  it.each([
    [
      [0, 2, 4],
      [1, 3],
    ],
    [
      [0, 2, 3],
      [1, 4],
    ],
  ])('puts embellishments only in the holes of quintuplet mask %j', (slots, holes) => {
    const card = parseRuleCard({
      bars: 4,
      subdivision: 5,
      tempo: 70,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots },
      density: 0.8,
      rules: [{ kind: 'fillHoles', voices: ['snare', 'kick'], ghost: 0.5, accent: 0.2 }],
    });
    const seen = new Set<number>();
    for (let s = 0; s < 10; s++) {
      for (const bar of generateDrill(card, `q${s}`).bars) {
        for (const hit of bar.hits) if (hit.source === 'fill') seen.add(hit.slot);
      }
    }
    expect([...seen].sort()).toEqual(holes);
  });
});
