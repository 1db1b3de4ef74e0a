import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../index';
import { createRng } from '../random';
import type { FillHolesRule } from '../schema';
import { embellishmentDynamics, freeShares, shareCounts } from './fill-holes';

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
    const none = { ghost: 0, accent: 0 };
    const dynamics = embellishmentDynamics(rule(0.5, 0.25), 8, 8, none, createRng('a')) ?? [];
    expect(dynamics.filter((d) => d === 'ghost')).toHaveLength(4);
    expect(dynamics.filter((d) => d === 'accent')).toHaveLength(2);
    expect(embellishmentDynamics(rule(0.5, 0.25), 8, 8, none, createRng('a'))).toEqual(dynamics);
  });

  it('makes up the shares around kept notes, or says it cannot', () => {
    // 8 notes at ghost 0.5, accent 0.25: 4 ghost, 2 accent; 3 kept notes already hold 3 ghosts.
    const rest = embellishmentDynamics(
      rule(0.5, 0.25),
      8,
      5,
      { ghost: 3, accent: 0 },
      createRng('b'),
    );
    expect(rest?.filter((d) => d === 'ghost')).toHaveLength(1);
    expect(rest?.filter((d) => d === 'accent')).toHaveLength(2);
    expect(rest).toHaveLength(5);
    // Kept notes with 5 ghosts already pass the 4 the shares allow.
    expect(freeShares(rule(0.5, 0.25), 8, 3, { ghost: 5, accent: 0 })).toBeNull();
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
