/**
 * The metrical tree of one bar on a (possibly tuplet) grid, flattened for fast scans.
 *
 * A bar is `beats: number[]`, the slots of each beat (e.g. `[4, 4, 4, 4]` for sixteenths in 4/4,
 * `[4, 4, 5, 5]` for sixteenths turning into quintuplets). Onsets sit on *pulses*: the bar's slots
 * numbered 0..pulses-1 in time order.
 *
 * The tree follows Longuet-Higgins & Lee (1984), "The rhythmic interpretation of monophonic
 * music", Music Perception 1(4), 424–441: the bar divides into its beats, each beat into its
 * subdivision, every division into equal parts. A level that divides by a composite number is
 * split into prime levels, smallest prime first (coarse to fine):
 *  - the bar over its beats: 4 beats = 2 × 2 (halves, then beats: beat 3 is stronger than beats 2
 *    and 4, as in 4/4), 6 = 2 × 3 (two groups of three, as in 6/8), 12 = 2 × 2 × 3; prime counts
 *    (3, 5, 7 …) are one level;
 *  - a beat over its slots: 4 = 2 × 2, 8 = 2 × 2 × 2, 6 = 2 × 3 (a sextuplet heard as two triplets:
 *    slot 3 is the half-beat, stronger than slots 1, 2, 4, 5); 3, 5 and 7 are one level.
 * For 4/4 in sixteenths this gives the weights 0,-4,-3,-4,-2,-4,-3,-4,-1,… used by the reference
 * implementation SynPy (C. Song, M. Pearce, C. Harte, "SynPy: a Python toolkit for syncopation
 * modelling", SMC 2015).
 *
 * A meter with a grouping (`meter.grouping`, beats per group: 6/8 as [3, 3], 7/8 as [2, 2, 3],
 * 15/8 as five 3s) puts one more level between the bar and its beats: bar → groups → beats →
 * slots. The bar divides into its groups (a composite group count prime-factored as above: four
 * groups = 2 × 2, so in 12/8 the third dotted quarter is stronger than the second and fourth;
 * five groups are one level), each group into its beats (2 or 3 beats: one level; 4 beats:
 * 2 × 2; a group of one beat is the beat itself), each beat into its slots as above. So in 7/8 as
 * 2+2+3 the eighths 1, 3 and 5 weigh -1 and the others -2, where the ungrouped tree would weigh
 * all seven alike. Without a grouping the tree is exactly the one above.
 */

/** Slots per beat, one entry per beat of the bar. */
export type BarGrid = readonly number[];

/** One bar's tree, flattened: what the syncopation scans and the exact maximum need. */
export interface MetricalGrid {
  readonly beats: BarGrid;
  /** Beats per group, or null where the beats stand alone (bar → beats → slots). */
  readonly grouping: readonly number[] | null;
  /** Pulses (slots) in the bar. */
  readonly pulses: number;
  /** Pulse of each beat's slot 0, plus the bar's end as a last entry. */
  readonly beatStarts: readonly number[];
  /**
   * Per pulse: the depth of the shallowest tree node starting there (0 = the bar). The metrical
   * weight of the pulse is `-level`.
   */
  readonly level: readonly number[];
  /**
   * Per pulse: the end pulses (exclusive) of every tree node that starts there, shallowest first.
   * The last entry is always `pulse + 1` (the single-slot leaf).
   */
  readonly nodeEnds: readonly (readonly number[])[];
  /** The greatest level in the bar (the finest subdivision's depth). */
  readonly depth: number;
  /**
   * End pulse of the tree node at depth d containing pulse p, at `p * (depth + 1) + d`
   * (0 where the pulse's leaf is shallower than d).
   */
  readonly ancestorEnd: Int32Array;
}

/** Prime factors in ascending order: 12 → [2, 2, 3]; 1 → []. */
export function primeFactors(n: number): number[] {
  const factors: number[] = [];
  let rest = n;
  for (let p = 2; p * p <= rest; p++) {
    while (rest % p === 0) {
      factors.push(p);
      rest /= p;
    }
  }
  if (rest > 1) factors.push(rest);
  return factors;
}

/**
 * Builds the flattened metrical tree of a bar, with the meter's grouping when it has one (beats
 * per group, adding up to the bar's beats; see the file's comment). Throws a RangeError for a grid
 * that is not a list of positive whole numbers of slots, or a grouping that does not fit it.
 */
