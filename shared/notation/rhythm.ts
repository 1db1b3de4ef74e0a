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

/** The longest rest inside a spelled-out tuplet beat, in slots: an eighth of sixteenths. */
const TUPLET_REST_SLOTS = 2;

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
  // Quintuplets, sextuplets and septuplets are written in their grid value throughout, so the
  // holes of the grid can be seen and counted (E. Gould, "Behind Bars", Faber Music 2011, ch.
  // "Tuplets": a tuplet is written in its own note value, rests included; from memory). Triplets
  // keep the long-short spelling (a quarter and an eighth under a 3) every reader knows.
  const spelledOut = tuplet !== null && grid !== 3;
  const first = slots[0];
  if (spelledOut) {
    // In a quintuplet or septuplet, neighbouring rests combine as they would in the plain
    // grouping of the same values: each the longest binary value that starts on a multiple of
    // itself in the tuplet's own grid (two sixteenth rests from an even slot are one eighth
    // rest), as rests are combined in any beat (Gould, "Behind Bars", ch. "Tuplets" and
    // "Rests"; from memory), but never past an eighth (two slots): a quarter rest under a
    // "5" reads as a whole beat's rest and hides the grid the tuplet is counted in (common
    // practice). A sextuplet's rests stay one a slot: its 3+3 halves would be hidden by an
    // eighth rest across slots 2 and 3.
    const combine = grid % 2 === 1;
    if (grid === 5) {
      pushQuintupletEvents(events, slots, base, beatUnit);
      return { grid, tuplet, events };
    }
    let slot = 0;
    while (slot < grid) {
      if (slots.includes(slot)) {
        events.push({
          kind: 'note',
          gridSlot: slot,
          length: 1,
          duration: writtenDuration(1, base, beatUnit),
        });
        slot++;
        continue;
      }
      let end = slot + 1;
      if (combine) while (end < grid && !slots.includes(end)) end++;
      pushRests(events, slot, end, base, beatUnit, TUPLET_REST_SLOTS);
      slot = end;
    }
    return { grid, tuplet, events };
  }
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

/**
 * A quintuplet is read in two groups, 2+3, or 3+2 where a note on its fourth value (and none on
 * its third) starts the second group (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets":
 * an irregular tuplet is beamed and spelled in its inner groups as the rhythm shows them; from
 * memory). Neighbouring rests combine into an eighth inside one group, never across the two,
 * as a group of three sixteenths writes a sixteenth and an eighth rest (common practice); so a
 * kick on "ta" and "mi" reads sixteenth, eighth rest | sixteenth, sixteenth rest. Never longer
 * than an eighth (see `TUPLET_REST_SLOTS`).
 */
function pushQuintupletEvents(
  events: RhythmEvent[],
  slots: readonly number[],
  base: number,
  beatUnit: number,
): void {
  const split = slots.includes(3) && !slots.includes(2) ? 3 : 2;
  for (const [from, to] of [
    [0, split],
    [split, 5],
  ] as const) {
    let slot = from;
    while (slot < to) {
      let length = 1;
      if (!slots.includes(slot))
        while (length < TUPLET_REST_SLOTS && slot + length < to && !slots.includes(slot + length))
          length++;
      const kind = slots.includes(slot) ? 'note' : 'rest';
      events.push({
        kind,
        gridSlot: slot,
        length,
        duration: writtenDuration(length, base, beatUnit),
      });
      slot += length;
    }
  }
}

/** One group of beats of a grouped eighth meter, spelled as one unit (see `spellGroup`). */
export interface GroupRhythm {
  /** Slots per beat of the grid actually written (a divisor of the drill's slots per beat). */
  readonly grid: number;
  /** Notes and rests in time order over the whole group; their lengths sum to beats × grid. */
  readonly events: readonly RhythmEvent[];
}

/**
 * Spell one group of a grouped eighth meter (6/8's dotted quarter, 7/8's twos and three) as one
 * unit, so the group reads as one beat of the meter (common practice; E. Gould, "Behind Bars",
 * Faber Music 2011, chapters on beaming and rests in compound time, from memory):
 * - notes last until the next onset where one value shows that: from the group's start any value
 *   that fits (a dotted quarter for a lone hit on a dotted-quarter beat, quarter + eighth for
 *   hits on 1 and 3 of 6/8); from a later beat either inside that beat or whole beats to the
 *   group's end (eighth + quarter); off the beat, never past its beat;
 * - rests fill whole beats where they can: the whole group (one dotted-quarter rest), or its
 *   first two beats (a quarter rest), never its last two of three (two eighth rests, so the
 *   dotted-quarter beat stays visible); in a group of four, halves as in simple time; inside a
 *   beat, binary rests that start on a multiple of their own length, as in `spellBeat`.
 * `beats` is the group's size (1–4), `slots` its slots per beat (1, 2, 4 or 8, the same for every
 * beat), `onsets` the struck slots counted over the whole group (beat × slots + slot), `beatUnit`
 * the meter's unit (8 or 16). With `countedByBeat` (an uneven meter such as 7/8 as 2+2+3, counted
 * "1 2, 1 2, 1 2 3" eighth by eighth), a note that does not last whole beats never crosses a
 * beat: the eighth after a dotted eighth starts with a rest, so each counted eighth can be seen
 * (common practice: in an irregular meter every counted pulse starts with a note or a rest, and
 * drum notes, which do not sustain, are split with rests rather than ties).
 */
