/**
 * Rhythm spelling for one beat of one voice layer: which notes and rests, of which written value,
 * under which tuplet bracket, show the layer's onsets in that beat.
 *
 * The aim is the simplest readable spelling (common practice of drum-set writing): a beat whose
 * onsets all fall on a coarser grid is written on that grid (sixteenths on 1 and & become two
 * eighths; sextuplets on 1 and & become eighths; a lone downbeat becomes one note of the beat's
 * value), a note lasts until the next onset when a single note value can show that (dotted values
 * allowed), and rests are split so that each starts on a multiple of its own length, which keeps
 * the inner pulse of the beat visible.
 */

/** A written note value: `value` 1 = whole, 2 = half, 4 = quarter … 128; `dots` 0 or 1. */
export interface WrittenDuration {
  readonly value: number;
  readonly dots: 0 | 1;
}

/** `numNotes` in the time of `notesOccupied` (5 in the time of 4 = quintuplet sixteenths). */
export interface TupletRatio {
  readonly numNotes: number;
  readonly notesOccupied: number;
}

export interface RhythmEvent {
  readonly kind: 'note' | 'rest';
  /** Start, in slots of the beat's written grid (see `BeatRhythm.grid`). */
  readonly gridSlot: number;
  /** Length in slots of the written grid. */
  readonly length: number;
  readonly duration: WrittenDuration;
}

export interface BeatRhythm {
  /** Slots per beat of the grid actually written (a divisor of the drill's subdivision). */
  readonly grid: number;
  /** The bracket over the beat, or null for plain (binary) values. */
  readonly tuplet: TupletRatio | null;
  /** Notes and rests in time order; their lengths sum to `grid`. */
  readonly events: readonly RhythmEvent[];
}

/**
 * Spell one beat. `subdivision` is the drill's slots per beat (1–8), `onsets` the 0-based slots
 * where this layer strikes, `beatUnit` the meter's beat value (4 = quarter-note beats).
 */
export function spellBeat(
  subdivision: number,
  onsets: readonly number[],
  beatUnit: number,
): BeatRhythm {
  const sorted = [...new Set(onsets)].sort((a, b) => a - b);
  const reduction = coarsestGridFactor(subdivision, sorted);
  const grid = subdivision / reduction;
  const slots = sorted.map((slot) => slot / reduction);
  const base = binaryFloor(grid);
  const tuplet = grid === base ? null : { numNotes: grid, notesOccupied: base };
  const events: RhythmEvent[] = [];
  const first = slots[0];
  pushRests(events, 0, first ?? grid, base, beatUnit);
  slots.forEach((slot, i) => {
    const next = slots[i + 1] ?? grid;
    const length = longestNoteLength(next - slot, base);
    events.push({
      kind: 'note',
      gridSlot: slot,
      length,
      duration: writtenDuration(length, base, beatUnit),
    });
    pushRests(events, slot + length, next, base, beatUnit);
  });
  return { grid, tuplet, events };
}

/** The real length of a written value under a tuplet, as a fraction of a whole note. */
export function soundingLength(
  duration: WrittenDuration,
  tuplet: TupletRatio | null,
): { num: number; den: number } {
  let num = duration.dots ? 3 : 1;
  let den = duration.value * (duration.dots ? 2 : 1);
  if (tuplet) {
    num *= tuplet.notesOccupied;
    den *= tuplet.numNotes;
  }
  const g = gcd(num, den);
  return { num: num / g, den: den / g };
}

/** Largest factor of the subdivision that every onset is a multiple of (no onsets: all of it). */
function coarsestGridFactor(subdivision: number, onsets: readonly number[]): number {
  for (let factor = subdivision; factor > 1; factor--) {
    if (subdivision % factor === 0 && onsets.every((slot) => slot % factor === 0)) return factor;
  }
  return 1;
}

function binaryFloor(n: number): number {
  let p = 1;
  while (p * 2 <= n) p *= 2;
  return p;
}

/** A length that one note value can show: 2^k or (dotted) 3·2^k slots, never past the beat. */
function isSingleValue(length: number, base: number): boolean {
  if (length > base) return false;
  const odd = length % 3 === 0 ? length / 3 : length;
  return (odd & (odd - 1)) === 0;
}

function longestNoteLength(gap: number, base: number): number {
  for (let length = Math.min(gap, base); length > 1; length--) {
    if (isSingleValue(length, base)) return length;
  }
  return 1;
}

/** Rests from `from` to `to`, each the longest binary chunk that starts on a multiple of itself. */
function pushRests(
  events: RhythmEvent[],
  from: number,
  to: number,
  base: number,
  beatUnit: number,
): void {
  let at = from;
  while (at < to) {
    let chunk = base;
    while (chunk > 1 && (at % chunk !== 0 || at + chunk > to)) chunk /= 2;
    events.push({
      kind: 'rest',
      gridSlot: at,
      length: chunk,
      duration: writtenDuration(chunk, base, beatUnit),
    });
    at += chunk;
  }
}

/** Written value of `length` slots when `base` slots make one beat of value `beatUnit`. */
function writtenDuration(length: number, base: number, beatUnit: number): WrittenDuration {
  const dotted = length % 3 === 0;
  const plain = dotted ? (length / 3) * 2 : length;
  return { value: (beatUnit * base) / plain, dots: dotted ? 1 : 0 };
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}
