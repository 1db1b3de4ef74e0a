import type { Grid } from '../grid';

/**
 * How fast one limb may play. Every figure is a rate in notes a second; every test is integer
 * arithmetic on grid ticks (an interval of `ticks` lasts `ticks × 60 / (tempo × ticksPerBeat)`
 * seconds), so no float ever decides.
 *
 * Hands (one hand, either voice):
 * - single strokes: fewer than 8 a second, i.e. more than 125 ms apart: sixteenths below
 *   120 BPM, eighth-note triplets below 160, eighths below 240. Source: S. Fujii, K. Kudo,
 *   T. Ohtsuki and S. Oda, "Tapping performance and underlying wrist muscle activity of
 *   non-drummers, drummers, and the world's fastest drummer", Neuroscience Letters 459 (2009),
 *   69–73 (abstract): the rate limit usually assumed for voluntary rhythmic movement of one hand
 *   is 5–7 Hz (150–200 ms between taps); the world's fastest drummer reached 10 Hz with a stick.
 *   8 a second sits just above the usual limit, within a trained drummer's reach. It is also the
 *   common-practice point where a one-handed sixteenth-note hi-hat turns two-handed (about
 *   120 BPM, from memory).
 * - doubles (two strokes of one hand closer than single strokes allow: a wrist stroke and its
 *   controlled rebound): only when the card's `sticking.doubles` is true, at most 12 a second
 *   within the pair (sixteenths up to 180 BPM; from memory), and never three such strokes in a
 *   row (that is a triple, not a double).
 *
 * Feet (the kick is the right foot, the hi-hat foot the left; a foot cannot hand a note over):
 * - single strokes: fewer than 6 a second, i.e. more than 1/6 s apart: sixteenths below
 *   90 BPM, eighths below 180 (common practice, from memory: a single pedal stroke from the
 *   ankle is slower than a wrist stroke).
 * - doubles ("1 e" on the kick, two sixteenths with one foot, a staple of rock and funk grooves,
 *   common practice): always allowed, at most 10 a second within the pair (sixteenths up to
 *   150 BPM; from memory), never three in a row.
 */
export interface StrokeLimits {
  /** Single strokes of one limb: strictly fewer than this many a second. */
  readonly singlesPerSecond: number;
  /** The two strokes of a double: at most this many a second. */
  readonly doublesPerSecond: number;
}

export const HAND_LIMITS: StrokeLimits = { singlesPerSecond: 8, doublesPerSecond: 12 };
export const FOOT_LIMITS: StrokeLimits = { singlesPerSecond: 6, doublesPerSecond: 10 };

/**
 * Consecutive notes of the grid at least this many a second apart form a run (4 a second:
 * sixteenths from 60 BPM, eighths from 120): in a run the hands alternate, and no hand plays
 * three notes in a row while the other hand is free (common practice).
 */
export const RUN_NOTES_PER_SECOND = 4;

/**
 * Accents are full strokes: the stick starts high and is caught high again, slower than the taps
 * and ghost notes of the single-stroke limit above. One hand plays at most this many full
 * strokes a second, i.e. two accents of one hand at least a quarter of a second apart (accented
 * eighths up to 120 BPM, accented sixteenths up to 60; common practice). A left hand accenting the
 * snare on the "&" of 1 and on 2 at 76 BPM (0.39 s) is within it; two accents a sixteenth apart
 * at 100 BPM (0.15 s) are not.
 */
export const FULL_STROKES_PER_SECOND = 4;

/** True when two accents of one hand `ticks` apart are closer than full strokes allow. */
export function fullStrokesCrowded(pace: Pace, ticks: number): boolean {
  // t ticks last 60 t / beatTicks seconds: closer than 1 / FULL_STROKES_PER_SECOND.
  return 60 * FULL_STROKES_PER_SECOND * ticks < pace.beatTicks;
}

/**
 * What an interval between two strokes of one limb is: slow enough for single strokes, too fast
 * for singles but not for a double, or too fast even for a double.
 */
export const Gap = { Single: 0, Double: 1, TooFast: 2 } as const;
export type Gap = (typeof Gap)[keyof typeof Gap];

/** A card's tempo on its grid. */
export interface Pace {
  /** tempo × ticksPerBeat: an interval of `t` ticks lasts `60 t / beatTicks` seconds. */
  readonly beatTicks: number;
  readonly ticksPerBeat: number;
  /** Ticks in one loop of the drill. */
  readonly loop: number;
}

export function paceOf(grid: Grid, tempo: number): Pace {
  return {
    beatTicks: tempo * grid.ticksPerBeat,
    ticksPerBeat: grid.ticksPerBeat,
    loop: grid.bars * grid.beatsPerBar * grid.ticksPerBeat,
  };
}

/** A limb's limits as whole-tick thresholds on a card's grid and tempo. */
export interface Thresholds {
  /** Gaps of more than this many ticks are single strokes. */
  readonly single: number;
  /** Gaps of at least this many ticks (and not single) are doubles; shorter ones are too fast. */
  readonly double: number;
}

export function thresholdsOf(pace: Pace, limits: StrokeLimits): Thresholds {
  // t ticks last 60 t / beatTicks seconds. Single: 60 t / beatTicks > 1 / singles, i.e.
  // t > beatTicks / (60 singles); double: t ≥ beatTicks / (60 doubles). t is a whole number.
  return {
    single: Math.floor(pace.beatTicks / (60 * limits.singlesPerSecond)),
    double: Math.ceil(pace.beatTicks / (60 * limits.doublesPerSecond)),
  };
}

/** The kind of gap `ticks` apart. */
export function gapOf(limits: Thresholds, ticks: number): Gap {
  return ticks > limits.single ? Gap.Single : ticks >= limits.double ? Gap.Double : Gap.TooFast;
}

/**
 * The longest gap (ticks) between two grid notes of a run: 60 t / beatTicks ≤ 1 / runNotes,
 * i.e. t ≤ beatTicks / (60 runNotes).
 */
export function runTicks(pace: Pace): number {
  return Math.floor(pace.beatTicks / (60 * RUN_NOTES_PER_SECOND));
}

/**
 * Ticks from the drill's start to each instant, and the loop's length at index `instants`.
 * Shared by every stage of a drill (the grid's last table is kept): never write to it.
 */
export function instantTicks(grid: Grid): Float64Array {
  if (grid === lastGrid) return lastTicks;
  const ticks = new Float64Array(grid.instants + 1);
  const barTicks = grid.beatsPerBar * grid.ticksPerBeat;
  let i = 0;
  for (let bar = 0; bar < grid.bars; bar++) {
    for (let b = 0; b < grid.beatsPerBar; b++) {
      const slots = grid.beats[b] ?? 1;
      const at = bar * barTicks + b * grid.ticksPerBeat;
      for (let s = 0; s < slots; s++) ticks[i++] = at + (s * grid.ticksPerBeat) / slots;
    }
  }
  ticks[grid.instants] = grid.bars * barTicks;
  lastGrid = grid;
  lastTicks = ticks;
  return ticks;
}

let lastGrid: Grid | null = null;
let lastTicks = new Float64Array(0);
