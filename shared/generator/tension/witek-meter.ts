import type { DrillBar } from '../drill';
import { type BarGrid, metricalGrid } from './metrical-grid';
import { type WitekStreams, gridWeights, witekOnWeights, witekStreams } from './witek';
import { mostWitekOnWeights } from './witek-max';
import { scaled } from './scale';

/** Measures bars of one grid with Witek's index; build it once per grid for many bars. */
export interface WitekMeter {
  readonly beats: BarGrid;
  /** The greatest raw Witek index on this grid (the scale's 1). */
  readonly most: number;
  /** `measureWitek` for a bar on this meter's grid (throws if the bar's grid differs). */
  measure(bar: DrillBar): number;
  /** The scaled index of raw class streams by pulse (every layer the caller wants counted). */
  measureStreams(streams: WitekStreams): number;
}

/**
 * Builds the Witek meter of a bar grid: the metrical tree, its weights and the exact maximum are
 * computed once, so each measure afterwards is one pass over the bar. The caller owns the meter;
 * nothing is cached inside the engine. Mirrors `tensionMeter`.
 */
export function witekMeter(beats: BarGrid, grouping?: readonly number[] | null): WitekMeter {
  const grid = metricalGrid(beats, grouping);
  const weights = gridWeights(grid);
  const { most } = mostWitekOnWeights(weights);
  const scale = (value: number): number => scaled(value, most);
  return {
    beats,
    most,
    measure(bar) {
      if (bar.beats.length !== beats.length || bar.beats.some((n, i) => n !== beats[i])) {
        throw new RangeError(
          `Bar ${bar.bar} is on grid [${bar.beats.join(', ')}], not [${beats.join(', ')}].`,
        );
      }
      return scale(witekOnWeights(weights, witekStreams(bar, grid)));
    },
    measureStreams: (streams) => scale(witekOnWeights(weights, streams)),
  };
}

/**
 * A bar's polyphonic syncopation, 0..1: the index of M. A. G. Witek et al., "Syncopation,
 * body-movement and pleasure in groove music", PLoS ONE 9(4): e94446, 2014 (see `witekOnWeights`
 * for the reading of its rules), on every hit of the bar (the time-keeping layer included), divided
 * by the greatest index any bar reaches on the same grid (exact, `mostWitekOnWeights`), rounded to
 * 4 decimals. Measured on the bar alone, like `measureTension`; a grid on which nothing can
 * syncopate measures 0.
 *
 * A card that chooses `measure: 'witek'` gets its bars' tension from this (through the tension
 * gauge); `measureTension(bar, grouping, 'witek')` calls it. Measuring many bars of one grid: use
 * `witekMeter(beats)`, which gives the same values.
 */
export function measureWitek(bar: DrillBar, grouping?: readonly number[] | null): number {
  return witekMeter(bar.beats, grouping).measure(bar);
}
