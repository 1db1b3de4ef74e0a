import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DrillBar, DrillHit } from '../drill';
import { defaultGrouping } from '../meter';
import { lhlOnGrid, lhlSyncopation } from './lhl';
import { maxLhlSyncopation } from './lhl-range';
import { metricalGrid } from './metrical-grid';
import { measureTension, tensionMeter } from './tension';

/**
 * The meter's grouping as a level of the metrical tree (bar → groups → beats → slots), checked by
 * hand-worked values and against a textbook parse written separately from the flattened tree.
 *
 * Hand derivations use the rule of H. C. Longuet-Higgins & C. S. Lee, "The rhythmic
 * interpretation of monophonic music", Music Perception 1(4), 1984: a silent node is a rest R,
 * a node that starts with an onset and is silent after it a note N; each R pairs with the nearest
 * N before it whose weight is not above the rest's and adds w(R) − w(N). Weight = −level.
 */

const eighths = (n: number): number[] => Array.from({ length: n }, () => 1);
const pattern = (s: string): boolean[] => [...s].map((c) => c === 'x');

function barOf(beats: readonly number[], struck: readonly number[]): DrillBar {
  const hits: DrillHit[] = struck.map((beat) => ({
    beat,
    slot: 0,
    voice: 'snare',
    dynamic: 'normal',
    hand: 'R',
    source: 'fill',
  }));
  return { bar: 1, beats, tension: 0, hits };
}

describe('the grouped metrical tree', () => {
  it('puts the groups between the bar and the beats', () => {
    // 6/8 as 3+3 in eighths: bar (level 0) → two dotted quarters (1) → eighths (2).
    expect(metricalGrid(eighths(6), [3, 3]).level).toEqual([0, 2, 2, 1, 2, 2]);
    // 7/8 as 2+2+3: three groups are one level, so eighths 3 and 5 start groups (level 1).
    expect(metricalGrid(eighths(7), [2, 2, 3]).level).toEqual([0, 2, 1, 2, 1, 2, 2]);
    // 5/8 as 3+2, and as 2+3.
    expect(metricalGrid(eighths(5), [3, 2]).level).toEqual([0, 2, 2, 1, 2]);
    expect(metricalGrid(eighths(5), [2, 3]).level).toEqual([0, 2, 1, 2, 2]);
    // 15/8 as five threes: five groups are one level (not three fives, as 15 = 3 × 5 would be).
    expect(metricalGrid(eighths(15), [3, 3, 3, 3, 3]).level).toEqual([
      0, 2, 2, 1, 2, 2, 1, 2, 2, 1, 2, 2, 1, 2, 2,
    ]);
    expect(metricalGrid(eighths(15)).level).toEqual([0, 2, 2, 2, 2, 1, 2, 2, 2, 2, 1, 2, 2, 2, 2]);
    // 12/8: four groups = 2 × 2, so the third dotted quarter outranks the second and fourth.
    expect(metricalGrid(eighths(12), [3, 3, 3, 3]).level).toEqual([
      0, 3, 3, 2, 3, 3, 1, 3, 3, 2, 3, 3,
    ]);
    // 6/8 in sixteenths: the slots sit one level under their eighth.
    expect(metricalGrid([2, 2, 2, 2, 2, 2], [3, 3]).level).toEqual([
      0, 3, 2, 3, 2, 3, 1, 3, 2, 3, 2, 3,
    ]);
    // A group of one beat is that beat (no node of the same span over it); a group of four is 2 × 2.
    expect(metricalGrid(eighths(4), [3, 1]).level).toEqual([0, 2, 2, 1]);
    expect(metricalGrid(eighths(7), [4, 3]).level).toEqual([0, 3, 2, 3, 1, 2, 2]);
  });

  it('leaves the tree of a meter without grouping exactly as it was', () => {
    const plain = (beats: number[]) => {
      const { level, nodeEnds, depth } = metricalGrid(beats);
      return { level, nodeEnds, depth };
    };
    const with_ = (beats: number[], grouping: number[] | null | undefined) => {
      const { level, nodeEnds, depth } = metricalGrid(beats, grouping);
      return { level, nodeEnds, depth };
    };
    // 4/4 in sixteenths keeps the weights of the reference implementation SynPy (C. Song,
    // M. Pearce, C. Harte, SMC 2015).
    expect(metricalGrid([4, 4, 4, 4], null).level).toEqual([
      0, 4, 3, 4, 2, 4, 3, 4, 1, 4, 3, 4, 2, 4, 3, 4,
    ]);
    const grid = fc.array(fc.integer({ min: 1, max: 8 }), { minLength: 1, maxLength: 15 });
    fc.assert(
      fc.property(grid, (beats) => {
        expect(with_(beats, undefined)).toEqual(plain(beats));
        expect(with_(beats, null)).toEqual(plain(beats));
        // One group over the whole bar is no grouping.
        expect(with_(beats, [beats.length])).toEqual(plain(beats));
      }),
      { numRuns: 200 },
    );
  });

  it('gives 6/8, 9/8 and 12/8 the tree their prime factors already gave (values unchanged)', () => {
    for (const n of [6, 9, 12]) {
      for (const slots of [1, 2, 4]) {
        const beats = Array.from({ length: n }, () => slots);
        const grouped = metricalGrid(beats, defaultGrouping({ beats: n, unit: 8 }));
        expect(grouped.level).toEqual(metricalGrid(beats).level);
      }
    }
  });

  it('refuses a grouping that does not add up to the bar', () => {
    expect(() => metricalGrid(eighths(7), [3, 3])).toThrow(/does not divide a bar of 7 beats/);
    expect(() => metricalGrid(eighths(4), [2, 0, 2])).toThrow(RangeError);
    expect(() => metricalGrid(eighths(4), [])).toThrow(RangeError);
  });
});

