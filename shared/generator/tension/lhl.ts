import { type BarGrid, type MetricalGrid, metricalGrid } from './metrical-grid';

/**
 * Longuet-Higgins & Lee syncopation of one bar: H. C. Longuet-Higgins, C. S. Lee, "The rhythmic
 * interpretation of monophonic music", Music Perception 1(4), 1984, 424–441.
 *
 * The bar is parsed down its metrical tree (see `metricalGrid`): a node that is silent becomes a
 * rest R, a node that starts with an onset and is silent after it becomes a note N, any other node
 * is divided further. Each terminal node carries the metrical weight of its first pulse (0 for the
 * bar, -1, -2 … one step per level down). Every R is paired with the nearest N before it whose
 * weight is not greater than the rest's, and adds `w(R) - w(N)`; the syncopation is the sum.
 * The pairing follows the reference implementation SynPy (C. Song, M. Pearce, C. Harte, "SynPy: a
 * Python toolkit for syncopation modelling", SMC 2015, `LHL.py`), on a single bar with no previous
 * bar prepended. Where SynPy answers -1 ("no syncopation") this returns 0.
 *
 * Terminal nodes are found by start pulse: the terminal node starting at a pulse is the shallowest
 * tree node starting there that is silent or note-shaped, and every terminal node carries the
 * weight of its start pulse. The notes seen so far are kept as a bit mask of levels holding only
 * the notes that can still be paired (a newer note hides every older note of equal or higher
 * weight), so each rest finds its note with one shift.
 *
 * `grouping` (beats per group, the card's `meter.grouping`) adds the group level to the tree.
 */
export function lhlSyncopation(
  beats: BarGrid,
  onsets: readonly boolean[],
  grouping?: readonly number[] | null,
): number {
  return lhlOnGrid(metricalGrid(beats, grouping), onsets);
}

/** `lhlSyncopation` on a grid already built (the onsets are read by pulse; missing = silent). */
export function lhlOnGrid(grid: MetricalGrid, onsets: readonly boolean[]): number {
  const { pulses, level, nodeEnds } = grid;
  const before = onsetCounts(onsets, pulses);
  let notes = 0;
  let total = 0;
  let p = 0;
  while (p < pulses) {
    const ends = nodeEnds[p] ?? [];
    const start = before[p] ?? 0;
    const struck = onsets[p] === true;
    const k = level[p] ?? 0;
    for (const end of ends) {
      const count = (before[end] ?? 0) - start;
      if (count === 0) {
        total += restGain(notes, k);
      } else if (count === 1 && struck) {
        notes = pushNote(notes, k);
      } else {
        continue;
      }
      p = end;
      break;
    }
  }
  return total;
}

/**
 * Prefix counts: `counts[i]` = onsets before pulse i. A plain array: this runs for every bar the
 * search measures, and a typed array of a 16-slot bar's 17 counts is past V8's in-heap size, so
 * each call would allocate a buffer outside the heap.
 */
function onsetCounts(onsets: readonly boolean[], pulses: number): number[] {
  const counts = [0];
  let count = 0;
  for (let i = 0; i < pulses; i++) {
    if (onsets[i] === true) count++;
    counts.push(count);
  }
  return counts;
}

/**
 * A note at level k hides older notes at levels ≤ k (weights ≥ its own): a later rest scanning
 * back meets the new note first. Bit ℓ of the mask = a pairable note at level ℓ.
 */
export function pushNote(notes: number, k: number): number {
  return (notes & ~((2 << k) - 1)) | (1 << k);
}

/**
 * The gain of a rest at level k: the nearest pairable note of weight ≤ the rest's is the lowest
 * set bit at or above k; the weight difference is how many levels lie between.
 */
export function restGain(notes: number, k: number): number {
  const above = notes >>> k;
  if (above === 0) return 0;
  return 31 - Math.clz32(above & -above);
}
