import {
  isHandVoice,
  VOICE_IDS,
  type Dynamic,
  type Hand,
  type HitSource,
  type VoiceId,
} from '../drill';
import type { Grid } from '../grid';
import { faultsOf } from '../rules/check-hands';
import { handOf, onFarSide, placeOf } from './kit';
import {
  frameOf,
  HAND_VOICE,
  oneHandCanPlay,
  VOICE_INDEX,
  ruleStreams,
  streamWords,
  tabulate,
  timeStream,
  voicesAt,
  type Frame,
  type NoteTable,
  type StickingCard,
  type Stream,
} from './streams';

/** A hit while the drill is being built: mutable hand, the rule that placed it. */
export interface WorkHit {
  readonly voice: VoiceId;
  readonly source: HitSource;
  dynamic: Dynamic;
  readonly rule: number;
  hand: Hand | null;
  /** A note of a kept bar: its hand and dynamic stay as given, and it is never removed. */
  readonly pinned?: boolean;
  /** The hand this note must take (a constraint only, like a kept bar's hand). */
  steer?: Hand;
}

/** Why the limbs cannot play the notes, and where the trouble shows. */
export interface HandFailure {
  readonly instant: number;
  /**
   * `tooManyHands`: three hand voices at once; `tooFast`: a hand's rate; `sticking`: the other
   * sticking rules (time on the leading hand, figures on one hand, crossing, runs); `feet`: a
   * foot's rate (`voice` names the foot).
   */
  readonly reason: 'tooManyHands' | 'tooFast' | 'sticking' | 'feet';
  readonly voice?: VoiceId;
  /** For `sticking`: the lines that could not each keep to one hand, when that is the trouble. */
  readonly streams?: readonly string[];
  /** For `sticking`: true when the arms would cross both ways there. */
  readonly arms?: boolean;
}

type Cells = readonly (readonly WorkHit[] | undefined)[];

/**
 * Assigns R or L to every hand note (feet get null) as a teacher would write the sticking (see
 * docs/engine.md, Sticking): the rules of `stickingFaults` hold, and among the stickings that
 * keep them the one chosen alternates runs, puts the leading side on the strong positions,
 * keeps each hand on its own side of the kit and avoids crossed hands. Returns the first trouble
 * when no sticking can play the notes, or null.
 */
export function assignHands(card: StickingCard, grid: Grid, cells: Cells): HandFailure | null {
  const ctx = contextOf(card, grid);
  const table = tabulate(cells, grid.instants);
  const feet = footFailure(ctx, table, null);
  if (feet) return feet;
  const plans = planSticking(ctx, table);
  if (!Array.isArray(plans)) return plans;
  let first: HandFailure | null = null;
  for (const plan of plans) {
    const failure = solve(ctx, plan, cells, false, false);
    if (!failure) return null;
    first ??= failure;
  }
  return first;
}

/**
 * `assignHands` that removes fill strokes until the limbs can play the rest: at each trouble it
 * removes one fill stroke of the limb in trouble, near the trouble and, where it can, at an
 * instant where another note than the time keeps sounding (so the bar's rhythm, and its
 * tension, stay as they were); failing that the latest one at or before the trouble, wrapping
 * round to the drill's end (drills loop). The search resumes from the instant emptied, so many
 * removals cost about one lap each. The result, hands included, is what `assignHands` gives on
 * the cells as they end (with the same plan for the time and the figures, chosen on the notes
 * that are not fill). Returns the trouble that remains when no fill stroke is left to remove,
 * or null.
 */
export function assignHandsRepairing(
  card: StickingCard,
  grid: Grid,
  cells: WorkHit[][],
): HandFailure | null {
  const ctx = contextOf(card, grid);
  let table = tabulate(cells, grid.instants);
  const dropped = { feet: 0 };
  const feet = footFailure(ctx, table, cells, dropped);
  if (feet) return feet;
  if (dropped.feet > 0) table = tabulate(cells, grid.instants);
  const plans = planSticking(ctx, table);
  if (!Array.isArray(plans)) return plans;
  let plan = plans[0];
  if (plans.length > 1)
    plan = plans.find((p) => solve(ctx, p, cells, false, true) === null) ?? plan;
  if (!plan) return null;
  return solve(ctx, plan, cells, true, false);
}

// ---------------------------------------------------------------------------------------------

interface Ctx {
  readonly card: StickingCard;
  readonly frame: Frame;
  readonly n: number;
  readonly loop: number;
  /** 1 (R) or 2 (L): the hand that keeps time, or with `alternate` the strong-position side. */
  readonly lead: number;
  readonly alternate: boolean;
  readonly doubles: boolean;
  /** A hand stroke further back than this (ticks) no longer limits the next one. */
  readonly memory: number;
  /** The shortest double of a hand (ticks). */
  readonly doubleTicks: number;
  readonly width: number;
  /** A beat in ticks (a dotted-quarter group in a compound meter): a foot's busiest span. */
  readonly pulse: number;
  /** Three-in-a-row runs can be avoided only on loops of three instants or more. */
  readonly runs: boolean;
  /** Per VOICE_IDS index: bit 1 far side for the right hand, bit 2 for the left; its place. */
  readonly far: Uint8Array;
  readonly place: Int8Array;
  /** Per VOICE_IDS index: bit 1 past the middle for the right hand (the mid tom and on), bit 2
   * for the left (the snare and on): out of one quick note's reach from that hand's far side. */
  readonly past: Uint8Array;
}

function contextOf(card: StickingCard, grid: Grid): Ctx {
  const frame = frameOf(grid, card.tempo);
  const lead = card.sticking.lead;
  const far = new Uint8Array(VOICE_IDS.length);
  const place = new Int8Array(VOICE_IDS.length);
  const past = new Uint8Array(VOICE_IDS.length);
  VOICE_IDS.forEach((voice, v) => {
    const x = isHandVoice(voice) ? placeOf(voice, card.hand) : 0;
    past[v] = isHandVoice(voice) ? (x >= 1 ? 1 : 0) | (x <= -1 ? 2 : 0) : 0;
    far[v] =
      (onFarSide(voice, 'R', card.hand) ? 1 : 0) | (onFarSide(voice, 'L', card.hand) ? 2 : 0);
    place[v] = placeOf(voice, card.hand);
  });
  return {
    card,
    frame,
    n: grid.instants,
    loop: frame.pace.loop,
    lead: handOf(lead === 'alternate' ? card.hand : lead) === 'R' ? 1 : 2,
    alternate: lead === 'alternate',
    doubles: card.sticking.doubles,
    memory: frame.hand.single,
    doubleTicks: frame.hand.double,
    width: frame.hand.single + 2,
    pulse:
      frame.pace.ticksPerBeat *
      (card.meter?.grouping?.length && card.meter.grouping.every((g) => g === 3) ? 3 : 1),
    runs: grid.instants >= 3,
    far,
    place,
    past,
  };
}

