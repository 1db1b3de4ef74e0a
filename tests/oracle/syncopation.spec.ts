import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { barTree, bruteForceRange, exactRange, lhl } from './syncopation';

/** The oracle's own syncopation measure, checked before it judges the engine's tensions. */

const bits = (s: string): boolean[] => [...s].map((c) => c === 'x');

describe('the oracle’s Longuet-Higgins & Lee measure', () => {
  it('scores the reference implementation’s worked example: x..x.xx. in 2/4 sixteenths is 2', () => {
    // C. Song, M. Pearce, C. Harte, SynPy (SMC 2015), LHL.py, get_syncopation_bitstring's
    // docstring: [1, 0, 0, 1, 0, 1, 1, 0] in 2/4 gives 2 (secondary source for the 1984 measure).
    expect(lhl(barTree([4, 4], null), bits('x..x.xx.'))).toBe(2);
  });

  it('scores a plain run of notes and a bar struck only on one as 0', () => {
    // H. C. Longuet-Higgins, C. S. Lee, Music Perception 1(4), 1984: syncopation needs a rest
    // (or tie) on a position stronger than the note before it; common practice reading.
    const tree = barTree([4, 4, 4, 4], null);
    expect(lhl(tree, bits('xxxxxxxxxxxxxxxx'))).toBe(0);
    expect(lhl(tree, bits('x...............'))).toBe(0);
    expect(lhl(tree, bits('x...x...x...x...'))).toBe(0);
  });

  it('hears nothing after the bar: a note on the "a" of 4 ending the bar scores 0', () => {
    // The bar is measured alone (drill contract): nothing after its end is heard as a rest.
    expect(lhl(barTree([4, 4, 4, 4], null), bits('x..............x'))).toBe(0);
  });

  it('scores the "and" of 1 tied over beat 2 (x.x.....): the rest on 2 against the eighth', () => {
    // 2/4 in eighths: weights 0, -2, -1, -2; a note on -2 then a rest on -1 adds 1.
    expect(lhl(barTree([2, 2], null), bits('.x..'))).toBe(1);
  });

  it('weighs 6/8 as two dotted quarters and 7/8 as 2+2+3 when grouped (docs/tension.md)', () => {
    // 6/8 in eighths grouped 3+3: a note on eighth 3 and silence on eighth 4 (the second big
    // beat) is a syncopation; ungrouped, six eighths would be 2 × 3 all the same.
    expect(lhl(barTree([1, 1, 1, 1, 1, 1], [3, 3]), bits('x.x...'))).toBeGreaterThan(0);
    // 7/8 as 2+2+3: notes on eighths 1 and 4 leave eighth 5 (a group start) silent.
    const seven = barTree([1, 1, 1, 1, 1, 1, 1], [2, 2, 3]);
    expect(lhl(seven, bits('x..x...'))).toBe(1);
    // Seven plain eighths are one prime step: nothing can syncopate.
    expect(
      bruteForceRange(barTree([1, 1, 1, 1, 1, 1, 1], null), [], Array(7).fill(true)).most,
    ).toBe(0);
  });

  it('its dynamic programme gives the exact range, as trying every pattern does', () => {
    const grids: [number[], number[] | null][] = [
      [[4, 4, 4, 4], null],
      [[3, 3, 3, 3], null],
      [[5, 5], null],
      [[6, 6], null],
      [[4, 4, 5], null],
      [
        [2, 2, 2, 2, 2, 2],
        [3, 3],
      ],
      [
        [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
        [3, 3, 3, 3],
      ],
      [
        [2, 2, 2, 2, 2, 2, 2],
        [2, 2, 3],
      ],
      [[7, 7], null],
      [[8], null],
    ];
    for (const [subs, grouping] of grids) {
      const tree = barTree(subs, grouping);
      const n = subs.reduce((a, b) => a + b, 0);
      const none = Array<boolean>(n).fill(false);
      const all = Array<boolean>(n).fill(true);
      expect(exactRange(tree, none, all), `${subs} ${grouping}`).toEqual(
        bruteForceRange(tree, none, all),
      );
    }
  });

  it('with forced, closed and costly slots, the programme agrees with trying every pattern', () => {
    const arb = fc
      .constantFrom<[number[], number[] | null]>(
        [[4, 4, 4, 4], null],
        [[3, 3, 3, 3], null],
        [[5, 5, 5], null],
        [
          [2, 2, 2, 2, 2, 2, 2],
          [2, 2, 3],
        ],
        [
          [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
          [3, 3, 3, 3],
        ],
      )
      .chain(([subs, grouping]) => {
        const n = subs.reduce((a, b) => a + b, 0);
        const cell = fc.constantFrom('forced', 'open', 'costly', 'closed');
        return fc.tuple(
          fc.constant(subs),
          fc.constant(grouping),
          fc.array(cell, { minLength: n, maxLength: n }),
          fc.integer({ min: 0, max: 3 }),
        );
      });
    fc.assert(
      fc.property(arb, ([subs, grouping, cells, budget]) => {
        const tree = barTree(subs, grouping);
        const forced = cells.map((c) => c === 'forced');
        const allowed = cells.map((c) => c !== 'closed');
        const costly = cells.map((c) => c === 'costly');
        // Brute force with the budget: every pattern, those with too many costly onsets dropped.
        const free = cells.flatMap((c, i) => (c === 'open' || c === 'costly' ? [i] : []));
        let least = Infinity;
        let most = -Infinity;
        for (let m = 0; m < 1 << free.length; m++) {
          const onsets = forced.slice();
          let used = 0;
          free.forEach((slot, k) => {
            onsets[slot] = (m >> k) % 2 === 1;
            if (onsets[slot] && costly[slot]) used++;
          });
          if (used > budget) continue;
          const v = lhl(tree, onsets);
          least = Math.min(least, v);
          most = Math.max(most, v);
        }
        expect(exactRange(tree, forced, allowed, costly, budget)).toEqual({ least, most });
      }),
      { numRuns: Number(process.env['FC_RUNS'] ?? 200), seed: 1984 },
    );
  });
});
