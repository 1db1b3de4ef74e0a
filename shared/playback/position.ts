/**
 * Where playback is: beats ↔ seconds under a tempo that may change while playing, and the
 * bar/beat a cursor should show.
 */
import type { LoopShape } from './schedule';
import { ceilToGrid, compareRational, subtractRational, type Rational } from './rational';

/**
 * One stretch of constant tempo: beat position `originBeat` (beats from playback start) sounds
 * at `originTime` (seconds on whatever clock the caller uses, e.g. the audio context's).
 */
export interface TempoSegment {
  readonly originTime: number;
  readonly originBeat: Rational;
  readonly tempo: number;
}

/**
 * Tempo changes take effect on this grid of beat fractions (1/1680 of a beat: every slot of
 * 1 to 8 subdivisions lies on it), so positions stay exact fractions after a change.
 */
export const TEMPO_CHANGE_GRID = 1680;

/** Seconds at which beat position `at` sounds in a segment (one division from integers). */
export function timeOfBeat(segment: TempoSegment, at: Rational): number {
  const delta = subtractRational(at, segment.originBeat);
  return segment.originTime + (delta.num * 60) / (delta.den * segment.tempo);
}

/** Beat position (beats from playback start, fractional) at time `time` in a segment. */
export function beatAtTime(segment: TempoSegment, time: number): number {
  const origin = segment.originBeat.num / segment.originBeat.den;
  return origin + ((time - segment.originTime) * segment.tempo) / 60;
}

/**
 * A new tempo that keeps the bar position: from the first grid point at or after `changeTime`
 * the music continues from the same beat, only faster or slower. Everything before that point
 * keeps its old time.
 */
export function changeTempo(
  segment: TempoSegment,
  changeTime: number,
  tempo: number,
): TempoSegment {
  const originBeat = ceilToGrid(beatAtTime(segment, changeTime), TEMPO_CHANGE_GRID);
  return { originTime: timeOfBeat(segment, originBeat), originBeat, tempo };
}

/** The segment in force at beat position `at` (segments sorted by origin beat). */
export function segmentForBeat(
  segments: readonly TempoSegment[],
  at: Rational,
): TempoSegment | undefined {
  let found: TempoSegment | undefined;
  for (const segment of segments) {
    if (compareRational(segment.originBeat, at) <= 0) found = segment;
    else break;
  }
  return found;
}

/** The segment in force at time `time` (segments sorted by origin time). */
export function segmentForTime(
  segments: readonly TempoSegment[],
  time: number,
): TempoSegment | undefined {
  let found: TempoSegment | undefined = segments[0];
  for (const segment of segments) {
    if (segment.originTime <= time) found = segment;
    else break;
  }
  return found;
}

/** What the cursor shows: a count-in beat, or a bar and beat of the drill. */
export type CursorPosition =
  | { readonly phase: 'countIn'; readonly beat: number }
  | { readonly phase: 'drill'; readonly loop: number; readonly bar: number; readonly beat: number };

/**
 * The cursor for `beats` beats after playback start: `null` before the start. Beats count from
 * 1 as a drummer counts; `bar` is the bar number as written in the drill. Swing moves notes only
 * inside their beat (see `swing.ts`), so the same mapping serves straight and swung playback:
 * a swung note's `at` still falls in its written bar and beat.
 */
export function cursorAt(shape: LoopShape, beats: number): CursorPosition | null {
  if (!(beats >= 0) || shape.lengthBeats === 0) return null;
  // A hair of tolerance so float error at a beat boundary never shows the previous beat.
  const position = beats + 1e-9;
  if (position < shape.countInBeats) {
    return { phase: 'countIn', beat: Math.floor(position) + 1 };
  }
  const sinceStart = position - shape.countInBeats;
  const loop = Math.floor(sinceStart / shape.lengthBeats);
  const inLoop = sinceStart - loop * shape.lengthBeats;
  let index = 0;
  while (index + 1 < shape.bars.length && (shape.barOffsets[index + 1] ?? Infinity) <= inLoop) {
    index += 1;
  }
  const bar = shape.bars[index];
  if (bar === undefined) return null;
  const beat = Math.min(bar.beats.length, Math.floor(inLoop - (shape.barOffsets[index] ?? 0)) + 1);
  return { phase: 'drill', loop, bar: bar.bar, beat };
}