describe('tension on grouped meters, worked by hand', () => {
  it('6/8 in eighths, hits on eighths 1 and 3: tension 1', () => {
    // Weights (3+3): 0 -2 -2 | -1 -2 -2. The bar holds two onsets, so it splits into its
    // dotted quarters. The first holds onsets on 1 and 3, so it splits into eighths:
    // N(1, w 0), R(2, w -2) — no note before it weighs -2 or less, adds 0 —, N(3, w -2).
    // The second dotted quarter is silent: R(4, w -1), paired with N(3): -1 - (-2) = 1.
    // Raw 1. The maximum on this grid is 1 too: only eighth 4 (w -1) outranks an eighth that can
    // sound before it (w -2), so one rest can gain, by 1. Tension 1 / 1 = 1.
    expect(lhlSyncopation(eighths(6), pattern('x.x...'), [3, 3])).toBe(1);
    expect(maxLhlSyncopation(eighths(6), [3, 3])).toBe(1);
    expect(measureTension(barOf(eighths(6), [1, 3]), [3, 3])).toBe(1);
    // The same bar on the dotted-quarter pulse (eighths 1 and 4) does not syncopate.
    expect(measureTension(barOf(eighths(6), [1, 4]), [3, 3])).toBe(0);
  });

  it('6/8 in sixteenths, hits on eighths 1 and 3: raw 1 of a maximum of 6', () => {
    // Weights: 0 -3 -2 -3 -2 -3 | -1 -3 -2 -3 -2 -3. First dotted quarter splits (onsets on
    // pulses 0 and 4): eighth 1 is note-shaped N(w 0); eighth 2 silent R(w -2), no partner;
    // eighth 3 N(w -2). Second dotted quarter silent: R(w -1) pairs with N(w -2): +1. Raw 1.
    expect(lhlSyncopation([2, 2, 2, 2, 2, 2], pattern('x...x.......'), [3, 3])).toBe(1);
    // The most: a sixteenth on the "e" of each dotted quarter alone (pulses 1 and 7).
    // R(pulse 0, w 0): no partner. N(1, w -3). R(eighth 2, w -2) +1, R(eighth 3, w -2) +1.
    // R(pulse 6, w -1) pairs with N(1): +2. N(7, w -3). R(eighth 5) +1, R(eighth 6) +1. Raw 6,
    // which every pattern of the grid confirms as the maximum.
    expect(lhlSyncopation([2, 2, 2, 2, 2, 2], pattern('.x.....x....'), [3, 3])).toBe(6);
    expect(maxLhlSyncopation([2, 2, 2, 2, 2, 2], [3, 3])).toBe(6);
    // Tension 1 / 6 = 0.1667 (4 decimals).
    expect(measureTension(barOf([2, 2, 2, 2, 2, 2], [1, 3]), [3, 3])).toBe(0.1667);
  });

  it('7/8 as 2+2+3 can syncopate, where the ungrouped seven eighths never could', () => {
    // Ungrouped, 7 is prime: every eighth after the first weighs -1, so no rest outranks a
    // note before it and the maximum is 0: every 7/8 bar in eighths measured 0.
    expect(maxLhlSyncopation(eighths(7))).toBe(0);
    // Grouped: weights 0 -2 | -1 -2 | -1 -2 -2. Eighths 3 and 5 (w -1) can each gain 1 over a
    // note of weight -2 just before them, and no other rest can gain: maximum 2.
    expect(maxLhlSyncopation(eighths(7), [2, 2, 3])).toBe(2);
    // Hits on eighths 1 and 4: group 1 N(w 0); group 2 splits: R(3, w -1) — the only note
    // before it weighs 0 — adds 0, N(4, w -2); group 3 silent R(w -1) pairs with N(4): +1.
    // Raw 1 of 2: tension 0.5.
    expect(lhlSyncopation(eighths(7), pattern('x..x...'), [2, 2, 3])).toBe(1);
    expect(measureTension(barOf(eighths(7), [1, 4]), [2, 2, 3])).toBe(0.5);
    // Hits on eighths 2 and 4 (each just before a group): R(1, w 0) no partner; N(2, w -2);
    // R(3, w -1) +1; N(4, w -2); R(group 3, w -1) +1. Raw 2: tension 1.
    expect(measureTension(barOf(eighths(7), [2, 4]), [2, 2, 3])).toBe(1);
  });

  it('15/8 as five threes: the dotted-quarter pulse is calm, as it was not as three fives', () => {
    // Hits on eighths 1 and 4 (dotted quarters 1 and 2). Five threes: weights 0 at eighth 1,
    // -1 at 4, 7, 10, 13, -2 elsewhere. Group 1 N(w 0); group 2 N(w -1); groups 3-5 silent,
    // R(w -1) each, paired with N(w -1): +0. Raw 0.
    expect(measureTension(barOf(eighths(15), [1, 4]), [3, 3, 3, 3, 3])).toBe(0);
    // Ungrouped, 15 = 3 × 5 heard three fives: eighths 6 and 11 weigh -1 and eighth 4 -2, so the
    // silent fives 2 and 3 each pair with N(4, w -2): raw 2 of a maximum of 2, tension 1.
    expect(measureTension(barOf(eighths(15), [1, 4]))).toBe(1);
    // Grouped maximum: four group starts (w -1) can each gain 1 over a w -2 note: 4.
    expect(maxLhlSyncopation(eighths(15), [3, 3, 3, 3, 3])).toBe(4);
    // Hits on eighths 1 and 3: N(w 0), R(2) +0, N(3, w -2); groups 2-5 silent, R(w -1) each
    // pairs with N(3): +1 × 4. Raw 4: tension 1.
    expect(measureTension(barOf(eighths(15), [1, 3]), [3, 3, 3, 3, 3])).toBe(1);
  });

  it('5/8 as 3+2 and as 2+3 hear the same hits differently', () => {
    // Hits on eighths 1 and 3. 3+2: weights 0 -2 -2 | -1 -2: N(1), R(2) +0, N(3, w -2), then
    // group 2 silent R(w -1) +1; maximum 1 (only eighth 4 can gain). Tension 1.
    expect(measureTension(barOf(eighths(5), [1, 3]), [3, 2])).toBe(1);
    // 2+3: weights 0 -2 | -1 -2 -2: group 1 N(w 0); group 2 starts with a note and holds no
    // other, so it is note-shaped N(w -1). No rest: tension 0.
    expect(measureTension(barOf(eighths(5), [1, 3]), [2, 3])).toBe(0);
  });

  it('measures the same through a tension meter built once', () => {
    const meter = tensionMeter(eighths(7), [2, 2, 3]);
    expect(meter.grouping).toEqual([2, 2, 3]);
    expect(meter.most).toBe(2);
    expect(meter.measure(barOf(eighths(7), [1, 4]))).toBe(0.5);
    expect(measureTension(barOf(eighths(7), [1, 4]))).toBe(0);
  });
});