// ---------------------------------------------------------------------------------------------
// Removing fill strokes.

/**
 * Removes one fill stroke of a limb (`foot` a VOICE_IDS index, or -1 for the hands) near
 * `trouble`: within `span` ticks before it, the latest at an instant where another note than
 * the time keeps sounding (the bar's rhythm, and so its tension, stay as they were); else the
 * latest at or before it, wrapping round. Returns the instant it emptied, or null.
 */
function dropNear(
  ctx: Ctx,
  cells: WorkHit[][],
  trouble: number,
  foot: number,
  span: number,
): number | null {
  const { n, loop } = ctx;
  const ticks = ctx.frame.ticks;
  let fallback = -1;
  let fallbackAt = -1;
  for (let back = 0; back < n; back++) {
    const i = (trouble - back + n) % n;
    let distance = (ticks[trouble] ?? 0) - (ticks[i] ?? 0);
    if (distance < 0) distance += loop;
    const near = distance <= span;
    if (!near && fallback >= 0) break;
    const cell = cells[i] ?? [];
    for (let k = cell.length - 1; k >= 0; k--) {
      const hit = cell[k] as WorkHit;
      if (hit.source !== 'fill' || hit.pinned) continue;
      const v = VOICE_INDEX[hit.voice];
      if (foot < 0 ? !HAND_VOICE[v] : v !== foot) continue;
      if (near && sounds(cell, hit)) {
        cell.splice(k, 1);
        return i;
      }
      if (fallback < 0) {
        fallback = i;
        fallbackAt = k;
      }
    }
  }
  if (fallback < 0) return null;
  cells[fallback]?.splice(fallbackAt, 1);
  return fallback;
}

/** True when another note than `hit` and the time sounds in the cell. */
function sounds(cell: readonly WorkHit[], hit: WorkHit): boolean {
  for (const other of cell) if (other !== hit && other.source !== 'ostinato') return true;
  return false;
}

// ---------------------------------------------------------------------------------------------
// Feet: each foot plays its own voice, so only its rate can fail.

function footFailure(
  ctx: Ctx,
  table: NoteTable<WorkHit>,
  cells: WorkHit[][] | null,
  dropped?: { feet: number },
): HandFailure | null {
  const { start, voice, notes } = table;
  const { n } = ctx;
  const handVoice = HAND_VOICE;
  // One pass: each foot's instants (feet get no hand).
  const feet = new Map<number, number[]>();
  // Per foot instant: a fill stroke the repair may remove (not a kept bar's).
  const looseAt = new Map<number, boolean[]>();
  for (let i = 0; i < n; i++) {
    for (let k = start[i] ?? 0; k < (start[i + 1] ?? 0); k++) {
      const v = voice[k] ?? 0;
      if (handVoice[v]) continue;
      const hit = notes[k] as WorkHit;
      hit.hand = null;
      const loose = hit.source === 'fill' && !hit.pinned;
      const list = feet.get(v);
      if (list) {
        list.push(i);
        looseAt.get(v)?.push(loose);
      } else {
        feet.set(v, [i]);
        looseAt.set(v, [loose]);
      }
    }
  }
  const span = Math.max(2 * ctx.frame.foot.single, ctx.pulse);
  for (const name of ctx.card.voices) {
    const v = VOICE_INDEX[name];
    const instants = feet.get(v);
    const loose = looseAt.get(v) ?? [];
    if (!instants) continue;
    for (;;) {
      const trouble = footTrouble(ctx, instants, loose);
      if (trouble < 0) break;
      const failure: HandFailure = { instant: trouble, reason: 'feet', voice: name };
      if (!cells) return failure;
      const emptied = dropNear(ctx, cells, trouble, v, span);
      if (emptied === null) return failure;
      if (dropped) dropped.feet++;
      const at = instants.indexOf(emptied);
      instants.splice(at, 1);
      loose.splice(at, 1);
    }
  }
  return null;
}

/**
 * The instant where a foot first breaks its rates (round the loop last), or -1; then the third
 * of three notes within less than a beat, or in a row of a run, on the foot when a fill stroke is
 * among them (common practice: one foot does not play three grid notes running, nor 1-e-a,
 * unless the card asks for them).
 */
function footTrouble(ctx: Ctx, instants: readonly number[], loose: readonly boolean[]): number {
  const count = instants.length;
  if (count === 0) return -1;
  const { ticks, foot } = ctx.frame;
  const { single, double } = foot;
  // Per stroke, the gap before it: 0 single, 1 double, 2 too fast.
  const kinds: number[] = [];
  let before = (ticks[instants[count - 1] ?? 0] ?? 0) - ctx.loop;
  for (let k = 0; k < count; k++) {
    const now = ticks[instants[k] ?? 0] ?? 0;
    const gap = now - before;
    kinds.push(gap > single ? 0 : gap >= double ? 1 : 2);
    before = now;
  }
  for (let k = 1; k <= count; k++) {
    const at = k % count;
    const kind = kinds[at];
    const bad = kind === 2 || (kind === 1 && count > 1 && kinds[(at - 1 + count) % count] !== 0);
    if (bad) return instants[at === 0 ? count - 1 : at] ?? 0;
  }
  if (count < 3 || ctx.n < 3) return -1;
  // Three strokes within less than a beat, a fill stroke among them (1-e-a on the kick).
  const tickOf = (k: number): number => ticks[instants[k % count] ?? 0] ?? 0;
  for (let k = 0; k < count; k++) {
    const k2 = k + 2;
    const width = tickOf(k2) - tickOf(k) + (k2 >= count ? ctx.loop : 0);
    if (width < ctx.pulse && (loose[k] || loose[(k + 1) % count] || loose[k2 % count]))
      return instants[k2 % count] ?? 0;
  }
  const { n } = ctx;
  const runStep = (k: number): boolean => {
    const a = instants[(k - 1 + count) % count] ?? 0;
    const b = instants[k] ?? 0;
    if ((b - a + n) % n !== 1) return false;
    const gap = (ticks[b] ?? 0) - (ticks[a] ?? 0);
    return (gap > 0 ? gap : gap + ctx.loop) <= ctx.frame.run;
  };
  for (let k = 0; k < count; k++) {
    const k1 = (k + 1) % count;
    const k2 = (k + 2) % count;
    if (!runStep(k1) || !runStep(k2)) continue;
    if (loose[k] || loose[k1] || loose[k2]) return instants[k2] ?? 0;
  }
  return -1;
}

// ---------------------------------------------------------------------------------------------
// The plan: which notes must take which hand.

