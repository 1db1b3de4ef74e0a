import { pushNote, restGain } from './lhl';
import { type BarGrid, type MetricalGrid, metricalGrid } from './metrical-grid';

/** The least and the greatest Longuet-Higgins & Lee syncopation a set of onset patterns reaches. */
export interface LhlRange {
  readonly least: number;
  readonly most: number;
}

/**
 * The work arrays of `lhlRangeOnGrid` for one grid. Allocating them costs several times the walk
 * itself (a 16-slot bar reaches about a hundred states of its 3 264), so a caller that asks many
 * times on one grid passes the same arrays; each call leaves them as it found them.
 */
export interface LhlRangeScratch {
  readonly lows: Int32Array;
  readonly highs: Int32Array;
  readonly head: Int32Array;
  readonly next: Int32Array;
}

/** Fresh work arrays for `lhlRangeOnGrid` on this grid. */
export function lhlRangeScratch(grid: MetricalGrid): LhlRangeScratch {
  const size = (grid.pulses + 1) * stateCount(grid);
  return {
    lows: new Int32Array(size).fill(-1),
    highs: new Int32Array(size),
    head: new Int32Array(grid.pulses + 1).fill(-1),
    next: new Int32Array(size),
  };
}

/** States per pulse: a note mask of depth + 1 levels times depth + 2 deadline codes. */
const stateCount = (grid: MetricalGrid): number => (1 << (grid.depth + 1)) * (grid.depth + 2);

/**
 * The exact range of Longuet-Higgins & Lee syncopation over every onset pattern of a bar that
 * sounds all `forced` pulses and nothing outside `allowed` (forced pulses count as allowed;
 * `undefined` = no pulse forced / every pulse allowed). The generator uses it to prove, without
 * searching, that a tension curve is out of reach of the slots a fill may use.
 *
 * Dynamic programming over the terminal nodes of the parse in time order (why it is exact: see
 * `maxLhlSyncopation`): the state is the pairable notes (a level mask) and the earliest pending deadline by
 * which some onset must sound; min and max ride along the same transitions. The constraints only
 * prune transitions: a rest may not cover a forced pulse, a note must start on an allowed pulse
 * and may not hold over a forced one. Every pattern has exactly one parse, so the walks that
 * survive are exactly the patterns asked about.
 *
 * Only reached states are visited (a few dozen per pulse at most), so the cost is linear in
 * pulses. `scratch`: work arrays made by `lhlRangeScratch` for this grid, to reuse.
 */
