/**
 * Where each drum-set voice sits on a five-line percussion staff, with which notehead and stem.
 *
 * The placements follow N. Weinberg, "Guidelines for Drumset Notation", Percussive Notes,
 * June 1994, pp. 15–26 (the convention the Percussive Arts Society later published as its guide to
 * standardized drumset notation), as encoded in LilyPond's `weinberg-drums-style` table
 * (ly/drumpitch-init.ly), which cites that article.
 *
 * One deliberate choice: the high tom sits in the top space (E5), not on the top line (F5) as in
 * the 1994 table. The top line belongs to the ride; a high tom on the same line would put two
 * heads on one line whenever ride and tom sound together, and the tom would be told apart from the
 * ride by its notehead shape alone. The top-space tom is also what many later drum-set keys print
 * (from memory: the later PAS guide lists tom 1 in the top space).
 *
 * The mid tom keeps its 1994 place, the 4th line (D5, +2 steps). The LilyPond table names six toms
 * and puts `hightom` and `himidtom` both on the top line (+4), `lowmidtom` on the 4th line (+2),
 * `lowtom` and `highfloortom` in the 2nd space (−1) and `lowfloortom` on the 2nd line (−2). A
 * three-tom kit (high, mid, floor) has one tom between the high tom and the floor tom, and the
 * first place below the top line that the table gives a tom is the 4th line, so the mid tom sits
 * there; putting it on the top line with `himidtom` would merge it with the 1994 high tom (and the
 * ride). The floor tom keeps the 2nd space (`highfloortom`). With the high tom moved to the top
 * space, the three toms step down the staff as their pitch does: E5, D5, A4.
 */
import type { VoiceId } from '../generator/drill';

/** Notehead shapes drummers read: round for drums, x for cymbals, diamond for the ride bell. */
export type NoteheadShape = 'normal' | 'x' | 'diamond';

/** Which limb plays a voice decides its layer: hands are written stems up, feet stems down. */
export type Layer = 'hands' | 'feet';

export interface StaffPlacement {
  readonly voice: VoiceId;
  /** Name shown in the voice key, in a drummer's words. */
  readonly label: string;
  /**
   * Staff steps from the middle line, one step per line or space, positive upwards
   * (+4 = top line, −4 = bottom line, +6 = first ledger line above).
   */
  readonly position: number;
  /** The treble-clef letter and octave of that place (how MusicXML `display-step` names it). */
  readonly displayStep: 'C' | 'D' | 'E' | 'F' | 'G' | 'A' | 'B';
  readonly displayOctave: number;
  readonly notehead: NoteheadShape;
  readonly stem: 'up' | 'down';
  readonly layer: Layer;
  /** A mark written above the note: a small circle for the open hi-hat. */
  readonly mark: 'open' | null;
}

const STEP_NAMES = ['C', 'D', 'E', 'F', 'G', 'A', 'B'] as const;
/** Diatonic index of B4, the middle line of a treble staff (C0 = 0). */
const MIDDLE_LINE_INDEX = 4 * 7 + 6;

/** The placement table: one row per voice, in the engine's voice order. */
export const STAFF_PLACEMENTS: Readonly<Record<VoiceId, StaffPlacement>> = {
  kick: row('kick', 'Kick', -3, 'normal', 'feet'),
  snare: row('snare', 'Snare', 1, 'normal', 'hands'),
  rim: row('rim', 'Side stick', 1, 'x', 'hands'),
  hihat: row('hihat', 'Hi-hat', 5, 'x', 'hands'),
  hihatOpen: row('hihatOpen', 'Open hi-hat', 5, 'x', 'hands', 'open'),
  hihatFoot: row('hihatFoot', 'Hi-hat foot', -5, 'x', 'feet'),
  ride: row('ride', 'Ride', 4, 'x', 'hands'),
  rideBell: row('rideBell', 'Ride bell', 4, 'diamond', 'hands'),
  crash: row('crash', 'Crash', 6, 'x', 'hands'),
  tomHigh: row('tomHigh', 'High tom', 3, 'normal', 'hands'),
  // 4th line, the 1994 `lowmidtom` place (see the note above on the toms).
  tomMid: row('tomMid', 'Mid tom', 2, 'normal', 'hands'),
  tomFloor: row('tomFloor', 'Floor tom', -1, 'normal', 'hands'),
};

/** The placement of one voice. */
export function placementOf(voice: VoiceId): StaffPlacement {
  return STAFF_PLACEMENTS[voice];
}

/** The treble-clef letter and octave `position` steps from the middle line. */
export function displayPitchOf(position: number): {
  step: StaffPlacement['displayStep'];
  octave: number;
} {
  const index = MIDDLE_LINE_INDEX + position;
  const step = STEP_NAMES[((index % 7) + 7) % 7] ?? 'C';
  return { step, octave: Math.floor(index / 7) };
}

/**
 * The VexFlow key for a voice, e.g. `g/5/x2` for the hi-hat. The key's letter and octave are
 * read as if in treble clef, which is how VexFlow's percussion clef places notes.
 */
export function vexKeyOf(voice: VoiceId): string {
  const p = STAFF_PLACEMENTS[voice];
  const pitch = `${p.displayStep.toLowerCase()}/${p.displayOctave}`;
  if (p.notehead === 'x') return `${pitch}/x2`;
  if (p.notehead === 'diamond') return `${pitch}/d2`;
  return pitch;
}

function row(
  voice: VoiceId,
  label: string,
  position: number,
  notehead: NoteheadShape,
  layer: Layer,
  mark: 'open' | null = null,
): StaffPlacement {
  const { step, octave } = displayPitchOf(position);
  return {
    voice,
    label,
    position,
    displayStep: step,
    displayOctave: octave,
    notehead,
    stem: layer === 'hands' ? 'up' : 'down',
    layer,
    mark,
  };
}
