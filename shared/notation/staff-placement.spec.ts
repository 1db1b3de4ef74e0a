import { describe, expect, it } from 'vitest';
import { VOICE_IDS, isHandVoice } from '../generator/drill';
import { STAFF_PLACEMENTS, displayPitchOf, vexKeyOf } from './staff-placement';

/**
 * The drum-set staff of N. Weinberg, "Guidelines for Drumset Notation", Percussive Notes,
 * June 1994, pp. 15–26, as transcribed in LilyPond's `weinberg-drums-style` table
 * (ly/drumpitch-init.ly, which cites the article). Position = staff steps from the middle line.
 */
const WEINBERG_1994: Record<string, { position: number; notehead: string; place: string }> = {
  crash: { position: 6, notehead: 'x', place: 'first ledger line above the staff' },
  hihat: { position: 5, notehead: 'x', place: 'space above the staff' },
  hihatOpen: { position: 5, notehead: 'x', place: 'space above the staff, with an open mark' },
  ride: { position: 4, notehead: 'x', place: 'top line' },
  rideBell: { position: 4, notehead: 'diamond', place: 'top line' },
  // The table's `lowmidtom`: the first tom place below the top line (`hightom`/`himidtom`).
  tomMid: { position: 2, notehead: 'normal', place: '4th line (D5)' },
  snare: { position: 1, notehead: 'normal', place: '3rd space' },
  rim: { position: 1, notehead: 'x', place: '3rd space (side stick, x head)' },
  // The table's `highfloortom` (and `lowtom`).
  tomFloor: { position: -1, notehead: 'normal', place: '2nd space' },
  kick: { position: -3, notehead: 'normal', place: 'bottom space' },
  hihatFoot: { position: -5, notehead: 'x', place: 'space below the staff' },
};

describe('staff placement (Weinberg 1994 drum-set convention)', () => {
  for (const [voice, expected] of Object.entries(WEINBERG_1994)) {
    it(`${voice}: ${expected.notehead} notehead on the ${expected.place}`, () => {
      const row = STAFF_PLACEMENTS[voice as keyof typeof STAFF_PLACEMENTS];
      expect(row.position).toBe(expected.position);
      expect(row.notehead).toBe(expected.notehead);
    });
  }

  it('toms step down the staff as their pitch does: high E5, mid D5 (4th line), floor A4', () => {
    const order = (['tomHigh', 'tomMid', 'tomFloor'] as const).map((v) => STAFF_PLACEMENTS[v]);
    expect(order.map((p) => `${p.displayStep}${p.displayOctave}`)).toEqual(['E5', 'D5', 'A4']);
    // The mid tom never shares a line or space with the ride, the snare or the high tom.
    for (const other of ['ride', 'snare', 'tomHigh'] as const) {
      expect(STAFF_PLACEMENTS.tomMid.position).not.toBe(STAFF_PLACEMENTS[other].position);
    }
  });

  it('high tom: top space (E5), a documented departure from the 1994 top line', () => {
    // Weinberg 1994 puts the high tom on the top line (+4). We move it one step down so that it
    // never shares the ride's line; later drum-set keys print it there too (from memory).
    expect(STAFF_PLACEMENTS.tomHigh.position).toBe(3);
    expect(STAFF_PLACEMENTS.tomHigh.notehead).toBe('normal');
  });

  it('display letters match treble-clef reading of the places (MusicXML display-step)', () => {
    // Under a percussion clef MusicXML reads display-step/octave as if treble clef
    // (MusicXML 4.0 reference, <unpitched>); these are the letters of the places above.
    const letters: Record<string, string> = {
      crash: 'A5',
      hihat: 'G5',
      ride: 'F5',
      rideBell: 'F5',
      tomHigh: 'E5',
      tomMid: 'D5',
      snare: 'C5',
      rim: 'C5',
      tomFloor: 'A4',
      kick: 'F4',
      hihatFoot: 'D4',
    };
    for (const [voice, name] of Object.entries(letters)) {
      const row = STAFF_PLACEMENTS[voice as keyof typeof STAFF_PLACEMENTS];
      expect(`${row.displayStep}${row.displayOctave}`).toBe(name);
    }
  });

  it('open hi-hat carries the open mark, the closed one none (common practice: "o" = open)', () => {
    expect(STAFF_PLACEMENTS.hihatOpen.mark).toBe('open');
    expect(STAFF_PLACEMENTS.hihat.mark).toBeNull();
  });

  it('hands are written stems up, feet stems down (two-voice kit writing, from memory)', () => {
    for (const voice of VOICE_IDS) {
      expect(STAFF_PLACEMENTS[voice].stem).toBe(isHandVoice(voice) ? 'up' : 'down');
      expect(STAFF_PLACEMENTS[voice].layer).toBe(isHandVoice(voice) ? 'hands' : 'feet');
    }
  });

  it('every voice of the engine has exactly one row', () => {
    expect(Object.keys(STAFF_PLACEMENTS).sort()).toEqual([...VOICE_IDS].sort());
  });

  it('VexFlow keys: x heads as x2, the bell as a diamond, drums as plain keys', () => {
    expect(vexKeyOf('hihat')).toBe('g/5/x2');
    expect(vexKeyOf('crash')).toBe('a/5/x2');
    expect(vexKeyOf('rideBell')).toBe('f/5/d2');
    expect(vexKeyOf('snare')).toBe('c/5');
    expect(vexKeyOf('kick')).toBe('f/4');
    expect(vexKeyOf('hihatFoot')).toBe('d/4/x2');
  });

  it('steps count lines and spaces: the middle line is B4, the outer lines E4 and F5', () => {
    expect(displayPitchOf(0)).toEqual({ step: 'B', octave: 4 });
    expect(displayPitchOf(-4)).toEqual({ step: 'E', octave: 4 });
    expect(displayPitchOf(4)).toEqual({ step: 'F', octave: 5 });
  });
});