export function lhlRangeOnGrid(
  grid: MetricalGrid,
  forced?: readonly boolean[],
  allowed?: readonly boolean[],
  scratch: LhlRangeScratch = lhlRangeScratch(grid),
): LhlRange {
  const { pulses, level, nodeEnds, depth, ancestorEnd } = grid;
  const codes = depth + 2;
  // Plain arrays, not typed ones: a 16-slot bar's 17 counts would already be allocated outside
  // V8's heap, which costs more than the walk.
  const forcedBefore = [0];
  for (let i = 0, count = 0; i < pulses; i++) {
    if (forced?.[i] === true) count++;
    forcedBefore.push(count);
  }
  const mayStrike = (p: number): boolean =>
    allowed === undefined || allowed[p] === true || forced?.[p] === true;
  const silent = (from: number, to: number): boolean =>
    (forcedBefore[to] ?? 0) === (forcedBefore[from] ?? 0);

  // Best values by (pulse, state), and each pulse's reached states as a linked list, so only
  // those few are visited.
  const column = stateCount(grid);
  const { lows, highs, head, next } = scratch;
  if (lows.length !== (pulses + 1) * column || head.length !== pulses + 1)
    throw new RangeError('The work arrays were made for another grid.');

  const relax = (at: number, state: number, low: number, high: number): void => {
    const i = at * column + state;
    const seen = lows[i] ?? -1;
    if (seen < 0) {
      next[i] = head[at] ?? -1;
      head[at] = i;
      lows[i] = low;
      highs[i] = high;
      return;
    }
    if (low < seen) lows[i] = low;
    if (high > (highs[i] ?? 0)) highs[i] = high;
  };

  relax(0, 0, 0, 0);
  for (let p = 0; p < pulses; p++) {
    const ends = nodeEnds[p] ?? [];
    const k = level[p] ?? 0;
    const strike = mayStrike(p);
    for (let i = head[p] ?? -1; i >= 0; i = next[i] ?? -1) {
      const state = i - p * column;
      const low = lows[i] ?? 0;
      const high = highs[i] ?? 0;
      const notes = (state / codes) | 0;
      const code = state % codes;
      const deadline = code === 0 ? Infinity : (ancestorEnd[p * (depth + 1) + code - 1] ?? 0);
      const withNote = pushNote(notes, k) * codes;
      const gain = restGain(notes, k);
      for (let c = 0; c < ends.length; c++) {
        const end = ends[c] ?? p + 1;
        const parentCode = c === 0 ? 0 : k + c;
        // A note here meets every pending deadline; its own parent needs a later onset.
        if (strike && silent(p + 1, end)) relax(end, withNote + parentCode, low, high);
        // A rest leaves the deadlines pending, so an onset must still fit before them.
        if (end < deadline && silent(p, end))
          relax(end, notes * codes + Math.max(code, parentCode), low + gain, high + gain);
      }
    }
  }

  let least = Number.POSITIVE_INFINITY;
  let most = Number.NEGATIVE_INFINITY;
  for (let i = head[pulses] ?? -1; i >= 0; i = next[i] ?? -1) {
    if ((i - pulses * column) % codes !== 0) continue;
    least = Math.min(least, lows[i] ?? 0);
    most = Math.max(most, highs[i] ?? 0);
  }
  // Back as found: only the reached states were written (highs and next are set on first reach).
  for (let p = 0; p <= pulses; p++) {
    for (let i = head[p] ?? -1; i >= 0; i = next[i] ?? -1) lows[i] = -1;
    head[p] = -1;
  }
  // Unreachable for forced ⊆ allowed (the forced pulses alone are a pattern); kept total anyway.
  return Number.isFinite(most) ? { least, most } : { least: 0, most: 0 };
}

/**
 * The greatest Longuet-Higgins & Lee syncopation any onset pattern reaches on a bar's grid, found
 * exactly by the dynamic programme of `lhlRangeOnGrid` (no search over patterns).
 *
 * Why this is exact. Each terminal node is the shallowest tree node at its start pulse that is
 * silent or note-shaped, so a parse is a walk over start pulses choosing, at each, one node of the
 * chain of nodes starting there and its kind (N or R). Such a walk is a real parse exactly when
 * every chosen node that is not the top of its chain has a parent (the next node up the chain)
 * that is neither silent nor note-shaped, i.e. some onset falls after the chosen node and before
 * the parent's end; nodes starting earlier that contain the pulse are already held open by the
 * same condition at their own start. Those pending conditions are all met by the next onset, so
 * only the earliest deadline matters. The state is therefore (pairable notes as a level mask,
 * earliest deadline) and the value is the best sum so far; the answer is the best state at the
 * bar's end with no deadline open.
 *
 * The walk reads only the flattened tree (each pulse's chain of nodes, its level, the ends of its
 * ancestors), so it is exact on every tree `metricalGrid` builds, the grouped ones (bar → groups →
 * beats → slots) included, because two things hold there: every child lies one level below its
 * parent (so a pulse's chain runs through consecutive depths and chain index c is depth k + c),
 * and no node has a single child of its own span (a group of one beat is that beat, not a group
 * node over it), so the parent of a chosen node always ends later than the node. The spec checks
 * the maximum against every onset pattern on plain, tuplet, mixed and grouped grids.
 *
 * Cost: O(pulses × depth × states) with 2^(depth+1) note masks and depth + 2 deadline codes:
 * the depth of a bar is at most 7 levels, so this is linear in pulses (about 2k steps for 16
 * sixteenths).
 */
export function maxLhlSyncopation(beats: BarGrid, grouping?: readonly number[] | null): number {
  return maxLhlOnGrid(metricalGrid(beats, grouping));
}

/** `maxLhlSyncopation` on a grid already built. */
export function maxLhlOnGrid(grid: MetricalGrid): number {
  return lhlRangeOnGrid(grid).most;
}
