import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lhlSyncopation } from './lhl';
import { maxLhlSyncopation } from './lhl-range';

/** Every onset pattern of the grid, tried one by one: the slow truth the fast maximum must meet. */
function exhaustiveMax(beats: readonly number[], grouping?: readonly number[]): number {
  const pulses = beats.reduce((a, b) => a + b, 0);
  let most = 0;
  for (let mask = 0; mask < 1 << pulses; mask++) {
    const onsets = Array.from({ length: pulses }, (_, i) => ((mask >> i) & 1) === 1);
    most = Math.max(most, lhlSyncopation(beats, onsets, grouping));
  }
  return most;
}

/** A grid of up to 14 pulses with a grouping of 1-4 beats per group (bar → groups → beats). */
const groupedGrid = fc
  .array(fc.integer({ min: 1, max: 4 }), { minLength: 2, maxLength: 6 })
  .chain((grouping) => {
    const n = grouping.reduce((a, b) => a + b, 0);
    return fc.record({
      grouping: fc.constant(grouping),
      beats: fc.array(fc.integer({ min: 1, max: 4 }), { minLength: n, maxLength: n }),
    });
  })
  .filter(({ beats }) => beats.reduce((a, b) => a + b, 0) <= 14);

describe('maxLhlSyncopation', () => {
  it.each([
    [[4, 4, 4, 4]],
    [[3, 3, 3, 3]],
    [[2, 2, 2, 2]],
    [[4, 4, 4]],
    [[6, 6]],
    [[8, 8]],
    [[5, 5, 5]],
    [[7, 7]],
    [[4, 4, 5, 5]],
    [[1, 1, 1, 1, 1, 1]],
    [[3, 4, 5]],
    [[2, 3, 2, 3, 2, 3]],
  ])('equals the exhaustive maximum on %j', (beats) => {
    expect(maxLhlSyncopation(beats)).toBe(exhaustiveMax(beats));
  });

  it('equals the exhaustive maximum on random small mixed grids', () => {
    const grid = fc
      .array(fc.integer({ min: 1, max: 8 }), { minLength: 1, maxLength: 6 })
      .filter((beats) => beats.reduce((a, b) => a + b, 0) <= 14);
    fc.assert(
      fc.property(grid, (beats) => maxLhlSyncopation(beats) === exhaustiveMax(beats)),
      { numRuns: 60 },
    );
  });

  // Grouped meters (6/8, 9/8, 12/8, 15/8 as threes, 5/8, 7/8 and others as their groups).
  it.each([
    [
      [1, 1, 1, 1, 1, 1],
      [3, 3],
    ],
    [
      [2, 2, 2, 2, 2, 2],
      [3, 3],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1, 1, 1],
      [3, 3, 3],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
      [3, 3, 3, 3],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
      [3, 3, 3, 3, 3],
    ],
    [
      [1, 1, 1, 1, 1],
      [3, 2],
    ],
    [
      [2, 2, 2, 2, 2],
      [2, 3],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1],
      [2, 2, 3],
    ],
    [
      [2, 2, 2, 2, 2, 2, 2],
      [2, 2, 3],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
      [3, 3, 3, 2],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1],
      [3, 3, 3, 2, 2],
    ],
    [
      [1, 1, 1, 1, 1, 1, 1],
      [4, 3],
    ],
    [
      [2, 2, 2, 2],
      [3, 1],
    ],
    [
      [3, 3, 3, 3],
      [2, 2],
    ],
  ])('equals the exhaustive maximum on %j grouped %j', (beats, grouping) => {
    expect(maxLhlSyncopation(beats, grouping)).toBe(exhaustiveMax(beats, grouping));
  });

  it('equals the exhaustive maximum on random small grouped grids', () => {
    fc.assert(
      fc.property(
        groupedGrid,
        ({ beats, grouping }) =>
          maxLhlSyncopation(beats, grouping) === exhaustiveMax(beats, grouping),
      ),
      { numRuns: 80 },
    );
  });

  it('is 0 where nothing can syncopate and positive on common grids', () => {
    expect(maxLhlSyncopation([3])).toBe(0);
    expect(maxLhlSyncopation([1])).toBe(0);
    expect(maxLhlSyncopation([4, 4, 4, 4])).toBeGreaterThan(0);
  });

  it('stays quick on the largest grids (15 beats of 8, ungrouped and as five threes)', () => {
    const beats = Array.from({ length: 15 }, () => 8);
    expect(maxLhlSyncopation(beats)).toBeGreaterThan(0);
    expect(maxLhlSyncopation(beats, [3, 3, 3, 3, 3])).toBeGreaterThan(0);
  });
});