export function metricalGrid(beats: BarGrid, grouping?: readonly number[] | null): MetricalGrid {
  if (beats.length === 0 || beats.some((n) => !Number.isInteger(n) || n < 1)) {
    throw new RangeError(
      `A bar needs one or more beats of 1 or more slots (got [${beats.join(', ')}]).`,
    );
  }
  if (
    grouping &&
    (grouping.length === 0 ||
      grouping.some((n) => !Number.isInteger(n) || n < 1) ||
      grouping.reduce((a, b) => a + b, 0) !== beats.length)
  ) {
    throw new RangeError(
      `The grouping [${grouping.join(', ')}] does not divide a bar of ${beats.length} beats.`,
    );
  }
  const beatStarts = [0];
  for (const slots of beats) beatStarts.push((beatStarts[beatStarts.length - 1] ?? 0) + slots);
  const pulses = beatStarts[beats.length] ?? 0;
  const level = new Array<number>(pulses).fill(-1);
  const nodeEnds: number[][] = Array.from({ length: pulses }, () => []);
  const nodes: number[] = []; // start, end, depth triples
  let depth = 0;

  const addNode = (start: number, end: number, nodeDepth: number): void => {
    const ends = nodeEnds[start];
    if (ends === undefined) return;
    if (ends.length === 0) level[start] = nodeDepth;
    ends.push(end);
    nodes.push(start, end, nodeDepth);
    if (nodeDepth > depth) depth = nodeDepth;
  };

  const splitBeat = (
    start: number,
    length: number,
    factors: readonly number[],
    f: number,
    d: number,
  ): void => {
    addNode(start, start + length, d);
    const parts = factors[f];
    if (parts === undefined) return;
    const part = length / parts;
    for (let i = 0; i < parts; i++) splitBeat(start + i * part, part, factors, f + 1, d + 1);
  };

  /** `count` beats from `firstBeat` as one node, divided by `factors[f]`, `factors[f + 1]` … */
  const splitBeats = (
    firstBeat: number,
    count: number,
    factors: readonly number[],
    f: number,
    d: number,
  ): void => {
    if (count === 1) {
      const slots = beats[firstBeat] ?? 1;
      splitBeat(beatStarts[firstBeat] ?? 0, slots, primeFactors(slots), 0, d);
      return;
    }
    addNode(beatStarts[firstBeat] ?? 0, beatStarts[firstBeat + count] ?? 0, d);
    const parts = factors[f] ?? count;
    const group = count / parts;
    for (let i = 0; i < parts; i++) splitBeats(firstBeat + i * group, group, factors, f + 1, d + 1);
  };

  if (grouping && grouping.length > 1) {
    // Bar → groups (the group count prime-factored) → each group's beats → slots.
    const groupStarts = [0];
    for (const size of grouping)
      groupStarts.push((groupStarts[groupStarts.length - 1] ?? 0) + size);
    const groupFactors = primeFactors(grouping.length);
    const splitGroups = (firstGroup: number, count: number, f: number, d: number): void => {
      const firstBeat = groupStarts[firstGroup] ?? 0;
      if (count === 1) {
        const size = grouping[firstGroup] ?? 1;
        splitBeats(firstBeat, size, primeFactors(size), 0, d);
        return;
      }
      addNode(beatStarts[firstBeat] ?? 0, beatStarts[groupStarts[firstGroup + count] ?? 0] ?? 0, d);
      const parts = groupFactors[f] ?? count;
      const size = count / parts;
      for (let i = 0; i < parts; i++) splitGroups(firstGroup + i * size, size, f + 1, d + 1);
    };
    splitGroups(0, grouping.length, 0, 0);
  } else {
    splitBeats(0, beats.length, primeFactors(beats.length), 0, 0);
  }
  const ancestorEnd = new Int32Array(pulses * (depth + 1));
  for (let i = 0; i < nodes.length; i += 3) {
    const [start = 0, end = 0, d = 0] = [nodes[i], nodes[i + 1], nodes[i + 2]];
    for (let p = start; p < end; p++) ancestorEnd[p * (depth + 1) + d] = end;
  }
  return {
    beats,
    grouping: grouping && grouping.length > 0 ? grouping.slice() : null,
    pulses,
    beatStarts,
    level,
    nodeEnds,
    depth,
    ancestorEnd,
  };
}