interface Plan {
  /** Per instant, a bit per VOICE_IDS index of the notes that must take the right (left) hand. */
  readonly right: Uint16Array;
  readonly left: Uint16Array;
  /** 1 or 2 when a hand keeps the time (R or L), else 0. */
  readonly timeHand: number;
}

/** Every way to give the time and the figures one hand each, best first; or why none works. */
function planSticking(ctx: Ctx, table: NoteTable): Plan[] | HandFailure {
  const { card, frame, n } = ctx;
  const time = timeStream(card, frame, table);
  const figures = ruleStreams(card, frame, table, time);
  const none = new Uint16Array(n);
  const timeMask = time ? voicesAt(n, time) : none;
  const timeHand = time ? ctx.lead : 0;
  if (figures.length === 0)
    return [
      ctx.lead === 1
        ? { right: timeMask, left: none, timeHand }
        : { right: none, left: timeMask, timeHand },
    ];
  // Preferred: the first figure on the hand the time leaves free, the next on the other, …
  const first = time ? 3 - ctx.lead : ctx.lead;
  const preferred = figures.map((_, i) => (i % 2 === 0 ? first : 3 - first));
  const free = Math.min(figures.length, 8);
  const masks = Array.from({ length: 1 << free }, (_, m) => m).sort(
    (a, b) => popcount(a) - popcount(b) || a - b,
  );
  const plans: Plan[] = [];
  for (const mask of masks) {
    const hands = preferred.map((hand, i) => (i < free && (mask >> i) & 1 ? 3 - hand : hand));
    const lines = (hand: number): Stream[] => [
      ...(time && hand === ctx.lead ? [time] : []),
      ...figures.filter((_, i) => hands[i] === hand),
    ];
    const right = lines(1);
    const left = lines(2);
    if (fits(frame, right) && fits(frame, left))
      plans.push({ right: voicesAt(n, ...right), left: voicesAt(n, ...left), timeHand });
  }
  if (plans.length > 0) return plans;
  return {
    instant: figures[0]?.instants[0] ?? 0,
    reason: 'sticking',
    streams: [...(time ? [time] : []), ...figures].map(streamWords),
  };
}

const popcount = (m: number): number => (m === 0 ? 0 : (m & 1) + popcount(m >> 1));

/** True when one hand can play these lines together: one note at a time, single strokes. */
function fits(frame: Frame, lines: readonly Stream[]): boolean {
  const instants = new Set<number>();
  let count = 0;
  for (const line of lines) {
    for (const instant of line.instants) instants.add(instant);
    count += line.instants.length;
  }
  if (instants.size !== count) return false;
  return oneHandCanPlay(
    frame,
    [...instants].sort((a, b) => a - b),
  );
}

// ---------------------------------------------------------------------------------------------
// The search: a shortest path over the hand notes in time order. Its state holds what the
// rules look back at (each hand's last stroke while it still limits the next, doubles, pending
// crossings, who struck last, the run so far); costs rank the stickings that keep the rules.

/** Soft costs (common practice): what a teacher avoids when there is a choice. */
const COST = {
  /** A stroke off its natural hand: the leading side on even positions of the beat. */
  natural: 1,
  /** The same hand twice in a row of a run (runs alternate). */
  repeat: 3,
  /** With `alternate` sticking, the same hand twice in a row within a beat: above all else. */
  alternate: 12,
  /** The same hand twice in a row of a phrase fill: fills are alternating singles, even when
   * that takes a hand to the far side (the other hand has just struck, so nothing crosses). */
  fillRepeat: 30,
  /** A stroke on the hand's far side of the kit. */
  far: 8,
  /** Crossed hands at one instant. */
  crossed: 4,
  /** One hand on three notes of a run in a row, even with the other hand striking beside the
   * middle one (L L L snare under a right-hand hi-hat): runs alternate. */
  three: 20,
  /** A far-side stroke while the near hand is free, other than hand to hand inside a run the
   * near hand carries on on that side (the L of R L R on the floor tom): a fill ends on the
   * floor tom with the right hand, by starting its alternation on the other hand where it can.
   * Below `fillRepeat`: a fill that can only end on the left hand still alternates. */
  crossFree: 20,
  /** A note right beside a time note on the time hand, unless both hands struck the note
   * before: the time hand stays on its cymbal and the other hand plays the note (above
   * `repeat`: L L beats R leaving the hi-hat for a ghost). */
  beside: 6,
  /** A time note the leading hand may leave (right before a phrase's fill) played by the other
   * hand: only when the fill needs it. */
  leaveTime: 10,
  /** A backbeat off the hand the time leaves free (the left hand's snare under a right-hand
   * hi-hat), wherever the backbeat is moved to. */
  backbeat: 20,
} as const;

const REST = -1e15;
const DBL_R = 1;
const DBL_L = 2;
const PEND_R = 4;
const PEND_L = 8;
const ORDER = 48;
const ORDER_R = 16; // the right hand struck last
const ORDER_L = 32;
const ORDER_SAME = 48; // both struck last at one instant
const PREV = 192;
const PREV_R = 64; // the right hand alone struck the previous note
const PREV_L = 128;
const PREV_BOTH = 192;
const RUN2 = 256; // the previous two notes were a run on the PREV hand alone
const EXA = 512; // the previous note of the run was a time or figure note
const EXB = 1024; // and the one before it
const FAR_R = 2048; // at the previous note the right hand played its far side
const FAR_L = 4096;
const OWN_R = 8192; // at the previous note the right hand played its own side (floor tom, ride)
const OWN_L = 16384;
const TWO_R = 1 << 15; // the right hand struck the previous two notes of a run (alone or not)
const TWO_L = 1 << 16;
const NX_R = 1 << 17; // the right hand's stroke at the previous note was not a time or figure note
const NX_L = 1 << 18;
const MX_R = 1 << 19; // of the right hand's previous two strokes, one was not a time or figure note
const MX_L = 1 << 20;
const CROSS_R = 1 << 21; // the right hand crossed at the previous note right after a left-hand
const CROSS_L = 1 << 22; // stroke; the left must strike on that side now
const LS_R = 1 << 23; // the right hand's stroke at the previous note was a loose fill stroke
const LS_L = 1 << 24;
const LX_R = 1 << 25; // of the right hand's previous two strokes, one was a loose fill stroke
const LX_L = 1 << 26;
const PAST_R = 1 << 27; // at the previous note the right hand played past the middle (see `past`)
const PAST_L = 1 << 28;
const FLAGS = 1 << 29;

/**
 * The search's states, layer after layer, in flat typed arrays on one buffer (grown by
 * doubling; plain arrays grown one state at a time made most of the search's garbage): layer L
 * is begin[L]..begin[L+1]-1.
 */
