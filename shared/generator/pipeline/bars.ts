import { compareVoices, type DrillBar, type DrillHit } from '../drill';
import type { Grid } from '../grid';
import type { WorkHit } from '../hands';

/** Bar `bar` (0-based) of a drill from the drill's cells, its hits in the drill's order. */
export function barOf(
  grid: Grid,
  bar: number,
  cells: readonly (readonly WorkHit[])[],
  tension: number,
): DrillBar {
  const hits: DrillHit[] = [];
  const first = bar * grid.slotsPerBar;
  for (let i = 0; i < grid.slotsPerBar; i++) {
    const cell = cells[first + i] ?? [];
    const beat = (grid.beatOf[i] ?? 0) + 1;
    const slot = grid.slotOf[i] ?? 0;
    const from = hits.length;
    for (const hit of cell) {
      const made: DrillHit = {
        beat,
        slot,
        voice: hit.voice,
        dynamic: hit.dynamic,
        hand: hit.hand,
        source: hit.source,
      };
      // A stable insertion by voice: a cell holds a few hits, no copy and sort needed.
      let k = hits.length;
      while (k > from && compareVoices(hits[k - 1] as DrillHit, made) > 0) k--;
      if (k === hits.length) hits.push(made);
      else hits.splice(k, 0, made);
    }
  }
  return { bar: bar + 1, beats: grid.beats.slice(), tension, hits };
}
