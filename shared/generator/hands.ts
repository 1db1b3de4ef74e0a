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
export { FOOT_LIMITS, HAND_LIMITS, type StrokeLimits } from './sticking/limits';
