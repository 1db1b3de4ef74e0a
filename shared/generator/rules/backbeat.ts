import { shiftedInstant, type Grid } from '../grid';
import type { BackbeatRule } from '../schema';
import type { Placement } from './placement';

/**
 * The backbeat's hits: `voice` on each listed beat of each (listed) bar, moved by `shift` slots.
 * A shift may cross into the neighbouring beat, bar, or around the drill's ends (drills loop).
 */
export function placeBackbeat(rule: BackbeatRule, index: number, grid: Grid): Placement[] {
  const out: Placement[] = [];
  for (let bar = 1; bar <= grid.bars; bar++) {
    if (rule.bars && !rule.bars.includes(bar)) continue;
    for (const beat of rule.beats) {
      const globalBeat = (bar - 1) * grid.beatsPerBar + (beat - 1);
      out.push({
        instant: shiftedInstant(grid, globalBeat, rule.shift),
        voice: rule.voice,
        source: 'backbeat',
        dynamic: rule.dynamic,
        rule: index,
      });
    }
  }
  return out;
}