interface Lattice {
  lastR: Float64Array;
  lastL: Float64Array;
  flags: Int32Array;
  cost: Float64Array;
  parent: Int32Array;
  choice: Uint8Array;
  key: Float64Array;
  readonly begin: number[];
  size: number;
}

/** A lattice with room for `capacity` states before it grows. */
function lattice(capacity: number): Lattice {
  const lat: Lattice = {
    lastR: EMPTY_F64,
    lastL: EMPTY_F64,
    flags: EMPTY_I32,
    cost: EMPTY_F64,
    parent: EMPTY_I32,
    choice: EMPTY_U8,
    key: EMPTY_F64,
    begin: [0],
    size: 0,
  };
  reserve(lat, Math.max(16, capacity));
  return lat;
}

const EMPTY_F64 = new Float64Array(0);
const EMPTY_I32 = new Int32Array(0);
const EMPTY_U8 = new Uint8Array(0);

/** Gives the lattice room for `capacity` states, its `size` states kept. */
function reserve(lat: Lattice, capacity: number): void {
  // Four arrays of 8 bytes, two of 4 and one of 1 a state, in one buffer.
  const buffer = new ArrayBuffer(capacity * 41);
  const views = {
    lastR: new Float64Array(buffer, 0, capacity),
    lastL: new Float64Array(buffer, capacity * 8, capacity),
    cost: new Float64Array(buffer, capacity * 16, capacity),
    key: new Float64Array(buffer, capacity * 24, capacity),
    flags: new Int32Array(buffer, capacity * 32, capacity),
    parent: new Int32Array(buffer, capacity * 36, capacity),
    choice: new Uint8Array(buffer, capacity * 40, capacity),
  };
  const n = lat.size;
  views.lastR.set(lat.lastR.subarray(0, n));
  views.lastL.set(lat.lastL.subarray(0, n));
  views.cost.set(lat.cost.subarray(0, n));
  views.key.set(lat.key.subarray(0, n));
  views.flags.set(lat.flags.subarray(0, n));
  views.parent.set(lat.parent.subarray(0, n));
  views.choice.set(lat.choice.subarray(0, n));
  Object.assign(lat, views);
}

/** Adds a state to the layer that starts at `base`, or lowers the cost of its equal. */
function put(
  lat: Lattice,
  base: number,
  key: number,
  lastR: number,
  lastL: number,
  flags: number,
  cost: number,
  parent: number,
  choice: number,
): void {
  const keys = lat.key;
  for (let j = base; j < lat.size; j++) {
    if (keys[j] !== key) continue;
    if (cost < (lat.cost[j] ?? 0)) {
      lat.cost[j] = cost;
      lat.parent[j] = parent;
      lat.choice[j] = choice;
    }
    return;
  }
  if (lat.size === keys.length) reserve(lat, 2 * keys.length);
  const j = lat.size++;
  lat.key[j] = key;
  lat.lastR[j] = lastR;
  lat.lastL[j] = lastL;
  lat.flags[j] = flags;
  lat.cost[j] = cost;
  lat.parent[j] = parent;
  lat.choice[j] = choice;
}

/** Ends layer `layer` (its states are begin[layer]..size-1). */
function close(lat: Lattice, layer: number): void {
  lat.begin[layer + 1] = lat.size;
}

interface Event {
  readonly instant: number;
  readonly tick: number;
  /** The hand notes: one, two, or (crowded) the first two of more; their VOICE_IDS indexes. */
  readonly a: WorkHit;
  readonly b: WorkHit | null;
  readonly va: number;
  readonly vb: number;
  readonly crowded: boolean;
  /** Per note: 0 free, 1 must be R, 2 must be L. */
  readonly forced0: number;
  readonly forced1: number;
  /** Per note: 0 free, 1 or 2 the hand a kept bar gives it (a constraint only, no exemption). */
  readonly pin0: number;
  readonly pin1: number;
  /** 1 or 2: the natural hand of the position (the leading side on even positions). */
  natural: number;
  /** The natural hand as a step of a run, and as a lone note (set again at the seam). */
  readonly runNatural: number;
  readonly loneNatural: number;
  /** With the previous event (round the loop for the first): a run step; within a beat. */
  runStep: boolean;
  nearStep: boolean;
  /** A note of a phrase fill, or the note right after one, inside its window (a hand may
   * repeat into or out of the fill). */
  fill: boolean;
  /** Per note: a phrase's landing on a hand (the crash on the one after the fill). */
  readonly landing0: boolean;
  readonly landing1: boolean;
  /** Per note: a backbeat rule's note (it goes to the hand the time leaves free). */
  readonly beat0: boolean;
  readonly beat1: boolean;
  /** Per note: a fill stroke the repair may remove (not a kept bar's). */
  readonly loose0: boolean;
  readonly loose1: boolean;
  /** 1 or 2: the hand the time leaves free, or 0. */
  readonly free: number;
  /** The time hand plays its line at the instant before or after this one. */
  readonly beside: boolean;
}

/**
 * The event at `instant` (null when no hand plays there), after `prev` (the event before it;
 * null for the first, whose run and beat steps are worked out round the loop later).
 */
function eventAt(
  ctx: Ctx,
  plan: Plan,
  cells: Cells,
  instant: number,
  prev: Event | null,
  skipFill: boolean,
): Event | null {
  const cell = cells[instant];
  if (!cell || cell.length === 0) return null;
  let a: WorkHit | null = null;
  let b: WorkHit | null = null;
  let count = 0;
  const handVoice = HAND_VOICE;
  const index = VOICE_INDEX;
  for (let k = 0; k < cell.length; k++) {
    const hit = cell[k] as WorkHit;
    if (!handVoice[index[hit.voice]] || (skipFill && hit.source === 'fill')) continue;
    if (count === 0) a = hit;
    else if (count === 1) b = hit;
    count++;
  }
  if (!a) return null;
  const { frame } = ctx;
  const tick = frame.ticks[instant] ?? 0;
  const va = index[a.voice];
  const vb = b ? index[b.voice] : -1;
  const slot = frame.grid.slotOf[instant % frame.grid.slotsPerBar] ?? 0;
  const step = prev ? tick - prev.tick : 0;
  const runStep = !!prev && instant - prev.instant === 1 && step <= frame.run;
  const runNatural = slot % 2 === 0 ? ctx.lead : 3 - ctx.lead;
  const loneNatural = plan.timeHand ? 3 - plan.timeHand : runNatural;
  // A backbeat inside a phrase's fill is one stroke of the fill's run: the time rests there,
  // both hands are free and the run's alternation decides its hand.
  const inFillRun = besideFillStroke(cells, instant, ctx.n);
  return {
    instant,
    tick,
    a,
    b,
    va,
    vb,
    crowded: count > 2,
    forced0: forcedHand(plan, instant, va),
    forced1: b ? forcedHand(plan, instant, vb) : 0,
    pin0: pinOf(a),
    pin1: b ? pinOf(b) : 0,
    // A lone note beside the time goes to the hand the time leaves free (the snare hand of a
    // groove); in runs the leading side takes the strong positions.
    natural: runStep ? runNatural : loneNatural,
    runNatural,
    loneNatural,
    runStep,
    nearStep: !!prev && step <= frame.pace.ticksPerBeat,
    // Groove fills stay out of a phrase's fill window: beside one, the run enters or leaves it.
    fill: !!prev && fillStep(a, prev.a),
    landing0: landingStroke(a),
    landing1: !!b && landingStroke(b),
    beat0: a.source === 'backbeat' && !inFillRun,
    beat1: b?.source === 'backbeat' && !inFillRun,
    loose0: a.source === 'fill' && !a.pinned,
    loose1: !!b && b.source === 'fill' && !b.pinned,
    free: plan.timeHand ? 3 - plan.timeHand : 0,
    beside: besideTime(ctx, plan, instant),
  };
}

