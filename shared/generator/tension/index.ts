/**
 * Syncopation measures on tuplet grids, and the product's tension (`measureTension`: the
 * Longuet-Higgins & Lee measure scaled to the bar's grid). `measureWitek` is the polyphonic
 * alternative (Witek et al. 2014), not used by the generator unless a card asks for it.
 */
export { measureTension, tensionMeter, type TensionMeter } from './tension';
export { lhlSyncopation, lhlOnGrid } from './lhl';
export {
  lhlRangeOnGrid,
  lhlRangeScratch,
  maxLhlOnGrid,
  maxLhlSyncopation,
  type LhlRange,
} from './lhl-range';
export { weightedNoteToBeatDistance } from './wnbd';
export { barOnsets } from './onsets';
export {
  WITEK_CLASS_OF_VOICE,
  type WitekClass,
  type WitekStreams,
  instrumentWeight,
  witekOnGrid,
  witekOnWeights,
  witekStreams,
  witekSyncopation,
} from './witek';
export {
  maxWitekOnGrid,
  maxWitekSyncopation,
  mostWitekOnWeights,
  type WitekMost,
} from './witek-max';
export { measureWitek, witekMeter, type WitekMeter } from './witek-meter';
export { type BarGrid, type MetricalGrid, metricalGrid, primeFactors } from './metrical-grid';