export function spellGroup(
  beats: number,
  slots: number,
  onsets: readonly number[],
  beatUnit: number,
  countedByBeat = false,
): GroupRhythm {
  const sorted = [...new Set(onsets)].sort((a, b) => a - b);
  let reduction = slots;
  while (reduction > 1 && sorted.some((slot) => slot % reduction !== 0)) reduction /= 2;
  const grid = slots / reduction;
  const total = beats * grid;
  const at = sorted.map((slot) => slot / reduction);
  const events: RhythmEvent[] = [];
  pushGroupRests(events, 0, at[0] ?? total, grid, beats, beatUnit);
  at.forEach((start, i) => {
    const next = at[i + 1] ?? total;
    const length = groupNoteLength(start, next - start, grid, beats, countedByBeat);
    events.push({
      kind: 'note',
      gridSlot: start,
      length,
      duration: writtenDuration(length, grid, beatUnit),
    });
    pushGroupRests(events, start + length, next, grid, beats, beatUnit);
  });
  return { grid, events };
}

/** Whole beats a rest may cover from beat `k` of a group of `beats`, longest first. */
function restSpans(k: number, beats: number): readonly number[] {
  if (beats === 4) return k === 0 ? [4, 2, 1] : k === 2 ? [2, 1] : [1];
  return k === 0 ? [beats, 2, 1].filter((m) => m <= beats) : [1];
}

/** Whole beats a note may last from beat `k` of a group of `beats`. */
function noteSpanFits(k: number, span: number, beats: number): boolean {
  if (k + span > beats) return false;
  if (beats === 4) return span === 1 || (span === 2 && k % 2 === 0) || k === 0;
  return true;
}

function groupNoteLength(
  start: number,
  gap: number,
  grid: number,
  beats: number,
  countedByBeat: boolean,
): number {
  for (let length = Math.min(gap, beats * grid); length > 1; length--) {
    if (isValue(length) && noteFits(start, length, grid, beats, countedByBeat)) return length;
  }
  return 1;
}

/** Whether a note of `length` slots from group slot `start` keeps the group's beats readable. */
function noteFits(
  start: number,
  length: number,
  grid: number,
  beats: number,
  countedByBeat: boolean,
): boolean {
  const offset = start % grid;
  // Off the beat: never past its beat.
  if (offset !== 0) return length <= grid - offset;
  // On a beat, inside it.
  if (length <= grid) return true;
  // From the group's start any value that fits (a dotted eighth in 6/8 sixteenths included),
  // but only whole beats where the meter is counted beat by beat.
  if (start === 0)
    return length % grid !== 0 ? !countedByBeat : noteSpanFits(0, length / grid, beats);
  // From a later beat, whole beats only.
  return length % grid === 0 && noteSpanFits(start / grid, length / grid, beats);
}

/** A length one written value shows: 2^k or (dotted) 3·2^k slots. */
function isValue(length: number): boolean {
  const odd = length % 3 === 0 ? length / 3 : length;
  return (odd & (odd - 1)) === 0;
}

function pushGroupRests(
  events: RhythmEvent[],
  from: number,
  to: number,
  grid: number,
  beats: number,
  beatUnit: number,
): void {
  let at = from;
  while (at < to) {
    let length: number;
    if (at % grid === 0 && to - at >= grid) {
      const whole = Math.floor((to - at) / grid);
      const span = restSpans(at / grid, beats).find((m) => m <= whole) ?? 1;
      length = span * grid;
    } else {
      length = grid;
      while (length > 1 && (at % length !== 0 || at + length > to)) length /= 2;
    }
    events.push({
      kind: 'rest',
      gridSlot: at,
      length,
      duration: writtenDuration(length, grid, beatUnit),
    });
    at += length;
  }
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

/**
 * Rests from `from` to `to`, each the longest binary chunk (at most `longest` slots) that starts
 * on a multiple of itself.
 */
function pushRests(
  events: RhythmEvent[],
  from: number,
  to: number,
  base: number,
  beatUnit: number,
  longest = base,
): void {
  let at = from;
  while (at < to) {
    let chunk = Math.min(base, longest);
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
