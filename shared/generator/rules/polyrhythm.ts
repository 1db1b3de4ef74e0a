import { evenPoint, type Grid, type Landing } from '../grid';
import type { PolyrhythmRule } from '../schema';
import type { Placement } from './placement';

/** Every point of the stream through the drill, cycle after cycle (cut at the drill's end). */
export function polyrhythmLandings(
  rule: PolyrhythmRule,
  grid: Grid,
): { landing: Landing; hit: number }[] {
  const out: { landing: Landing; hit: number }[] = [];
  const totalBeats = grid.bars * grid.beatsPerBar;
  for (let start = 0; start < totalBeats; start += rule.span) {
    for (let i = 0; i < rule.against; i++) {
      const landing = evenPoint(grid, start, i, rule.against, rule.span);
      if (landing) out.push({ landing, hit: i });
    }
  }
  return out;
}

/**
 * `against` evenly spaced hits over every `span` beats; when the span does not divide the bar
 * the cycle runs across bar lines (a polymeter). Hit i of each cycle uses voices[i % n].
 */
export function placePolyrhythm(rule: PolyrhythmRule, index: number, grid: Grid): Placement[] {
  const out: Placement[] = [];
  for (const { landing, hit } of polyrhythmLandings(rule, grid)) {
    if (!landing.ok) continue; // parseRuleCard refuses cards where this happens
    const voice = rule.voices[hit % rule.voices.length] ?? rule.voices[0];
    if (!voice) continue;
    out.push({
      instant: landing.instant,
      voice,
      source: 'polyrhythm',
      dynamic: 'normal',
      rule: index,
    });
  }
  return out;
}
