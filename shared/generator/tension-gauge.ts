import type { DrillBar, VoiceId } from './drill';
import { barOnsets, lhlOnGrid, lhlRangeOnGrid, lhlRangeScratch, metricalGrid } from './tension';
import type { LhlRange } from './tension';
import {
  gridWeights,
  WITEK_CLASS_OF_VOICE,
  witekOnWeights,
  witekStreams,
  type WitekStreams,
} from './tension/witek';
import { mostWitekOnWeights } from './tension/witek-max';
import { fromUnits, unitsOf } from './tension/scale';

/** Which published measure a card's tension uses. */
export type TensionMeasure = 'lhl' | 'witek';

/** A bar's tension measured on a grid whose metrical tree is worked out once. */
export interface TensionGauge {
  readonly measure: TensionMeasure;
  /** The greatest raw syncopation on the grid (tension 1). */
  readonly most: number;
  /** A raw syncopation value in ten-thousandths of the scale. */
  unitsOfRaw(raw: number): number;
  /** A raw syncopation value on the 0..1 scale, 4 decimals. */
  scale(raw: number): number;
  /**
   * Tension in ten-thousandths of one bar, from the voices at each of its pulses (time layers
   * included; the measure leaves out what it does not count).
   */
  unitsOfVoices(voices: readonly (readonly VoiceSound[])[]): number;
  /** The raw (unscaled) syncopation of the same. */
  rawOfVoices(voices: readonly (readonly VoiceSound[])[]): number;
  /** LHL only: the raw syncopation of a merged onset stream (time layers already left out). */
  rawOfOnsets(onsets: readonly boolean[]): number;
  /** Same value as `measureTension(bar, measure)`, for a bar on this gauge's grid. */
  ofBar(bar: DrillBar): number;
  /**
   * LHL only: the least and greatest raw syncopation (not scaled) of the bars that sound every
   * `forced` pulse and nothing outside `allowed`: what any fill of those slots can reach.
   */
  reach(forced: readonly boolean[], allowed: readonly boolean[]): LhlRange;
}

/** A voice sounding at a pulse, and whether a time layer placed it. */
export interface VoiceSound {
  readonly voice: VoiceId;
  readonly time: boolean;
}

/**
 * `measureTension` builds the metrical tree and its maximum on every call; the generator
 * measures hundreds of candidate bars on one grid, so it builds them once per drill. The value
 * is the same formula (the card's measure over the grid's maximum, 4 decimals); `checkDrill`
 * compares every stored tension with the same measure.
 *
 * Longuet-Higgins & Lee is monophonic and leaves the time layers out (the tension lies in what
 * moves against them); Witek et al. weigh instruments against each other, the time-keeping
 * hi-hat included, so every voice counts. `grouping` is the card's `meter.grouping` (a level of
 * the metrical tree between bar and beats; none for x/4 meters).
 */
export function createTensionGauge(
  beats: readonly number[],
  measure: TensionMeasure = 'lhl',
  grouping?: readonly number[] | null,
): TensionGauge {
  const tree = metricalGrid(beats, grouping);
  if (measure === 'witek') {
    const weights = gridWeights(tree);
    const most = mostWitekOnWeights(weights).most;
    const unitsOfRaw = (raw: number): number => unitsOf(raw, most);
    const rawOfVoices = (voices: readonly (readonly VoiceSound[])[]): number =>
      witekOnWeights(weights, streamsOf(voices));
    return {
      measure,
      most,
      unitsOfRaw,
      scale: (raw) => fromUnits(unitsOfRaw(raw)),
      unitsOfVoices: (voices) => unitsOfRaw(rawOfVoices(voices)),
      rawOfVoices,
      rawOfOnsets: () => {
        throw new RangeError('The polyphonic measure reads voices, not merged onsets.');
      },
      ofBar: (bar) => fromUnits(unitsOfRaw(witekOnWeights(weights, witekStreams(bar, tree)))),
      reach: () => ({ least: 0, most }),
    };
  }
  // The reach proof asks once per distinct bar: its work arrays are made once per gauge.
  const scratch = lhlRangeScratch(tree);
  const most = lhlRangeOnGrid(tree, undefined, undefined, scratch).most;
  const units = (onsets: readonly boolean[]): number => unitsOf(lhlOnGrid(tree, onsets), most);
  const unitsOfRaw = (raw: number): number => unitsOf(raw, most);
  return {
    measure,
    most,
    unitsOfRaw,
    scale: (raw) => fromUnits(unitsOfRaw(raw)),
    unitsOfVoices: (voices) => units(voices.map((at) => at.some((v) => !v.time))),
    rawOfVoices: (voices) =>
      lhlOnGrid(
        tree,
        voices.map((at) => at.some((v) => !v.time)),
      ),
    rawOfOnsets: (onsets) => lhlOnGrid(tree, onsets),
    ofBar: (bar) => fromUnits(units(barOnsets(bar, tree))),
    reach: (forced, allowed) => lhlRangeOnGrid(tree, forced, allowed, scratch),
  };
}

function streamsOf(voices: readonly (readonly VoiceSound[])[]): WitekStreams {
  const low = voices.map(() => false);
  const mid = low.slice();
  const high = low.slice();
  const by = { low, mid, high };
  voices.forEach((at, pulse) => {
    for (const v of at) by[WITEK_CLASS_OF_VOICE[v.voice]][pulse] = true;
  });
  return by;
}
