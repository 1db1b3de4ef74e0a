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
  return warmLap(grid, tempo, ostinatoVoice, cells, cold, loop);
}

const NO_STROKE = Number.NEGATIVE_INFINITY;

interface HandPass {
  readonly failure: HandFailure | null;
  /** Ticks of each hand's first and last stroke in the drill, and the instant of the last. */
  readonly first: Record<Hand, number>;
  readonly last: Record<Hand, number>;
  readonly lastAt: Record<Hand, number>;
}

/** Each hand's first and last stroke (ticks) and the instant of the last: a pass's state. */
type HandState = Float64Array; // [firstR, firstL, lastR, lastL, lastAtR, lastAtL]
const FIRST = { R: 0, L: 1 } as const;
const LAST = { R: 2, L: 3 } as const;
const LAST_AT = { R: 4, L: 5 } as const;
const STATE_SIZE = 6;

function startState(startR: number, startL: number): HandState {
  return Float64Array.of(NO_STROKE, NO_STROKE, startR, startL, -1, -1);
}

function passOf(failure: HandFailure | null, state: HandState): HandPass {
  return {
    failure,
    first: { R: state[FIRST.R] ?? NO_STROKE, L: state[FIRST.L] ?? NO_STROKE },
    last: { R: state[LAST.R] ?? NO_STROKE, L: state[LAST.L] ?? NO_STROKE },
    lastAt: { R: state[LAST_AT.R] ?? -1, L: state[LAST_AT.L] ?? -1 },
  };
}

function handPass(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
  startR: number,
  startL: number,
): HandPass {
  const state = startState(startR, startL);
  return passOf(handSteps(grid, tempo, ostinatoVoice, cells, 0, state), state);
}

/**
 * Assigns hands from instant `from` on, updating `state` as strokes fall; returns the first
 * failure. With `saved`, the state before each instant is written there (STATE_SIZE per
 * instant), so a later pass can resume from any instant whose past has not changed.
 */
function handSteps(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
  from: number,
  state: HandState,
  saved?: Float64Array,
): HandFailure | null {
  const ostinatoIsHand = ostinatoVoice !== undefined && isHandVoice(ostinatoVoice);
  const strike = (hand: Hand, now: number, instant: number): void => {
    if (state[FIRST[hand]] === NO_STROKE) state[FIRST[hand]] = now;
    state[LAST[hand]] = now;
    state[LAST_AT[hand]] = instant;
  };
  for (let instant = from; instant < cells.length; instant++) {
    saved?.set(state, instant * STATE_SIZE);
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
    if (count > 2) return { instant, reason: 'tooManyHands' };
    const now = ticksOf(grid, instant);
    const lastR = state[LAST.R] ?? NO_STROKE;
    const lastL = state[LAST.L] ?? NO_STROKE;
    const restedR = handRested(grid, tempo, now - lastR);
    const restedL = handRested(grid, tempo, now - lastL);
    if (two) {
      if (!restedR || !restedL) return { instant, reason: 'tooFast' };
      const [right, left] = leadsRight(one, two, ostinatoVoice) ? [one, two] : [two, one];
      right.hand = 'R';
      left.hand = 'L';
      strike('R', now, instant);
      strike('L', now, instant);
      continue;
    }
    const prefersRight =
      one.voice === ostinatoVoice ? true : ostinatoIsHand ? false : lastR <= lastL;
    const hand = pickHand(prefersRight, restedR, restedL);
    if (!hand) return { instant, reason: 'tooFast' };
    one.hand = hand;
    strike(hand, now, instant);
  }
  return null;
}

/**
 * `assignHands` that repairs as it goes: at each failure `drop(instant)` removes a stroke at or
 * before the trouble and returns the instant it emptied (null when it found nothing to drop,
 * which ends the repair with that failure). The first lap resumes from the emptied instant (what
 * came before it is unchanged), so many drops cost about one lap each rather than one drill
 * each; the result, hands included, is what calling `assignHands` after every drop would give.
 */
export function assignHandsRepairing(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
  drop: (instant: number) => number | null,
): HandFailure | null {
  const saved = new Float64Array((cells.length + 1) * STATE_SIZE);
  const state = startState(NO_STROKE, NO_STROKE);
  const loop = grid.bars * grid.beatsPerBar * grid.ticksPerBeat;
  let from = 0;
  for (;;) {
    state.set(saved.subarray(from * STATE_SIZE, (from + 1) * STATE_SIZE));
    if (from === 0) state.set(startState(NO_STROKE, NO_STROKE));
    let failure = handSteps(grid, tempo, ostinatoVoice, cells, from, state, saved);
    if (!failure) {
      const cold = passOf(null, state);
      failure = warmLap(grid, tempo, ostinatoVoice, cells, cold, loop);
      if (!failure) return null;
    }
    const emptied = drop(failure.instant);
    if (emptied === null) return failure;
    from = Math.min(emptied, failure.instant);
  }
}

/** The second lap from the first lap's last strokes, and the loop seam back to the start. */
function warmLap(
  grid: Grid,
  tempo: number,
  ostinatoVoice: VoiceId | undefined,
  cells: readonly (readonly WorkHit[] | undefined)[],
  cold: HandPass,
  loop: number,
): HandFailure | null {
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
