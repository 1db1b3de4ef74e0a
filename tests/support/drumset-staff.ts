/**
 * Where drum-set notation puts each instrument on the five-line staff, shared by the checks that
 * measure engraved noteheads (in Node and in the browser).
 */
import type { VoiceId } from '../../shared/generator/drill';

/**
 * Staff steps above the middle line for each voice: N. Weinberg, "Guidelines for Drumset
 * Notation", Percussive Notes, June 1994, pp. 15–26 (as encoded in LilyPond's
 * weinberg-drums-style), except the high tom, which Tensile writes in the top space.
 */
export const WEINBERG_STEPS: Readonly<Record<VoiceId, number>> = {
  crash: 6,
  hihat: 5,
  hihatOpen: 5,
  ride: 4,
  rideBell: 4,
  tomHigh: 3,
  tomMid: 2,
  snare: 1,
  rim: 1,
  tomFloor: -1,
  kick: -3,
  hihatFoot: -5,
};

/**
 * One line-or-space step in pixels: half of VexFlow's default stave line distance
 * (`Tables.STAVE_LINE_DISTANCE`, 10 px).
 */
export const STEP_PX = 5;
