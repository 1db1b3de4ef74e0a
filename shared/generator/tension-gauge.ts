import type { DrillBar } from './drill';
import { barOnsets, lhlOnGrid, maxLhlSyncopation, metricalGrid } from './tension';

/** A bar's tension measured on a grid whose metrical tree is worked out once. */
export interface TensionGauge {
  /** Tension in ten-thousandths from the bar's onset stream (ostinato left out). */
  units(onsets: readonly boolean[]): number;
  /** Same value as `measureTension(bar)`, for a bar on this gauge's grid. */
  ofBar(bar: DrillBar): number;
}

/**
 * `measureTension` rebuilds the metrical tree and its maximum on every call; the generator
 * measures hundreds of candidate bars on one grid, so it builds them once per drill. The value
 * is the same formula (LHL syncopation over the grid's maximum, 4 decimals); `checkDrill`
 * compares every stored tension with `measureTension` itself.
 */
export function createTensionGauge(beats: readonly number[]): TensionGauge {
  const tree = metricalGrid(beats);
  const most = maxLhlSyncopation(beats);
  const units = (onsets: readonly boolean[]): number =>
    most === 0 ? 0 : Math.round((lhlOnGrid(tree, onsets) / most) * 10_000);
  return { units, ofBar: (bar) => units(barOnsets(bar, tree)) / 10_000 };
}
