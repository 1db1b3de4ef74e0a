import { evenPoint, type Grid, type Landing } from '../grid';
import { bjorklund } from '../rhythm/bjorklund';
import type { EuclidRule } from '../schema';
import type { Placement } from './placement';

/**
 * The rotated Euclidean pattern E(pulses, steps) (G. T. Toussaint, "The Euclidean Algorithm
 * Generates Traditional Musical Rhythms", BRIDGES 2005): Bjorklund's onsets turned left by
 * `rotation` steps, so step k plays what step k + rotation played before.
 */
export function euclidPattern(rule: EuclidRule): boolean[] {
  const base = bjorklund(rule.pulses, rule.steps);
  return base.map((_, k) => base[(k + rule.rotation) % rule.steps] ?? false);
}

/** Where each onset of the pattern lands, cycle after cycle of `span` beats. */
export function euclidLandings(rule: EuclidRule, grid: Grid): Landing[] {
  const pattern = euclidPattern(rule);
  const out: Landing[] = [];
  const totalBeats = grid.bars * grid.beatsPerBar;
  for (let start = 0; start < totalBeats; start += rule.span) {
    for (let k = 0; k < rule.steps; k++) {
      if (!pattern[k]) continue;
      const landing = evenPoint(grid, start, k, rule.steps, rule.span);
      if (landing) out.push(landing);
    }
  }
  return out;
}

/** The Euclidean hits for `voice`, repeating every `span` beats through the drill. */
export function placeEuclid(rule: EuclidRule, index: number, grid: Grid): Placement[] {
  const out: Placement[] = [];
  for (const landing of euclidLandings(rule, grid)) {
    if (landing.ok) {
      out.push({
        instant: landing.instant,
        voice: rule.voice,
        source: 'euclid',
        dynamic: 'normal',
        rule: index,
      });
    }
  }
  return out;
}
