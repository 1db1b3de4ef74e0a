import { describe, expect, it } from 'vitest';
import type { DrillBar, DrillHit } from '../generator/drill';
import { carriedIntoFirstBar } from './seam';

/** Four bars of 4/4 in sixteenths; bar 1 holds `hits`. */
function bars(hits: DrillHit[]): Pick<DrillBar, 'bar' | 'beats' | 'hits'>[] {
  return [1, 2, 3, 4].map((bar) => ({ bar, beats: [4, 4, 4, 4], hits: bar === 1 ? hits : [] }));
}
const snare = (beat: number, slot: number): DrillHit => ({
  beat,
  slot,
  voice: 'snare',
  dynamic: 'normal',
  hand: 'L',
  source: 'backbeat',
});
const late4 = { kind: 'backbeat', voice: 'snare' as const, beats: [4], shift: 6 };

describe('carriedIntoFirstBar', () => {
  // Beat 4 moved six sixteenths late: one beat and two sixteenths, past the bar line onto the
  // "&" of 1 (beat 1, slot 2) of the bar after; after bar 4, that is bar 1 (worked by hand).
  it('finds the last bar’s late 4 on the "&" of 1', () => {
    expect(carriedIntoFirstBar([late4], bars([snare(1, 2)]))).toEqual([
      { beat: 1, slot: 2, voice: 'snare', fromBar: 4, fromBeat: 4 },
    ]);
  });

  it('finds nothing for a shift that stays in its bar, moves early, or skips the last bar', () => {
    expect(carriedIntoFirstBar([{ ...late4, shift: 2 }], bars([snare(1, 2)]))).toEqual([]);
    expect(carriedIntoFirstBar([{ ...late4, beats: [1], shift: -1 }], bars([snare(1, 2)]))).toEqual(
      [],
    );
    expect(carriedIntoFirstBar([{ ...late4, bars: [2] }], bars([snare(1, 2)]))).toEqual([]);
  });

  it('finds nothing where bar 1 does not play the note', () => {
    expect(carriedIntoFirstBar([late4], bars([]))).toEqual([]);
    expect(carriedIntoFirstBar([late4], bars([{ ...snare(1, 2), source: 'fill' }]))).toEqual([]);
  });
});
