import { isHandVoice, type Dynamic, type Hand, type HitSource, type VoiceId } from './drill';
import { ticksOf, type Grid } from './grid';

/**
 * The fastest a single hand is asked to play: 12 notes per second, i.e. at least 1/12 s
 * (about 83 ms) between two strokes of one hand, whatever voices they are on. This sits around
 * a sustained single-stroke speed for a trained player's wrist (common practice, from memory);
 * faster passages must alternate hands. At 180 beats per minute, one hand can still play every
 * sixteenth; at 200 the sixteenths must alternate.
 */
export const MAX_HAND_NOTES_PER_SECOND = 12;

/**
 * Who plays what when two hand voices meet: the ostinato voice takes the leading (right) hand;
 * otherwise the voice earlier in this list does (cymbals on the right, as a right-handed kit is
 * set up).
 */
const RIGHT_HAND_FIRST: readonly VoiceId[] = [
  'hihat',
  'hihatOpen',
  'ride',
  'rideBell',
  'crash',
  'tomFloor',
  'tomMid',
  'tomHigh',
  'snare',
  'rim',
];

/** A hit while the drill is being built: mutable hand, the rule that placed it. */
export interface WorkHit {
  readonly voice: VoiceId;
  readonly source: HitSource;
  dynamic: Dynamic;
  readonly rule: number;
  hand: Hand | null;
}

/** True when `ticks` between two strokes of one hand respect the single-hand rate. */
export function handRested(grid: Grid, tempo: number, ticks: number): boolean {
  return ticks * 60 * MAX_HAND_NOTES_PER_SECOND >= tempo * grid.ticksPerBeat;
}

/** True when the card's fastest slots are quicker than one hand may play them. */
export function isFastGrid(grid: Grid, tempo: number): boolean {
  const finest = Math.max(...grid.beats);
  return !handRested(grid, tempo, grid.ticksPerBeat / finest);
}

export interface HandFailure {
  readonly instant: number;
  readonly reason: 'tooManyHands' | 'tooFast';
}

/**
 * Assigns R/L to every hand voice in time order: the leading hand R on the ostinato, the other
 * hand for what meets it, alternation when one hand would exceed the rate limit. Feet get null.
 * Drills loop, so the sticking is worked out twice: the second pass starts from the hands the
 * first pass ended with, and the seam from the last stroke back to the first must respect the
 * rate too. Returns the first instant that two hands cannot play, or null.
 */
export function assignHands(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
): HandFailure | null {
  const cold = handPass(grid, tempo, ostinatoVoice, cells, NO_STROKE, NO_STROKE);
  if (cold.failure) return cold.failure;
  const loop = grid.bars * grid.beatsPerBar * grid.ticksPerBeat;
  const warm = handPass(grid, tempo, ostinatoVoice, cells, cold.last.R - loop, cold.last.L - loop);
  if (warm.failure) return warm.failure;
  for (const hand of ['R', 'L'] as const) {
    const first = warm.first[hand];
    const last = warm.last[hand];
    if (first === NO_STROKE || handRested(grid, tempo, first + loop - last)) continue;
    return { instant: warm.lastAt[hand], reason: 'tooFast' };
  }
  return null;
}

const NO_STROKE = Number.NEGATIVE_INFINITY;

interface HandPass {
  readonly failure: HandFailure | null;
  /** Ticks of each hand's first and last stroke in the drill, and the instant of the last. */
  readonly first: Record<Hand, number>;
  readonly last: Record<Hand, number>;
  readonly lastAt: Record<Hand, number>;
}

function handPass(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
  startR: number,
  startL: number,
): HandPass {
  const ostinatoIsHand = ostinatoVoice !== undefined && isHandVoice(ostinatoVoice);
  const first: Record<Hand, number> = { R: NO_STROKE, L: NO_STROKE };
  const last: Record<Hand, number> = { R: startR, L: startL };
  const lastAt: Record<Hand, number> = { R: -1, L: -1 };
  const strike = (hand: Hand, now: number, instant: number): void => {
    if (first[hand] === NO_STROKE) first[hand] = now;
    last[hand] = now;
    lastAt[hand] = instant;
  };
  const done = (failure: HandFailure | null): HandPass => ({ failure, first, last, lastAt });
  for (let instant = 0; instant < cells.length; instant++) {
    const cell = cells[instant];
    if (!cell || cell.length === 0) continue;
    let one: WorkHit | undefined;
    let two: WorkHit | undefined;
    let count = 0;
    for (const hit of cell) {
      if (!isHandVoice(hit.voice)) {
        hit.hand = null;
        continue;
      }
      count++;
      if (count === 1) one = hit;
      else if (count === 2) two = hit;
    }
    if (count === 0 || !one) continue;
    if (count > 2) return done({ instant, reason: 'tooManyHands' });
    const now = ticksOf(grid, instant);
    const restedR = handRested(grid, tempo, now - last.R);
    const restedL = handRested(grid, tempo, now - last.L);
    if (two) {
      if (!restedR || !restedL) return done({ instant, reason: 'tooFast' });
      const [right, left] = leadsRight(one, two, ostinatoVoice) ? [one, two] : [two, one];
      right.hand = 'R';
      left.hand = 'L';
      strike('R', now, instant);
      strike('L', now, instant);
      continue;
    }
    const prefersRight =
      one.voice === ostinatoVoice ? true : ostinatoIsHand ? false : last.R <= last.L;
    const hand = pickHand(prefersRight, restedR, restedL);
    if (!hand) return done({ instant, reason: 'tooFast' });
    one.hand = hand;
    strike(hand, now, instant);
  }
  return done(null);
}

function leadsRight(a: WorkHit, b: WorkHit, ostinatoVoice: VoiceId | undefined): boolean {
  if (a.voice === ostinatoVoice) return true;
  if (b.voice === ostinatoVoice) return false;
  const rank = (v: VoiceId): number => {
    const i = RIGHT_HAND_FIRST.indexOf(v);
    return i < 0 ? RIGHT_HAND_FIRST.length : i;
  };
  return rank(a.voice) <= rank(b.voice);
}

function pickHand(prefersRight: boolean, restedR: boolean, restedL: boolean): Hand | null {
  if (prefersRight) return restedR ? 'R' : restedL ? 'L' : null;
  return restedL ? 'L' : restedR ? 'R' : null;
}