/** True when the time hand plays its line (time or figure) at the instant before or after. */
function besideTime(ctx: Ctx, plan: Plan, instant: number): boolean {
  if (!plan.timeHand) return false;
  const line = plan.timeHand === 1 ? plan.right : plan.left;
  const { n } = ctx;
  return (line[(instant + n - 1) % n] ?? 0) !== 0 || (line[(instant + 1) % n] ?? 0) !== 0;
}

/** A phrase's fill stroke (its landing, kick and crash on the next one, is accented). */
const fillStroke = (hit: WorkHit): boolean => hit.source === 'phrase' && hit.dynamic !== 'accent';

/** A phrase's landing note on a hand (the crash). */
const landingStroke = (hit: WorkHit): boolean =>
  hit.source === 'phrase' && hit.dynamic === 'accent' && !!HAND_VOICE[VOICE_INDEX[hit.voice]];

/** A step into, through or out of a phrase's fill (groove fills stay out of its window). */
const fillStep = (a: WorkHit, prev: WorkHit): boolean =>
  (fillStroke(a) || fillStroke(prev)) && a.source !== 'fill' && prev.source !== 'fill';

/** True when a phrase's fill stroke sounds at the instant before or after (round the loop). */
function besideFillStroke(cells: Cells, instant: number, n: number): boolean {
  return hasFillStroke(cells[(instant + n - 1) % n]) || hasFillStroke(cells[(instant + 1) % n]);
}

function hasFillStroke(cell: readonly WorkHit[] | undefined): boolean {
  if (cell) for (let k = 0; k < cell.length; k++) if (fillStroke(cell[k] as WorkHit)) return true;
  return false;
}

const pinOf = (hit: WorkHit): number => {
  const hand = hit.pinned ? hit.hand : hit.steer;
  return !hand ? 0 : hand === 'R' ? 1 : 2;
};

/** Sets the first event's steps as the second lap meets it: one on from the drill's last. */
function wrap(ctx: Ctx, first: Event, last: Event): void {
  const step = first.tick + ctx.loop - last.tick;
  const adjacent = (first.instant - last.instant + ctx.n) % ctx.n === 1;
  first.runStep = adjacent && step <= ctx.frame.run;
  first.nearStep = step <= ctx.frame.pace.ticksPerBeat;
  // The first note met round the seam is what it is inside the loop: a run step takes the
  // run's natural hand, and a fill's landing is the step out of the fill.
  first.natural = first.runStep ? first.runNatural : first.loneNatural;
  first.fill = fillStep(first.a, last.a);
}

/** 1 or 2 when the plan gives the voice (VOICE_IDS index) at the instant to R or L, else 0. */
function forcedHand(plan: Plan, instant: number, v: number): number {
  if (((plan.right[instant] ?? 0) >> v) & 1) return 1;
  return ((plan.left[instant] ?? 0) >> v) & 1 ? 2 : 0;
}

/** What turned options down at the last event searched. */
interface Why {
  fast: boolean;
  other: boolean;
  /** Among the others: the arms would cross both ways. */
  arms: boolean;
}

/**
 * Adds layer `layer + 1`, the states after event `ev` (at `offset` ticks), from layer `layer`;
 * returns its size (0 when no state survives).
 */
