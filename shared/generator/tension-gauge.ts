import type { DrillBar } from './drill';
import { barOnsets, lhlOnGrid, lhlRangeOnGrid, maxLhlOnGrid, metricalGrid } from './tension';
import type { LhlRange } from './tension';

/** A bar's tension measured on a grid whose metrical tree is worked out once. */
export interface TensionGauge {
  /** The greatest Longuet-Higgins & Lee syncopation on the grid (tension 1). */
  readonly most: number;
  /** Tension in ten-thousandths from the bar's onset stream (ostinato left out). */
  units(onsets: readonly boolean[]): number;
  /** A raw syncopation value in ten-thousandths of the scale. */
  unitsOfRaw(raw: number): number;
  /** A raw syncopation value on the 0..1 scale, 4 decimals. */
  scale(raw: number): number;
  /** Same value as `measureTension(bar)`, for a bar on this gauge's grid. */
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
 * compares every stored tension with the same measure.
 */
export function createTensionGauge(beats: readonly number[]): TensionGauge {
  const tree = metricalGrid(beats);
  const most = maxLhlOnGrid(tree);
  const units = (onsets: readonly boolean[]): number =>
    most === 0 ? 0 : Math.round((lhlOnGrid(tree, onsets) / most) * 10_000);
  const unitsOfRaw = (raw: number): number => (most === 0 ? 0 : Math.round((raw / most) * 10_000));
  return {
    most,
    units,
    unitsOfRaw,
    scale: (raw) => unitsOfRaw(raw) / 10_000,
    ofBar: (bar) => units(barOnsets(bar, tree)) / 10_000,
    reach: (forced, allowed) => lhlRangeOnGrid(tree, forced, allowed),
  };
}
