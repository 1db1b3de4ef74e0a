import type { VoiceId } from '../../generator/index';

/**
 * General MIDI percussion keys (channel 10) read as the card's voices.
 *
 * Source: MIDI Manufacturers Association, "General MIDI System Level 1" (1991), Percussion Key
 * Map (keys 35–81). Where several keys name one kit piece they read as that voice: both bass
 * drums as the kick, both snares as the snare, both floor toms as the floor tom, low and low-mid
 * toms as the middle tom, hi-mid and high toms as the high tom, the crash, China and splash
 * cymbals as the crash, both rides as the ride. Keys of hand percussion (clap, tambourine,
 * cowbell, congas…) are not drum-set voices and are left out with a warning.
 */
export const GM_PERCUSSION_VOICE: Readonly<Record<number, VoiceId>> = {
  35: 'kick', // Acoustic Bass Drum
  36: 'kick', // Bass Drum 1
  37: 'rim', // Side Stick
  38: 'snare', // Acoustic Snare
  40: 'snare', // Electric Snare
  41: 'tomFloor', // Low Floor Tom
  42: 'hihat', // Closed Hi-Hat
  43: 'tomFloor', // High Floor Tom
  44: 'hihatFoot', // Pedal Hi-Hat
  45: 'tomMid', // Low Tom
  46: 'hihatOpen', // Open Hi-Hat
  47: 'tomMid', // Low-Mid Tom
  48: 'tomHigh', // Hi-Mid Tom
  49: 'crash', // Crash Cymbal 1
  50: 'tomHigh', // High Tom
  51: 'ride', // Ride Cymbal 1
  52: 'crash', // Chinese Cymbal
  53: 'rideBell', // Ride Bell
  55: 'crash', // Splash Cymbal
  57: 'crash', // Crash Cymbal 2
  59: 'ride', // Ride Cymbal 2
};

/** The voice a GM percussion key plays on the kit, or null for keys off the drum set. */
export function voiceOfKey(key: number): VoiceId | null {
  return GM_PERCUSSION_VOICE[key] ?? null;
}

/** The General MIDI percussion channel counted from 0, as MIDI bytes carry it (channel 10). */
export const GM_PERCUSSION_CHANNEL_INDEX = 9;