function advance(
  ctx: Ctx,
  lat: Lattice,
  layer: number,
  ev: Event,
  offset: number,
  why: Why,
): number {
  why.fast = false;
  why.other = false;
  why.arms = false;
  const from = lat.begin[layer] ?? 0;
  const to = lat.begin[layer + 1] ?? 0;
  const base = lat.size;
  const T = ev.tick + offset;
  const { memory, width, doubles, doubleTicks, lead, far, place, past } = ctx;
  const two = ev.b !== null;
  // Far sides (bit 1 the right hand's, bit 2 the left's); time and figure notes never count
  // as crossing, but do for arms crossed both ways (raw).
  const rawFar0 = far[ev.va] ?? 0;
  const rawFar1 = two ? (far[ev.vb] ?? 0) : 0;
  const past0 = past[ev.va] ?? 0;
  const past1 = two ? (past[ev.vb] ?? 0) : 0;
  const far0 = ev.forced0 ? 0 : rawFar0;
  const far1 = ev.forced1 ? 0 : rawFar1;
  const crossedIfFirstR = two && (place[ev.va] ?? 0) < (place[ev.vb] ?? 0);
  const crossedIfFirstL = two && (place[ev.vb] ?? 0) < (place[ev.va] ?? 0);
  const tangledIfFirstR = (rawFar0 & 1) !== 0 && (rawFar1 & 2) !== 0;
  const tangledIfFirstL = (rawFar1 & 1) !== 0 && (rawFar0 & 2) !== 0;
  for (let p = from; p < to; p++) {
    let lastR = lat.lastR[p] ?? REST;
    let lastL = lat.lastL[p] ?? REST;
    let f = lat.flags[p] ?? 0;
    const cost0 = lat.cost[p] ?? 0;
    if (T - lastR > memory) {
      lastR = REST;
      f &= ~DBL_R;
    }
    if (T - lastL > memory) {
      lastL = REST;
      f &= ~DBL_L;
    }
    // The rate: each hand's new double bit, or -1 when it may not strike now.
    let dblR = 0;
    if (lastR !== REST) dblR = !doubles || f & DBL_R || T - lastR < doubleTicks ? -1 : DBL_R;
    let dblL = 0;
    if (lastL !== REST) dblL = !doubles || f & DBL_L || T - lastL < doubleTicks ? -1 : DBL_L;
    if (two) {
      if (dblR < 0 || dblL < 0) {
        why.fast = true;
        continue;
      }
      for (let o = 0; o < 2; o++) {
        const firstHand = o === 0 ? lead : 3 - lead; // o = 0: the leading hand takes the first note
        if (
          (ev.forced0 && ev.forced0 !== firstHand) ||
          (ev.forced1 && ev.forced1 === firstHand) ||
          (ev.pin0 && ev.pin0 !== firstHand) ||
          (ev.pin1 && ev.pin1 === firstHand)
        ) {
          why.other = true;
          continue;
        }
        if (firstHand === 1 ? tangledIfFirstR : tangledIfFirstL) {
          why.other = true;
          why.arms = true;
          continue;
        }
        let cost = cost0;
        if (firstHand === 1) {
          if (far0 & 1) cost += COST.far;
          if (far1 & 2) cost += COST.far;
          if (crossedIfFirstR) cost += COST.crossed;
        } else {
          if (far0 & 2) cost += COST.far;
          if (far1 & 1) cost += COST.far;
          if (crossedIfFirstL) cost += COST.crossed;
        }
        // The arms cross both ways when a hand plays its far side right after the other did;
        // a hand leaps across the kit when it goes between its far and its own side at once.
        const farNowR = firstHand === 1 ? rawFar0 & 1 : rawFar1 & 1;
        const farNowL = firstHand === 1 ? rawFar1 & 2 : rawFar0 & 2;
        const ownNowR = firstHand === 1 ? rawFar0 & 2 : rawFar1 & 2;
        const ownNowL = firstHand === 1 ? rawFar1 & 1 : rawFar0 & 1;
        if (ev.runStep && ((farNowR && f & FAR_L) || (farNowL && f & FAR_R))) {
          why.other = true;
          why.arms = true;
          continue;
        }
        if (
          ev.runStep &&
          ((farNowR && f & OWN_R) ||
            (ownNowR && f & FAR_R) ||
            (farNowL && f & OWN_L) ||
            (ownNowL && f & FAR_L))
        ) {
          why.other = true;
          continue;
        }
        const pastNowR = firstHand === 1 ? past0 & 1 : past1 & 1;
        const pastNowL = firstHand === 1 ? past1 & 2 : past0 & 2;
        const looseR = firstHand === 1 ? ev.loose0 : ev.loose1;
        const looseL = firstHand === 1 ? ev.loose1 : ev.loose0;
        // A fill stroke never takes a hand from its far side past the middle in one quick note.
        if (
          ev.runStep &&
          ((((farNowR && f & PAST_R) || (pastNowR && f & FAR_R)) && (looseR || f & LS_R)) ||
            (((farNowL && f & PAST_L) || (pastNowL && f & FAR_L)) && (looseL || f & LS_L)))
        ) {
          why.other = true;
          continue;
        }
        // Soft: third notes of a run in a row, a pending crossing left unmet, backbeats.
        const exR = (firstHand === 1 ? ev.forced0 : ev.forced1) !== 0;
        const exL = (firstHand === 1 ? ev.forced1 : ev.forced0) !== 0;
        const lsR = firstHand === 1 ? ev.loose0 : ev.loose1;
        const lsL = firstHand === 1 ? ev.loose1 : ev.loose0;
        const threeR = ctx.runs && third(f, 1, ev.runStep, exR);
        const threeL = ctx.runs && third(f, 2, ev.runStep, exL);
        // A fill stroke never makes a hand's third note of a run in a row: it is removed.
        if ((threeR && (lsR || f & LX_R)) || (threeL && (lsL || f & LX_L))) {
          why.other = true;
          continue;
        }
        if (threeR) cost += COST.three;
        if (threeL) cost += COST.three;
        // A crossing is met by the near hand on its side, or on the landing right after a fill.
        const landR = firstHand === 1 ? ev.landing0 : ev.landing1;
        const landL = firstHand === 1 ? ev.landing1 : ev.landing0;
        if (f & CROSS_R && !(ev.runStep && (ownNowL || landL))) cost += COST.crossFree;
        if (f & CROSS_L && !(ev.runStep && (ownNowR || landR))) cost += COST.crossFree;
        if (ev.free) {
          if (ev.beat0 && !ev.forced0 && firstHand !== ev.free) cost += COST.backbeat;
          if (ev.beat1 && !ev.forced1 && firstHand === ev.free) cost += COST.backbeat;
        }
        const flags =
          dblR |
          dblL |
          ORDER_SAME |
          PREV_BOTH |
          (farNowR ? FAR_R : 0) |
          (farNowL ? FAR_L : 0) |
          (ownNowR ? OWN_R : 0) |
          (ownNowL ? OWN_L : 0) |
          (pastNowR ? PAST_R : 0) |
          (pastNowL ? PAST_L : 0) |
          strikeBits(f, 1, ev.runStep, exR, lsR) |
          strikeBits(f, 2, ev.runStep, exL, lsL);
        put(lat, base, flags, T, T, flags, cost, p, firstHand === 1 ? 0 : 1);
      }
      continue;
    }
    const dR = lastR === REST ? 0 : T - lastR + 1;
    const dL = lastL === REST ? 0 : T - lastL + 1;
    for (let o = 0; o < 2; o++) {
      const hand = o === 0 ? lead : 3 - lead;
      if ((ev.forced0 && ev.forced0 !== hand) || (ev.pin0 && ev.pin0 !== hand)) continue;
      const right = hand === 1;
      const dbl = right ? dblR : dblL;
      if (dbl < 0) {
        why.fast = true;
        continue;
      }
      // A crossing left pending must be met by the other hand before this stroke.
      if (f & (right ? PEND_R : PEND_L)) {
        why.other = true;
        continue;
      }
      const farNow = rawFar0 & hand;
      const ownNow = rawFar0 & (3 - hand);
      if (farNow && ev.runStep && f & (right ? FAR_L : FAR_R)) {
        why.other = true;
        why.arms = true;
        continue;
      }
      // No leap across the kit: the hand's far side and its own side at two run notes running.
      if (
        ev.runStep &&
        ((farNow && f & (right ? OWN_R : OWN_L)) || (ownNow && f & (right ? FAR_R : FAR_L)))
      ) {
        why.other = true;
        continue;
      }
      // Nor does a fill stroke take it from its far side past the middle in one quick note.
      const pastNow = past0 & hand;
      if (
        ev.runStep &&
        (ev.loose0 || f & (right ? LS_R : LS_L)) &&
        ((farNow && f & (right ? PAST_R : PAST_L)) || (pastNow && f & (right ? FAR_R : FAR_L)))
      ) {
        why.other = true;
        continue;
      }
      let cost = cost0;
      let pend = 0;
      let cross = 0;
      if (far0 & hand) {
        cost += COST.far;
        // Covered when the other hand struck at or since this hand's last stroke.
        if ((f & ORDER) === (right ? ORDER_R : ORDER_L)) pend = right ? PEND_R : PEND_L;
        // The near hand is free: the crossing is fine only hand to hand inside a run the near
        // hand carries on on that side (it struck the note before; the note after is checked
        // then: the near hand on that side).
        if (ev.runStep && f & (right ? PREV_L : PREV_R)) cross = right ? CROSS_R : CROSS_L;
        else cost += COST.crossFree;
      }
      // A crossing wedged at the note before needs the near hand (this one) on its side now.
      // Or by the near hand's landing crash right after the fill's last stroke.
      if (f & CROSS_R && !(ev.runStep && !right && (ownNow || ev.landing0))) cost += COST.crossFree;
      if (f & CROSS_L && !(ev.runStep && right && (ownNow || ev.landing0))) cost += COST.crossFree;
      const prevMine = (f & PREV) === (right ? PREV_R : PREV_L);
      const exempt = ev.forced0 !== 0;
      if (ctx.runs && third(f, hand, ev.runStep, exempt)) {
        // A fill stroke never makes a hand's third note of a run in a row: it is removed.
        if (ev.loose0 || f & (right ? LX_R : LX_L)) {
          why.other = true;
          continue;
        }
        cost += COST.three;
      }
      if (ev.free && !exempt && hand === ev.free && ev.a.source === 'ostinato')
        cost += COST.leaveTime;
      if (ev.free && !exempt && hand !== ev.free) {
        if (ev.beat0) cost += COST.backbeat;
        // Unless both hands struck the note before (the time and the free hand's note): then
        // the time hand may take its turn.
        if (ev.beside && !(ev.runStep && (f & PREV) === PREV_BOTH)) cost += COST.beside;
      }
      let run = exempt ? EXA : 0;
      if (ev.runStep && prevMine) {
        if (f & RUN2 && ctx.runs && !(f & EXA && f & EXB && exempt)) {
          why.other = true;
          continue;
        }
        run |= RUN2 | (f & EXA ? EXB : 0);
      }
      if (!exempt) {
        if (hand !== ev.natural) cost += COST.natural;
        if (prevMine && ctx.alternate && ev.nearStep) cost += COST.alternate;
        else if (prevMine && ev.runStep) cost += ev.fill ? COST.fillRepeat : COST.repeat;
      } else if (prevMine && ev.runStep && ev.fill) {
        // A line's note inside a fill keeps its hand; the fill's strokes around it give way.
        cost += COST.fillRepeat;
      }
      const keep = f & (right ? DBL_L : DBL_R);
      const farBit =
        (farNow ? (right ? FAR_R : FAR_L) : 0) |
        (ownNow ? (right ? OWN_R : OWN_L) : 0) |
        (pastNow ? (right ? PAST_R : PAST_L) : 0);
      const flags =
        keep |
        dbl |
        pend |
        (right ? ORDER_R | PREV_R : ORDER_L | PREV_L) |
        run |
        farBit |
        cross |
        strikeBits(f, hand, ev.runStep, exempt, ev.loose0);
      const key = right ? (width + dL) * FLAGS + flags : (dR * width + 1) * FLAGS + flags;
      put(lat, base, key, right ? T : lastR, right ? lastL : T, flags, cost, p, right ? 0 : 1);
    }
  }
  close(lat, layer + 1);
  return lat.size - base;
}

