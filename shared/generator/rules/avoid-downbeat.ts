import { wrapInstant, type Grid } from '../grid';
import type { AvoidDownbeatRule } from '../schema';
import type { Placement } from './placement';

/**
 * Bars 1, 1+N, 1+2N, … resolve onto the downbeat (landing `end`: bars N, 2N, …, so the cycle
 * ends on its landing); `resolveEvery: 0` never does.
 */
export function isResolutionBar(rule: AvoidDownbeatRule, bar: number): boolean {
  if (rule.resolveEvery <= 0) return false;
  return rule.landing === 'end'
    ? bar % rule.resolveEvery === 0
    : (bar - 1) % rule.resolveEvery === 0;
}

export interface DownbeatPlan {
  /** Downbeats the voice must hit (resolution bars) and anticipations. */
  readonly placements: Placement[];
  /** Instants (downbeats of avoided bars) where the voice must stay silent. */
  readonly avoided: number[];
}

/**
 * Keeps `voice` off beat 1 except in resolution bars, where it must land there; with
 * `anticipate`, the last slot before each avoided downbeat (wrapping before bar 1) is played.
 */
export function planAvoidDownbeat(
  rule: AvoidDownbeatRule,
  index: number,
  grid: Grid,
): DownbeatPlan {
  const placements: Placement[] = [];
  const avoided: number[] = [];
  for (let bar = 1; bar <= grid.bars; bar++) {
    const downbeat = (bar - 1) * grid.slotsPerBar;
    if (isResolutionBar(rule, bar)) {
      placements.push({
        instant: downbeat,
        voice: rule.voice,
        source: 'avoidDownbeat',
        dynamic: 'normal',
        rule: index,
      });
      continue;
    }
    avoided.push(downbeat);
    if (rule.anticipate) {
      const before = wrapInstant(grid, downbeat - 1);
      placements.push({
        instant: before,
        voice: rule.voice,
        source: 'avoidDownbeat',
        dynamic: 'accent',
        rule: index,
      });
    }
  }
  return { placements, avoided };
}
