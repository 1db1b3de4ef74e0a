import type { DrillBar } from './drill';
import { barOnsets, lhlOnGrid, lhlRangeOnGrid, maxLhlOnGrid, metricalGrid } from './tension';
import type { LhlRange } from './tension';

/** A bar's tension measured on a grid whose metrical tree is worked out once. */
export interface TensionGauge {
  /** The greatest Longuet-Higgins & Lee syncopation on the grid (tension 1). */
  readonly most: number;
  /** Tension in ten-thousandths from the bar's onset stream (ostinato left out). */
  units(onsets: readonly boolean[]): number;
  /** Same value as `measureTension(bar, grouping)`, for a bar on this gauge's grid. */
  ofBar(bar: DrillBar): number;
  /**
   * The least and greatest raw syncopation (not scaled) of the bars that sound every `forced`
   * pulse and nothing outside `allowed`: what any fill of those slots can reach.
   */
  reach(forced: readonly boolean[], allowed: readonly boolean[]): LhlRange;
}

/**
 * `measureTension` builds the metrical tree and its maximum on every call; the generator
 * measures hundreds of candidate bars on one grid, so it builds them once per drill. The value
 * is the same formula (LHL syncopation over the grid's maximum, 4 decimals); `checkDrill`
 * compares every stored tension with the same measure. `grouping` is the card's
 * `meter.grouping` (a level of the metrical tree between bar and beats; none for x/4 meters).
 */
export function createTensionGauge(
  beats: readonly number[],
  grouping?: readonly number[] | null,
): TensionGauge {
  const tree = metricalGrid(beats, grouping);
  const most = maxLhlOnGrid(tree);
  const units = (onsets: readonly boolean[]): number =>
    most === 0 ? 0 : Math.round((lhlOnGrid(tree, onsets) / most) * 10_000);
  return {
    most,
    units,
    ofBar: (bar) => units(barOnsets(bar, tree)) / 10_000,
    reach: (forced, allowed) => lhlRangeOnGrid(tree, forced, allowed),
  };
}
