import type { DrillBar } from '../drill';
import { lhlOnGrid } from './lhl';
import { maxLhlOnGrid } from './lhl-range';
import { type BarGrid, metricalGrid } from './metrical-grid';
import { barOnsets } from './onsets';
import { measureWitek } from './witek-meter';
import { scaled } from './scale';

/** Measures bars of one grid; build it once per grid when measuring many bars. */
export interface TensionMeter {
  readonly beats: BarGrid;
  /** The meter's grouping the tree was built with (null: the beats stand alone). */
  readonly grouping: readonly number[] | null;
  /** The greatest Longuet-Higgins & Lee syncopation on this grid (the scale's 1). */
  readonly most: number;
  /** `measureTension` for a bar on this meter's grid (throws if the bar's grid differs). */
  measure(bar: DrillBar): number;
  /** The tension of a raw onset stream by pulse (voices already merged, ostinato left out). */
  measureOnsets(onsets: readonly boolean[]): number;
}

/**
 * Builds the tension meter of a bar grid, with the meter's grouping (beats per group, e.g. the
 * card's `meter.grouping`) as a level of the metrical tree when given: the metrical tree and the
 * exact maximum are computed once, so each measure afterwards is a single pass over the bar
 * (about a microsecond for 16 sixteenths). The caller owns the meter; nothing is cached inside
 * the engine.
 */
export function tensionMeter(beats: BarGrid, grouping?: readonly number[] | null): TensionMeter {
  const grid = metricalGrid(beats, grouping);
  const most = maxLhlOnGrid(grid);
  const scale = (value: number): number => scaled(value, most);
  return {
    beats,
    grouping: grid.grouping,
    most,
    measure(bar) {
      if (bar.beats.length !== beats.length || bar.beats.some((n, i) => n !== beats[i])) {
        throw new RangeError(
          `Bar ${bar.bar} is on grid [${bar.beats.join(', ')}], not [${beats.join(', ')}].`,
        );
      }
      return scale(lhlOnGrid(grid, barOnsets(bar, grid)));
    },
    measureOnsets: (onsets) => scale(lhlOnGrid(grid, onsets)),
  };
}

/**
 * A bar's tension, 0..1: its Longuet-Higgins & Lee syncopation (H. C. Longuet-Higgins, C. S. Lee,
 * "The rhythmic interpretation of monophonic music", Music Perception 1(4), 1984, 424–441; see
 * `lhlSyncopation`) divided by the greatest value any onset pattern reaches on the same bar grid
 * (`maxLhlSyncopation`, exact), rounded to 4 decimals.
 *
 * Computed on the bar alone (no previous bar, no wrap), on all voices merged into one onset
 * stream (a pulse with any hit counts once, whatever its voice or dynamic), ignoring hits placed
 * by the ostinato. A grid on which nothing can syncopate (one beat of triplets, say) has tension 0.
 *
 * Why this measure rather than the weighted note-to-beat distance: it reads the metrical tree
 * itself, so tuplet and mixed grids need no special case; a steady run of notes scores 0 (no strong
 * position is left unstruck), where the note-to-beat distance already rates plain sixteenths as
 * syncopated; and it is a sum over rests, so one fill more or less moves it by a predictable step.
 *
 * A bar does not carry its meter's grouping: pass it (the card's `meter.grouping`) to measure on
 * the grouped tree (6/8 as two dotted quarters, 7/8 as 2+2+3; see `metricalGrid`). Without it the
 * beats stand alone, as in x/4 meters.
 *
 * Measuring many bars of one grid: use `tensionMeter(beats, grouping)`, which gives the same
 * values. A card may choose the polyphonic measure of Witek et al. instead (`measure: "witek"`,
 * see `measureWitek`); pass the card's measure to get the value its drills store.
 */
export function measureTension(
  bar: DrillBar,
  grouping?: readonly number[] | null,
  measure: 'lhl' | 'witek' = 'lhl',
): number {
  if (measure === 'witek') return measureWitek(bar, grouping);
  return tensionMeter(bar.beats, grouping).measure(bar);
}