/** The run bits (TWO, NX, MX, LS, LX) of a hand (1 R, 2 L) striking now, from the flags. */
function strikeBits(
  f: number,
  hand: number,
  runStep: boolean,
  exempt: boolean,
  loose: boolean,
): number {
  const right = hand === 1;
  let bits = exempt ? 0 : right ? NX_R : NX_L;
  if (runStep && f & (right ? PREV_R : PREV_L)) bits |= right ? TWO_R : TWO_L;
  if (!exempt || f & (right ? NX_R : NX_L)) bits |= right ? MX_R : MX_L;
  if (loose) bits |= right ? LS_R | LX_R : LS_L | LX_L;
  else if (f & (right ? LS_R : LS_L)) bits |= right ? LX_R : LX_L;
  return bits;
}

/** True when the hand's stroke now is its third note of a run in a row, not all time notes. */
function third(f: number, hand: number, runStep: boolean, exempt: boolean): boolean {
  const right = hand === 1;
  if (!runStep || !(f & (right ? TWO_R : TWO_L))) return false;
  return !exempt || (f & (right ? MX_R : MX_L)) !== 0;
}

/** A state's key as seen from the tick `end` (what the next lap starts from). */
function keyAt(ctx: Ctx, lat: Lattice, j: number, end: number): string {
  const lastR = lat.lastR[j] ?? REST;
  const lastL = lat.lastL[j] ?? REST;
  const restR = end - lastR > ctx.memory;
  const restL = end - lastL > ctx.memory;
  const flags = (lat.flags[j] ?? 0) & ~(restR ? DBL_R : 0) & ~(restL ? DBL_L : 0);
  return `${restR ? -1 : end - lastR}/${restL ? -1 : end - lastL}/${flags}`;
}

/**
 * A lap's cost at state j (after the lap's last event), with a crossing still pending at its end
 * charged unless the lap's own first note meets it: drills loop, so that note comes next. `first`
 * is the lap's first event and `back` the steps from j to the state after it (events − 1).
 */
function endCost(lat: Lattice, j: number, first: Event, back: number): number {
  const cost = lat.cost[j] ?? 0;
  const pending = (lat.flags[j] ?? 0) & (CROSS_R | CROSS_L);
  if (!pending) return cost;
  let k = j;
  for (let s = 0; s < back; s++) k = lat.parent[k] ?? 0;
  const flags = lat.flags[k] ?? 0;
  const choice = lat.choice[k] ?? 0;
  const landR = (first.landing0 && choice === 0) || (first.landing1 && choice === 1);
  const landL = (first.landing0 && choice === 1) || (first.landing1 && choice === 0);
  const metR = first.runStep && ((flags & OWN_L) !== 0 || landL);
  const metL = first.runStep && ((flags & OWN_R) !== 0 || landR);
  const unmet = (pending & CROSS_R && !metR) || (pending & CROSS_L && !metL);
  return cost + (unmet ? COST.crossFree : 0);
}

/** The cheapest state of a layer (the first on ties), by `endCost`. */
function cheapest(lat: Lattice, layer: number, first: Event, back: number): number {
  const from = lat.begin[layer] ?? 0;
  const to = lat.begin[layer + 1] ?? 0;
  let best = from;
  let bestCost = endCost(lat, best, first, back);
  for (let j = from + 1; j < to; j++) {
    const cost = endCost(lat, j, first, back);
    if (cost < bestCost) {
      best = j;
      bestCost = cost;
    }
  }
  return best;
}