/**
 * A textbook LHL parse on an explicit nested tree, written apart from the flattened grid: the
 * tree is built as nested nodes, parsed top-down into N and R, and the rests paired by a scan.
 */
interface TreeNode {
  readonly start: number;
  readonly end: number;
  readonly children: readonly TreeNode[];
}

function primes(n: number): number[] {
  const out: number[] = [];
  let rest = n;
  for (let p = 2; rest > 1; p++)
    while (rest % p === 0) {
      out.push(p);
      rest /= p;
    }
  return out;
}

/** Units of given lengths, joined into one node divided by the primes of their count. */
function joinUnits(units: readonly TreeNode[]): TreeNode {
  if (units.length === 1) return units[0]!;
  const parts = primes(units.length)[0]!;
  const size = units.length / parts;
  const children = Array.from({ length: parts }, (_, i) =>
    joinUnits(units.slice(i * size, (i + 1) * size)),
  );
  return { start: units[0]!.start, end: units[units.length - 1]!.end, children };
}

function beatNode(start: number, slots: number): TreeNode {
  const split = (s: number, length: number, factors: number[]): TreeNode => {
    if (factors.length === 0) return { start: s, end: s + length, children: [] };
    const [parts, ...rest] = factors as [number, ...number[]];
    const part = length / parts;
    return {
      start: s,
      end: s + length,
      children: Array.from({ length: parts }, (_, i) => split(s + i * part, part, rest)),
    };
  };
  return split(start, slots, primes(slots));
}

