/**
 * Syncopation measures on tuplet grids, and the product's tension (`measureTension`: the
 * Longuet-Higgins & Lee measure scaled to the bar's grid).
 */
export { measureTension, tensionMeter, type TensionMeter } from './tension';
export { lhlSyncopation, lhlOnGrid } from './lhl';
export { maxLhlSyncopation, maxLhlOnGrid } from './lhl-max';
export { lhlRangeOnGrid, type LhlRange } from './lhl-range';
export { weightedNoteToBeatDistance } from './wnbd';
export { barOnsets } from './onsets';
export { type BarGrid, type MetricalGrid, metricalGrid, primeFactors } from './metrical-grid';
