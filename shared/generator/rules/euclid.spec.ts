import { describe, expect, it } from 'vitest';
import { createGrid, positionOf } from '../grid';
import { parseRuleCard } from '../index';
import type { EuclidRule } from '../schema';
import { euclidPattern, placeEuclid } from './euclid';

const rule = (over: Partial<EuclidRule>): EuclidRule => ({
  kind: 'euclid',
  voice: 'kick',
  pulses: 3,
  steps: 8,
  rotation: 0,
  span: 2,
  ...over,
});
const x = (pattern: boolean[]) => pattern.map((on) => (on ? 'x' : '.')).join('');

describe('euclid', () => {
  // G. T. Toussaint, "The Euclidean Algorithm Generates Traditional Musical Rhythms",
  // BRIDGES 2005: E(3,8) = x..x..x. and E(5,8) = x.xx.xx. in Bjorklund's rotation.
  it('uses the Bjorklund rotation and turns it left by `rotation` steps', () => {
    expect(x(euclidPattern(rule({})))).toBe('x..x..x.');
    expect(x(euclidPattern(rule({ pulses: 5 })))).toBe('x.xx.xx.');
    expect(x(euclidPattern(rule({ rotation: 3 })))).toBe('x..x.x..');
  });

  it('spreads the steps over the span and repeats it through the drill', () => {
    const grid = createGrid(1, [4, 4, 4, 4]);
    // E(3,8) over 2 beats of sixteenths: one step per sixteenth → pulses 0, 3, 6, then 8, 11, 14.
    const at = placeEuclid(rule({}), 0, grid).map((p) => positionOf(grid, p.instant));
    expect(at.map((p) => (p.beat - 1) * 4 + p.slot)).toEqual([0, 3, 6, 8, 11, 14]);
  });

  it('defaults the span to one bar', () => {
    const card = parseRuleCard({
      meter: { beats: 3, unit: 4 },
      rules: [{ kind: 'euclid', voice: 'kick', pulses: 2, steps: 3 }],
    });
    expect(card.rules[0]).toMatchObject({ kind: 'euclid', span: 3, rotation: 0 });
  });

  it('refuses steps that do not split the span into whole slots', () => {
    expect(() =>
      parseRuleCard({
        subdivision: 4,
        rules: [{ kind: 'euclid', voice: 'kick', pulses: 3, steps: 7, span: 4 }],
      }),
    ).toThrow(/Rule 1 \(euclid\): 7 steps over 4 beats do not split into whole slots/);
  });
});
