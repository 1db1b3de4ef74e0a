import type { VoiceId } from '../generator/drill';

/**
 * General MIDI percussion key numbers for every Tensile voice (channel 10).
 *
 * Source: MIDI Manufacturers Association, "General MIDI System Level 1" (1991), percussion key
 * map. Where the kit has several candidates we pick the one a drummer means by the voice name:
 * the high tom is "High Tom" (50), the middle tom "Low-Mid Tom" (47) and the floor tom
 * "High Floor Tom" (43).
 */
export const GM_DRUM_NOTE: Readonly<Record<VoiceId, number>> = {
  kick: 36,
  snare: 38,
  rim: 37,
  hihat: 42,
  hihatOpen: 46,
  hihatFoot: 44,
  ride: 51,
  rideBell: 53,
  crash: 49,
  tomHigh: 50,
  tomMid: 47,
  tomFloor: 43,
};

/** General MIDI channel for percussion, counted from 1 as the specification does. */
export const GM_PERCUSSION_CHANNEL = 10;

/** The key number of a voice on the General MIDI percussion channel. */
export function gmDrumNote(voice: VoiceId): number {
  return GM_DRUM_NOTE[voice];
}
