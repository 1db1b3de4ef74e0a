import { describe, expect, it } from 'vitest';
import { VOICE_IDS } from '../generator/drill';
import { GM_DRUM_NOTE, GM_PERCUSSION_CHANNEL, gmDrumNote } from './gm-drum-map';

// MIDI Manufacturers Association, "General MIDI System Level 1" (1991), percussion key map
// (channel 10): the key numbers of the instruments Tensile plays.
const GM1_PERCUSSION_KEYS = {
  'Bass Drum 1': 36,
  'Side Stick': 37,
  'Acoustic Snare': 38,
  'High Floor Tom': 43,
  'Closed Hi-Hat': 42,
  'Pedal Hi-Hat': 44,
  'Open Hi-Hat': 46,
  'Low-Mid Tom': 47,
  'Crash Cymbal 1': 49,
  'High Tom': 50,
  'Ride Cymbal 1': 51,
  'Ride Bell': 53,
} as const;

describe('General MIDI drum map', () => {
  it('maps each voice to its General MIDI Level 1 percussion key', () => {
    expect(gmDrumNote('kick')).toBe(GM1_PERCUSSION_KEYS['Bass Drum 1']);
    expect(gmDrumNote('snare')).toBe(GM1_PERCUSSION_KEYS['Acoustic Snare']);
    expect(gmDrumNote('rim')).toBe(GM1_PERCUSSION_KEYS['Side Stick']);
    expect(gmDrumNote('hihat')).toBe(GM1_PERCUSSION_KEYS['Closed Hi-Hat']);
    expect(gmDrumNote('hihatFoot')).toBe(GM1_PERCUSSION_KEYS['Pedal Hi-Hat']);
    expect(gmDrumNote('hihatOpen')).toBe(GM1_PERCUSSION_KEYS['Open Hi-Hat']);
    expect(gmDrumNote('ride')).toBe(GM1_PERCUSSION_KEYS['Ride Cymbal 1']);
    expect(gmDrumNote('rideBell')).toBe(GM1_PERCUSSION_KEYS['Ride Bell']);
    expect(gmDrumNote('crash')).toBe(GM1_PERCUSSION_KEYS['Crash Cymbal 1']);
    expect(gmDrumNote('tomHigh')).toBe(GM1_PERCUSSION_KEYS['High Tom']);
    expect(gmDrumNote('tomMid')).toBe(GM1_PERCUSSION_KEYS['Low-Mid Tom']);
    expect(gmDrumNote('tomFloor')).toBe(GM1_PERCUSSION_KEYS['High Floor Tom']);
  });

  it('covers every voice with a distinct key inside the GM1 percussion range 35–81', () => {
    const keys = VOICE_IDS.map((voice) => GM_DRUM_NOTE[voice]);
    expect(new Set(keys).size).toBe(VOICE_IDS.length);
    for (const key of keys) {
      expect(key).toBeGreaterThanOrEqual(35);
      expect(key).toBeLessThanOrEqual(81);
    }
    expect(GM_PERCUSSION_CHANNEL).toBe(10);
  });
});
