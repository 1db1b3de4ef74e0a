import { pushNote, restGain } from './lhl';
import { type BarGrid, type MetricalGrid, metricalGrid } from './metrical-grid';

/**
 * The greatest Longuet-Higgins & Lee syncopation any onset pattern reaches on a bar's grid, found
 * exactly by dynamic programming over the terminal nodes in time order (no search over patterns).
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
  const { pulses, level, nodeEnds, depth, ancestorEnd } = grid;
  // Deadline codes: 0 = none open, 1 + d = before the end of the pulse's ancestor at depth d
  // (a deeper ancestor ends no later, so the earliest deadline is the greatest code).
  const codes = depth + 2;
  const column = (1 << (depth + 1)) * codes;
  const best = new Int32Array((pulses + 1) * column).fill(-1);
  // Reached states of each column as a linked list, so only those few are visited.
  const head = new Int32Array(pulses + 1).fill(-1);
  const next = new Int32Array((pulses + 1) * column);

  const relax = (at: number, state: number, value: number): void => {
    const i = at * column + state;
    const seen = best[i] ?? -1;
    if (value <= seen) return;
    if (seen < 0) {
      next[i] = head[at] ?? -1;
      head[at] = i;
    }
    best[i] = value;
  };

  relax(0, 0, 0);
  for (let p = 0; p < pulses; p++) {
    const ends = nodeEnds[p] ?? [];
    const k = level[p] ?? 0;
    for (let i = head[p] ?? -1; i >= 0; i = next[i] ?? -1) {
      const value = best[i] ?? 0;
      const state = i - p * column;
      const notes = (state / codes) | 0;
      const code = state % codes;
      const deadline = code === 0 ? Infinity : (ancestorEnd[p * (depth + 1) + code - 1] ?? 0);
      const withNote = pushNote(notes, k) * codes;
      const gain = restGain(notes, k);
      for (let c = 0; c < ends.length; c++) {
        const end = ends[c] ?? p + 1;
        const parentCode = c === 0 ? 0 : k + c;
        // A note here meets every pending deadline; its own parent needs a later onset.
        relax(end, withNote + parentCode, value);
        // A rest leaves the deadlines pending, so an onset must still fit before them.
        if (end < deadline) relax(end, notes * codes + Math.max(code, parentCode), value + gain);
      }
    }
  }

  let most = 0;
  for (let i = head[pulses] ?? -1; i >= 0; i = next[i] ?? -1) {
    if ((i - pulses * column) % codes === 0) most = Math.max(most, best[i] ?? 0);
  }
  return most;
}
