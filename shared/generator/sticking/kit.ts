import type { Hand, VoiceId } from '../drill';

/** The player's hand: a left-handed kit is the mirror image of a right-handed one. */
export type PlayerHand = 'right' | 'left';

/**
 * Where each hand voice sits on a right-handed kit, seen from the throne, left (negative) to
 * right (positive), in rough half-arm steps (common practice for the usual five-piece setup):
 * the hi-hat far left; the snare and the crash left of centre (the crash above the high tom,
 * within reach of both hands; a second crash often sits by the ride); the high and mid tom in
 * the centre; the floor tom and the ride on the right. A left-handed kit mirrors every place.
 * Feet have no place: each foot has its own pedal.
 */
const RIGHT_HANDED_PLACE: Readonly<Record<VoiceId, number>> = {
  hihat: -3,
  hihatOpen: -3,
  crash: -2,
  snare: -2,
  rim: -2,
  tomHigh: 0,
  tomMid: 1,
  tomFloor: 3,
  ride: 4,
  rideBell: 4,
  kick: 0,
  hihatFoot: -3,
};

/** How far from the centre a voice must be to lie on one side of the kit. */
const SIDE = 3;

/** The voice's place on the player's kit, left (negative) to right (positive). */
export function placeOf(voice: VoiceId, player: PlayerHand): number {
  const x = RIGHT_HANDED_PLACE[voice];
  return player === 'right' ? x : -x;
}

/** The hand on the other side. */
export const otherHand = (hand: Hand): Hand => (hand === 'R' ? 'L' : 'R');

/** The hand a player calls their leading side. */
export const handOf = (side: PlayerHand): Hand => (side === 'right' ? 'R' : 'L');

/**
 * True when the voice lies on the far side of the kit for this hand: for the right hand the
 * left side (a right-handed kit's hi-hat), for the left hand the right side (a right-handed
 * kit's floor tom and ride). The snare, the crash and the high and mid toms are in both hands'
 * reach.
 */
export function onFarSide(voice: VoiceId, hand: Hand, player: PlayerHand): boolean {
  const x = placeOf(voice, player);
  return hand === 'R' ? x <= -SIDE : x >= SIDE;
}

/**
 * True when two hands striking at one instant are crossed: the right hand's voice lies left of
 * the left hand's (the crossed hi-hat grip of a right-handed player keeping time on the hi-hat
 * is the usual case).
 */
export function crossedAt(rightVoice: VoiceId, leftVoice: VoiceId, player: PlayerHand): boolean {
  return placeOf(rightVoice, player) < placeOf(leftVoice, player);
}
