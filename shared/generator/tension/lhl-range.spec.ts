import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lhlOnGrid } from './lhl';
import { lhlRangeOnGrid, lhlRangeScratch } from './lhl-range';
import { metricalGrid } from './metrical-grid';

/** Every allowed pattern that sounds the forced pulses, measured one by one: the slow truth. */
function exhaustiveRange(
  beats: readonly number[],
  forced: boolean[],
  allowed: boolean[],
  grouping?: readonly number[],
) {
  const grid = metricalGrid(beats, grouping);
  let least = Number.POSITIVE_INFINITY;
  let most = Number.NEGATIVE_INFINITY;
  for (let mask = 0; mask < 1 << grid.pulses; mask++) {
    const onsets = Array.from({ length: grid.pulses }, (_, i) => ((mask >> i) & 1) === 1);
    if (onsets.some((on, i) => (on && !allowed[i] && !forced[i]) || (!on && forced[i]))) continue;
    const value = lhlOnGrid(grid, onsets);
    least = Math.min(least, value);
    most = Math.max(most, value);
  }
  return { least, most };
}

const caseArb = fc
  .array(fc.integer({ min: 1, max: 8 }), { minLength: 1, maxLength: 6 })
  .filter((beats) => beats.reduce((a, b) => a + b, 0) <= 13)
  .chain((beats) => {
    const pulses = beats.reduce((a, b) => a + b, 0);
    const flags = fc.array(fc.boolean(), { minLength: pulses, maxLength: pulses });
    return fc.record({ beats: fc.constant(beats), forced: flags, allowed: flags });
  });

/** The same with a grouping of 1-4 beats per group between the bar and its beats. */
const groupedCaseArb = fc
  .array(fc.integer({ min: 1, max: 4 }), { minLength: 2, maxLength: 5 })
  .chain((grouping) => {
    const n = grouping.reduce((a, b) => a + b, 0);
    return fc.record({
      grouping: fc.constant(grouping),
      beats: fc.array(fc.integer({ min: 1, max: 3 }), { minLength: n, maxLength: n }),
    });
  })
  .filter(({ beats }) => beats.reduce((a, b) => a + b, 0) <= 13)
  .chain(({ beats, grouping }) => {
    const pulses = beats.reduce((a, b) => a + b, 0);
    const flags = fc.array(fc.boolean(), { minLength: pulses, maxLength: pulses });
    return fc.record({
      beats: fc.constant(beats),
      grouping: fc.constant(grouping),
      forced: flags,
      allowed: flags,
    });
  });

describe('lhlRangeOnGrid', () => {
  it('equals the exhaustive least and greatest syncopation under forced and allowed pulses', () => {
    fc.assert(
      fc.property(caseArb, ({ beats, forced, allowed }) => {
        const got = lhlRangeOnGrid(metricalGrid(beats), forced, allowed);
        expect(got).toEqual(exhaustiveRange(beats, forced, allowed));
      }),
      { numRuns: 150 },
    );
  });

  it('equals the exhaustive range on grouped grids (bar → groups → beats → slots)', () => {
    fc.assert(
      fc.property(groupedCaseArb, ({ beats, grouping, forced, allowed }) => {
        const got = lhlRangeOnGrid(metricalGrid(beats, grouping), forced, allowed);
        expect(got).toEqual(exhaustiveRange(beats, forced, allowed, grouping));
      }),
      { numRuns: 150 },
    );
  });

  it('gives the exhaustive ranges when one set of work arrays serves many asks on a grid', () => {
    const caseOnGrid = fc.array(fc.boolean(), { minLength: 12, maxLength: 12 });
    const asks = fc.array(fc.record({ forced: caseOnGrid, allowed: caseOnGrid }), {
      minLength: 2,
      maxLength: 6,
    });
    fc.assert(
      fc.property(asks, (list) => {
        const grid = metricalGrid([4, 4, 4]);
        const scratch = lhlRangeScratch(grid);
        for (const { forced, allowed } of list)
          expect(lhlRangeOnGrid(grid, forced, allowed, scratch)).toEqual(
            exhaustiveRange([4, 4, 4], forced, allowed),
          );
      }),
      { numRuns: 60 },
    );
  });

  it('refuses work arrays made for another grid', () => {
    const scratch = lhlRangeScratch(metricalGrid([4, 4, 4]));
    expect(() => lhlRangeOnGrid(metricalGrid([4, 4, 4, 4]), undefined, undefined, scratch)).toThrow(
      RangeError,
    );
  });

  it('pins a fully forced bar to its own value', () => {
    // 4/4 in sixteenths: an onset on the 'a' of 4 alone, rests on every stronger position.
    const grid = metricalGrid([4, 4, 4, 4]);
    const forced = Array.from({ length: 16 }, (_, i) => i === 15);
    const value = lhlOnGrid(grid, forced);
    expect(lhlRangeOnGrid(grid, forced, forced)).toEqual({ least: value, most: value });
  });
});