/** Writes the hands of the lap whose last state is `end`; returns the state it started from. */
function writePath(events: readonly Event[], lat: Lattice, end: number): number {
  let j = end;
  for (let e = events.length - 1; e >= 0; e--) {
    const ev = events[e] as Event;
    const right = (lat.choice[j] ?? 0) === 0;
    ev.a.hand = right ? 'R' : 'L';
    if (ev.b) ev.b.hand = right ? 'L' : 'R';
    j = lat.parent[j] ?? 0;
  }
  return j;
}

/**
 * Sticks every hand note: a first lap from a free start, then a second lap on from every state
 * the first ended in (drills loop). The second lap's cheapest sticking is the drill's when it
 * ends in the state it began from, or when the rules pass it round the seam; otherwise each
 * state the laps ended in is tried as the seam. With `repair`, removes fill strokes at each
 * trouble and resumes the first lap from the instant emptied (see `assignHandsRepairing`);
 * with `skipFill`, sticks only the notes that are not fill.
 */
function solve(
  ctx: Ctx,
  plan: Plan,
  cells: WorkHit[][] | Cells,
  repair: boolean,
  skipFill: boolean,
): HandFailure | null {
  const events: Event[] = [];
  // Two laps of the hand notes, a few states each: most searches never grow it.
  const lat = lattice(2 * ctx.n);
  put(lat, 0, 0, REST, REST, 0, 0, -1, 0);
  close(lat, 0);
  const span = 2 * ctx.memory;
  let resume = 0;
  for (;;) {
    const failure =
      firstLap(ctx, plan, cells, events, lat, resume, skipFill) ??
      secondLap(ctx, cells, events, lat, skipFill);
    if (!failure || !repair) return failure;
    const emptied = dropNear(ctx, cells as WorkHit[][], failure.instant, -1, span);
    if (emptied === null) return failure;
    // What came before the emptied instant is unchanged: keep its events and states.
    resume = Math.min(emptied, failure.instant);
    let kept = events.length;
    while (kept > 0 && (events[kept - 1]?.instant ?? 0) >= resume) kept--;
    events.length = kept;
    lat.size = lat.begin[kept + 1] ?? 0;
  }
}

/** Layers 0..E of `lat`: the free start, then the first lap's states after each event. */
function firstLap(
  ctx: Ctx,
  plan: Plan,
  cells: Cells,
  events: Event[],
  lat: Lattice,
  resume: number,
  skipFill: boolean,
): HandFailure | null {
  const why: Why = { fast: false, other: false, arms: false };
  for (let i = resume; i < ctx.n; i++) {
    const ev = eventAt(ctx, plan, cells, i, events[events.length - 1] ?? null, skipFill);
    if (!ev) continue;
    events.push(ev);
    if (ev.crowded || advance(ctx, lat, events.length - 1, ev, 0, why) === 0)
      return failureAt(ev, why);
  }
  return null;
}

function failureAt(ev: Event, why: Why): HandFailure {
  if (ev.crowded) return { instant: ev.instant, reason: 'tooManyHands' };
  if (why.fast || !why.other) return { instant: ev.instant, reason: 'tooFast' };
  return why.arms
    ? { instant: ev.instant, reason: 'sticking', arms: true }
    : { instant: ev.instant, reason: 'sticking' };
}

/** Layers E..2E of `lat`: the second lap, the seam, and the drill's sticking written. */
function secondLap(
  ctx: Ctx,
  cells: Cells,
  events: Event[],
  lat: Lattice,
  skipFill: boolean,
): HandFailure | null {
  const E = events.length;
  const first = events[0];
  const last = events[E - 1];
  if (!first || !last) return null;
  const why: Why = { fast: false, other: false, arms: false };
  const { loop } = ctx;
  wrap(ctx, first, last);
  const lap = events;
  for (let e = 0; e < E; e++) {
    const ev = lap[e] as Event;
    if (advance(ctx, lat, E + e, ev, loop, why) === 0) return failureAt(ev, why);
  }
  const best = cheapest(lat, 2 * E, first, E - 1);
  const start = writePath(lap, lat, best);
  if (keyAt(ctx, lat, start, loop) === keyAt(ctx, lat, best, 2 * loop)) return null;
  const holds = (): boolean => seamHolds(ctx, cells, skipFill);
  if (holds()) return null;
  // Try each state the laps ended in as the seam: a lap from it that ends in it again loops.
  const candidates: { key: string; cost: number; order: number }[] = [];
  for (const [layer, end] of [
    [E, loop],
    [2 * E, 2 * loop],
  ] as const) {
    for (let j = lat.begin[layer] ?? 0; j < (lat.begin[layer + 1] ?? 0); j++)
      candidates.push({
        key: keyAt(ctx, lat, j, end),
        cost: endCost(lat, j, first, E - 1),
        order: j,
      });
  }
  candidates.sort((a, b) => a.cost - b.cost || a.order - b.order);
  const seen = new Set<string>();
  for (const { key } of candidates) {
    if (seen.has(key)) continue;
    seen.add(key);
    const [r = -1, l = -1, flags = 0] = key.split('/').map(Number);
    const trial = lattice(4 * E);
    put(trial, 0, 0, r < 0 ? REST : loop - r, l < 0 ? REST : loop - l, flags, 0, -1, 0);
    close(trial, 0);
    let alive = true;
    for (let e = 0; e < E && alive; e++)
      alive = advance(ctx, trial, e, lap[e] as Event, loop, why) > 0;
    if (!alive) continue;
    let pick = -1;
    for (let j = trial.begin[E] ?? 0; j < trial.size; j++) {
      if (keyAt(ctx, trial, j, 2 * loop) !== key) continue;
      if (pick < 0 || endCost(trial, j, first, E - 1) < endCost(trial, pick, first, E - 1))
        pick = j;
    }
    if (pick < 0) continue;
    writePath(lap, trial, pick);
    if (holds()) return null;
  }
  const fault = handFaults(ctx, cells, skipFill)[0];
  return { instant: last.instant, reason: fault?.rule === 'rate' ? 'tooFast' : 'sticking' };
}

function seamHolds(ctx: Ctx, cells: Cells, skipFill: boolean): boolean {
  return handFaults(ctx, cells, skipFill).length === 0;
}

/** The sticking rules' hand faults on the cells (without their fill notes with `skipFill`). */
function handFaults(ctx: Ctx, cells: Cells, skipFill: boolean) {
  const notes = skipFill
    ? cells.map((cell) => cell?.filter((hit) => hit.source !== 'fill'))
    : cells;
  return faultsOf(ctx.card, ctx.frame, tabulate(notes, ctx.n), true);
}
