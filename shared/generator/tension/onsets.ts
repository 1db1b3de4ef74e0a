import type { DrillBar } from '../drill';
import type { MetricalGrid } from './metrical-grid';

/**
 * The bar's onset stream for syncopation: every voice merged, the ostinato left out (it keeps
 * time; the tension lies in what moves against it). A pulse is an onset when any hit not placed by
 * the ostinato sits there, whatever its voice or dynamic.
 */
export function barOnsets(bar: DrillBar, grid: MetricalGrid): boolean[] {
  const onsets = new Array<boolean>(grid.pulses).fill(false);
  for (const hit of bar.hits) {
    if (hit.source === 'ostinato') continue;
    const slots = grid.beats[hit.beat - 1];
    const start = grid.beatStarts[hit.beat - 1];
    if (slots === undefined || start === undefined || !(hit.slot >= 0 && hit.slot < slots)) {
      throw new RangeError(
        `Bar ${bar.bar} has a hit at beat ${hit.beat}, slot ${hit.slot}, outside its grid.`,
      );
    }
    onsets[start + hit.slot] = true;
  }
  return onsets;
}
