import { describe, expect, it } from 'vitest';
import { VOICE_IDS, isHandVoice } from '../drill';
import { crossedAt, onFarSide, placeOf } from './kit';

const hands = VOICE_IDS.filter(isHandVoice);

describe('the kit', () => {
  // common practice: a right-handed five-piece kit seen from the throne.
  it('sets a right-handed kit hi-hat far left, snare left of centre, toms in the middle, floor tom and ride right', () => {
    const x = (voice: (typeof VOICE_IDS)[number]): number => placeOf(voice, 'right');
    expect(x('hihat')).toBeLessThan(x('snare'));
    expect(x('snare')).toBeLessThan(0);
    expect(x('crash')).toBeLessThan(0);
    expect(Math.abs(x('tomHigh'))).toBeLessThanOrEqual(1);
    expect(Math.abs(x('tomMid'))).toBeLessThanOrEqual(1);
    expect(x('tomFloor')).toBeGreaterThan(x('tomMid'));
    expect(x('ride')).toBeGreaterThanOrEqual(x('tomFloor'));
  });

  it('mirrors every place for a left-handed kit', () => {
    for (const voice of VOICE_IDS) expect(placeOf(voice, 'left')).toBe(-placeOf(voice, 'right'));
  });

  it("names the far sides: the right hand's is the hi-hat, the left hand's the floor tom and ride", () => {
    const far = (hand: 'R' | 'L', player: 'right' | 'left') =>
      hands.filter((voice) => onFarSide(voice, hand, player));
    expect(far('R', 'right')).toEqual(['hihat', 'hihatOpen']);
    expect(far('L', 'right')).toEqual(['ride', 'rideBell', 'tomFloor']);
    // The mirror: on a left-handed kit the left hand's far side is the hi-hat.
    expect(far('L', 'left')).toEqual(['hihat', 'hihatOpen']);
    expect(far('R', 'left')).toEqual(['ride', 'rideBell', 'tomFloor']);
  });

  it('sees the crossed hi-hat grip as crossed hands, and the mirror of it too', () => {
    expect(crossedAt('hihat', 'snare', 'right')).toBe(true);
    expect(crossedAt('ride', 'snare', 'right')).toBe(false);
    expect(crossedAt('snare', 'hihat', 'left')).toBe(true);
  });
});
