import { type BarGrid, type MetricalGrid, metricalGrid } from './metrical-grid';
import { HIGH, LOW, MID, type WitekStreams, gridWeights, onsetValue } from './witek';

/** The greatest Witek index on a grid and one bar that reaches it. */
export interface WitekMost {
  readonly most: number;
  /** A bar of class streams whose index is `most` (the empty bar when `most` is 0). */
  readonly pattern: WitekStreams;
}

/**
 * The greatest polyphonic syncopation index (`witekOnWeights`) any bar reaches on per-pulse
 * weights, found exactly by dynamic programming over the onsets in time order (no search over
 * patterns).
 *
 * Why this is exact. The index is a sum over the bar's onsets, and the value of an onset depends
 * only on its pulse and classes, the pulse and classes of the next onset, and the greatest weight
 * of the silent pulses between them (or, for the last onset, up to the bar's end). The silent
 * pulses before the first onset add nothing. So the best total from an onset at pulse p with
 * classes A onward is the best, over "no further onset" and every next onset (q, B), of that
 * onset's value plus the best total from (q, B) onward: a longest path over the states
 * (pulse, classes), computed from the bar's end backwards.
 *
 * Cost: O(pulses² × 49) steps (7 class sets on each side), about 350 thousand for the largest grid
 * (15 beats of 8 slots).
 */
export function mostWitekOnWeights(weights: readonly number[]): WitekMost {
  const pulses = weights.length;
  const sets = 8; // class bits 1..7; index 0 unused
  const best = new Float64Array(pulses * sets);
  const nextPulse = new Int32Array(pulses * sets).fill(-1);
  const nextSet = new Uint8Array(pulses * sets);
  // Greatest weight at or after each pulse (the gap of a last onset runs to the bar's end).
  const suffixMost = new Float64Array(pulses + 1).fill(-Infinity);
  for (let p = pulses - 1; p >= 0; p--) {
    suffixMost[p] = Math.max(suffixMost[p + 1] ?? -Infinity, weights[p] ?? 0);
  }

  for (let p = pulses - 1; p >= 0; p--) {
    for (let here = 1; here < sets; here++) {
      let value = onsetValue(weights, p, here, -1, 0, suffixMost[p + 1] ?? -Infinity);
      let q0 = -1;
      let b0 = 0;
      let gapMost = -Infinity;
      for (let q = p + 1; q < pulses; q++) {
        for (let next = 1; next < sets; next++) {
          const candidate =
            onsetValue(weights, p, here, q, next, gapMost) + (best[q * sets + next] ?? 0);
          if (candidate > value) {
            value = candidate;
            q0 = q;
            b0 = next;
          }
        }
        gapMost = Math.max(gapMost, weights[q] ?? 0);
      }
      best[p * sets + here] = value;
      nextPulse[p * sets + here] = q0;
      nextSet[p * sets + here] = b0;
    }
  }

  let most = 0;
  let start = -1;
  for (let i = 0; i < pulses * sets; i++) {
    if (i % sets !== 0 && (best[i] ?? 0) > most) {
      most = best[i] ?? 0;
      start = i;
    }
  }

  const low = new Array<boolean>(pulses).fill(false);
  const mid = new Array<boolean>(pulses).fill(false);
  const high = new Array<boolean>(pulses).fill(false);
  for (let i = start; i >= 0;) {
    const p = Math.floor(i / sets);
    const here = i % sets;
    low[p] = (here & LOW) !== 0;
    mid[p] = (here & MID) !== 0;
    high[p] = (here & HIGH) !== 0;
    const q = nextPulse[i] ?? -1;
    i = q < 0 ? -1 : q * sets + (nextSet[i] ?? 0);
  }
  return { most, pattern: { low, mid, high } };
}

/** The greatest Witek index on a grid already built (weights = -level). */
export function maxWitekOnGrid(grid: MetricalGrid): number {
  return mostWitekOnWeights(gridWeights(grid)).most;
}

/** The greatest Witek index any bar reaches on a bar grid (exact). */
export function maxWitekSyncopation(beats: BarGrid): number {
  return maxWitekOnGrid(metricalGrid(beats));
}
