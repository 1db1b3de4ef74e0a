/**
 * The sticking stage: who plays each note (see `sticking/` and docs/engine.md, Sticking).
 * - sticking/limits.ts   how fast a hand and a foot may play (singles, doubles), with sources
 * - sticking/kit.ts      where each voice sits on a right- or left-handed kit; far sides
 * - sticking/streams.ts  the time on the leading hand; figures kept on one hand
 * - sticking/assign.ts   the search that sticks a drill, and its repair
 * - rules/check-hands.ts the rules a finished drill's sticking must keep
 */
export {
  assignHands,
  assignHandsRepairing,
  type HandFailure,
  type WorkHit,
} from './sticking/assign';
import { HAND_LIMITS } from './sticking/limits';
export { FOOT_LIMITS, HAND_LIMITS, type StrokeLimits } from './sticking/limits';

/**
 * True when `ticks` between two strokes of one hand leave it time to play both at `perSecond`
 * notes a second (single strokes by default).
 */
export function handRested(
  grid: { readonly ticksPerBeat: number },
  tempo: number,
  ticks: number,
  perSecond: number = HAND_LIMITS.singlesPerSecond,
): boolean {
  return ticks * 60 * perSecond >= tempo * grid.ticksPerBeat;
}