function textbookTree(beats: readonly number[], grouping: readonly number[] | null): TreeNode {
  let at = 0;
  const beatNodes = beats.map((slots) => {
    const node = beatNode(at, slots);
    at += slots;
    return node;
  });
  if (!grouping) return joinUnits(beatNodes);
  let b = 0;
  const groups = grouping.map((size) => {
    const node = joinUnits(beatNodes.slice(b, b + size));
    b += size;
    return node;
  });
  return joinUnits(groups);
}

function textbookLhl(tree: TreeNode, onsets: readonly boolean[]): number {
  const terminals: { kind: 'N' | 'R'; weight: number }[] = [];
  const visit = (node: TreeNode, depth: number, weight: number): void => {
    const inside = onsets.slice(node.start, node.end);
    const count = inside.filter(Boolean).length;
    if (count === 0) terminals.push({ kind: 'R', weight });
    else if (count === 1 && inside[0] === true) terminals.push({ kind: 'N', weight });
    else
      node.children.forEach((child, i) => visit(child, depth + 1, i === 0 ? weight : -(depth + 1)));
  };
  visit(tree, 0, 0);
  let total = 0;
  terminals.forEach((t, i) => {
    if (t.kind !== 'R') return;
    for (let j = i - 1; j >= 0; j--) {
      const n = terminals[j]!;
      if (n.kind === 'N' && n.weight <= t.weight) {
        total += t.weight - n.weight;
        return;
      }
    }
  });
  return total;
}

/** A small grid in an eighth meter with a random grouping of 1-4 beats per group. */
const groupedGrid = fc
  .array(fc.integer({ min: 1, max: 4 }), { minLength: 1, maxLength: 5 })
  .chain((grouping) => {
    const n = grouping.reduce((a, b) => a + b, 0);
    return fc.record({
      grouping: fc.constant(grouping),
      beats: fc.array(fc.integer({ min: 1, max: 4 }), { minLength: n, maxLength: n }),
    });
  })
  .filter(({ beats }) => beats.reduce((a, b) => a + b, 0) <= 14);

describe('the flattened grouped tree parses as the textbook tree does', () => {
  it('on random grouped grids and onset patterns', () => {
    fc.assert(
      fc.property(
        groupedGrid.chain((g) => {
          const pulses = g.beats.reduce((a, b) => a + b, 0);
          return fc.record({
            beats: fc.constant(g.beats),
            grouping: fc.constant(g.grouping),
            onsets: fc.array(fc.boolean(), { minLength: pulses, maxLength: pulses }),
          });
        }),
        ({ beats, grouping, onsets }) => {
          const grid = metricalGrid(beats, grouping);
          expect(lhlOnGrid(grid, onsets)).toBe(textbookLhl(textbookTree(beats, grouping), onsets));
        },
      ),
      { numRuns: 400 },
    );
  });
});
