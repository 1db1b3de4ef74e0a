import { VOICE_IDS, type Hand } from '../drill';
import { positionOf, type Grid } from '../grid';
import { handOf, onFarSide, otherHand } from '../sticking/kit';
import {
  FOOT_LIMITS,
  Gap,
  HAND_LIMITS,
  type StrokeLimits,
  type Thresholds,
} from '../sticking/limits';
import {
  frameOf,
  HAND_VOICE,
  ruleStreams,
  streamWords,
  tabulate,
  tabulateBy,
  timeStream,
  voicesAt,
  type Frame,
  type NoteLike,
  type NoteTable,
  type StickingCard,
} from '../sticking/streams';
import { voiceWord } from '../words';
import type { Violation } from './checker';
import type { Located } from './located';

/** A finished note as sticking sees it. */
export interface StickingNote extends NoteLike {
  readonly hand: 'R' | 'L' | null;
}

/** One broken sticking rule, at an instant of the drill. */
export interface StickingFault {
  readonly code: 'hands' | 'feet';
  /** Which rule of `stickingFaults` it breaks. */
  readonly rule: 'limbs' | 'rate' | 'time' | 'figure' | 'crossing' | 'run';
  readonly instant: number;
  readonly message: string;
}

/**
 * Playability of a drill's sticking (see docs/engine.md, Sticking). Drills loop, so every rule
 * holds round the seam from the last bar into the first as well:
 * 1. limbs: hand voices have a hand (R or L), feet none; at most two hand voices at an instant,
 *    on different hands;
 * 2. rate, hands: single strokes of one hand fewer than 8 a second; faster pairs are doubles,
 *    allowed only when the card's `sticking.doubles` is true, at most 12 a second, and never
 *    three strokes in a row;
 * 3. rate, feet: single strokes of one foot fewer than 6 a second, doubles at most 10, never
 *    three in a row;
 * 4. time: the time (the ostinato's and layers' notes on the card's hand voices with role
 *    `time`) is on the leading hand for its whole pattern, when the card leads with a hand and
 *    one hand can play the time, but for the time note right before a phrase's fill (the hand
 *    may leave the cymbal one note early to start the fill);
 * 5. figure: a polyrhythm or euclid figure on one hand voice stays on one hand when one hand
 *    can play it;
 * 6. crossing: a hand plays on its far side of the kit (the right hand on a right-handed kit's
 *    hi-hat, the left hand on its floor tom or ride) only while the other hand is busy: the
 *    other hand strikes somewhere from the crossing hand's stroke before to its stroke after,
 *    both included (time and figure notes excepted: the crossed hi-hat grip is normal); and
 *    the arms never cross both ways: the two hands never play their far sides at one instant,
 *    nor one right after the other at two consecutive notes of a run (time notes included: the
 *    left hand does not reach under to the floor tom between two crossed hi-hat strokes); and
 *    no hand leaps across the kit, from one side to the other (hi-hat and floor tom or ride),
 *    between two consecutive notes of a run (time notes included);
 * 7. run: in a run (consecutive notes of the grid, 4 or more a second) no hand plays three notes
 *    in a row while the other hand is free (unless all three are time or figure notes); drills
 *    of fewer than three instants are exempt (they cannot alternate round the loop).
 * Returns every fault found.
 */
export function stickingFaults(
  card: StickingCard,
  grid: Grid,
  cells: readonly (readonly StickingNote[] | undefined)[],
): StickingFault[] {
  return faultsOf(card, frameOf(grid, card.tempo), tabulate(cells, grid.instants));
}

/** `stickingFaults` on notes already tabulated; with `handsOnly`, the hands' faults alone. */
export function faultsOf(
  card: StickingCard,
  frame: Frame,
  table: NoteTable<StickingNote>,
  handsOnly = false,
): StickingFault[] {
  const out: StickingFault[] = [];
  const n = frame.grid.instants;
  const { start, voice, notes } = table;
  const handVoice = HAND_VOICE;
  const strokes: Record<Hand, number[]> = { R: [], L: [] };
  const feet = new Map<number, number[]>();
  /** Per instant: bit 1 the right hand strikes, bit 2 the left; the voice each hand plays. */
  const who = new Uint8Array(n);
  const voiceR = new Uint8Array(n);
  const voiceL = new Uint8Array(n);
  const handNotes = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    for (let k = start[i] ?? 0; k < (start[i + 1] ?? 0); k++) {
      const v = voice[k] ?? 0;
      const hand = notes[k]?.hand;
      if (!handVoice[v]) {
        if (hand !== null) out.push(fault('hands', 'limbs', i, `The ${word(v)} has a hand.`));
        if (handsOnly) continue;
        const list = feet.get(v);
        if (list) list.push(i);
        else feet.set(v, [i]);
        continue;
      }
      handNotes[i] = (handNotes[i] ?? 0) + 1;
      if (hand !== 'R' && hand !== 'L') {
        out.push(fault('hands', 'limbs', i, `The ${word(v)} has no hand.`));
        continue;
      }
      const bit = hand === 'R' ? 1 : 2;
      if ((who[i] ?? 0) & bit) {
        out.push(fault('hands', 'limbs', i, 'One hand is given two voices at once.'));
        continue;
      }
      who[i] = (who[i] ?? 0) | bit;
      if (bit === 1) voiceR[i] = v;
      else voiceL[i] = v;
      strokes[hand].push(i);
    }
    if ((handNotes[i] ?? 0) > 2)
      out.push(fault('hands', 'limbs', i, 'More than two hand voices strike at once.'));
  }

  const doubles = card.sticking.doubles;
  for (const hand of ['R', 'L'] as const) {
    const limb = handWord(hand);
    rateFaults(frame, strokes[hand], frame.hand, HAND_LIMITS, doubles, 'hands', limb, out);
  }
  for (const [v, instants] of feet) {
    const limb = `the ${word(v)}`;
    rateFaults(frame, instants, frame.foot, FOOT_LIMITS, true, 'feet', limb, out);
  }

  const handAt = (i: number, v: number): Hand | null =>
    (who[i] ?? 0) & 1 && voiceR[i] === v ? 'R' : (who[i] ?? 0) & 2 && voiceL[i] === v ? 'L' : null;
  const time = timeStream(card, frame, table);
  if (time && card.sticking.lead !== 'alternate') {
    const lead = handOf(card.sticking.lead);
    for (let k = 0; k < time.instants.length; k++) {
      const i = time.instants[k] ?? 0;
      const v = time.voices[k] ?? 0;
      if (handAt(i, v) !== lead)
        out.push(
          fault(
            'hands',
            'time',
            i,
            `${capital(streamWords(time))} is not on the leading hand (${card.sticking.lead}) here.`,
          ),
        );
    }
  }
  const figures = ruleStreams(card, frame, table, time);
  for (const figure of figures) {
    const hand = handAt(figure.instants[0] ?? 0, figure.voices[0] ?? 0);
    for (let k = 0; k < figure.instants.length; k++) {
      const i = figure.instants[k] ?? 0;
      const v = figure.voices[k] ?? 0;
      if (handAt(i, v) !== hand)
        out.push(
          fault(
            'hands',
            'figure',
            i,
            `${capital(streamWords(figure))} changes hands; one hand can play it.`,
          ),
        );
    }
  }

  // Time and figure notes: the crossed hi-hat grip is normal, and a line may repeat its hand.
  const exempt = voicesAt(n, ...(time ? [time] : []), ...figures);
  const farR = FAR_SIDES[card.hand].R;
  const farL = FAR_SIDES[card.hand].L;
  tangleFaults(frame, who, voiceR, voiceL, farR, farL, out);
  for (const hand of ['R', 'L'] as const) {
    crossingFaults(card, n, hand, strokes[hand], hand === 'R' ? voiceR : voiceL, who, exempt, out);
  }
  if (n >= 3) runFaults(frame, who, handNotes, voiceR, voiceL, exempt, out);
  return out;
}

/** Per player's hand and hand: whether each voice (VOICE_IDS order) is on that hand's far side. */
const FAR_SIDES: Readonly<Record<StickingCard['hand'], Record<Hand, readonly boolean[]>>> = {
  right: farSides('right'),
  left: farSides('left'),
};

function farSides(player: StickingCard['hand']): Record<Hand, readonly boolean[]> {
  return {
    R: VOICE_IDS.map((v) => onFarSide(v, 'R', player)),
    L: VOICE_IDS.map((v) => onFarSide(v, 'L', player)),
  };
}

const fault = (
  code: 'hands' | 'feet',
  rule: StickingFault['rule'],
  instant: number,
  message: string,
): StickingFault => ({ code, rule, instant, message });

const word = (v: number): string => voiceWord(VOICE_IDS[v] ?? 'snare');
const handWord = (hand: Hand): string => (hand === 'R' ? 'the right hand' : 'the left hand');
const capital = (text: string): string => text.charAt(0).toUpperCase() + text.slice(1);

/** Rules 2 and 3 for one limb's strokes (ascending instants), round the loop. */
function rateFaults(
  frame: Frame,
  instants: readonly number[],
  gaps: Thresholds,
  limits: StrokeLimits,
  doubles: boolean,
  code: 'hands' | 'feet',
  limb: string,
  out: StickingFault[],
): void {
  const count = instants.length;
  if (count === 0) return;
  const { ticks } = frame;
  const kinds: Gap[] = [];
  const single = gaps.single;
  const double = gaps.double;
  const { Single, Double, TooFast } = Gap;
  let before = (ticks[instants[count - 1] ?? 0] ?? 0) - frame.pace.loop;
  for (let k = 0; k < count; k++) {
    const now = ticks[instants[k] ?? 0] ?? 0;
    const gap = now - before;
    kinds.push(gap > single ? Single : gap >= double ? Double : TooFast);
    before = now;
  }
  const singles = `single strokes allow (fewer than ${limits.singlesPerSecond} a second)`;
  for (let k = 0; k < count; k++) {
    const kind = kinds[k];
    if (kind === Single) continue;
    const instant = instants[k] ?? 0;
    const seam = k === 0 ? ' from the last bar into the first' : '';
    const who = capital(limb);
    if (kind === TooFast || !doubles) {
      const most = doubles
        ? `${limits.doublesPerSecond} notes a second, even as a double`
        : `${singles}, and the card does not ask for doubles`;
      out.push(fault(code, 'rate', instant, `${who} plays faster${seam} than ${most}.`));
    } else if (count > 1 && kinds[(k - 1 + count) % count] !== Single) {
      const message = `${who} plays three strokes in a row${seam} faster than ${singles}.`;
      out.push(fault(code, 'rate', instant, message));
    }
  }
}

/** Rule 6, arms crossed both ways: far sides at one instant or at consecutive run notes. */
function tangleFaults(
  frame: Frame,
  who: Uint8Array,
  voiceR: Uint8Array,
  voiceL: Uint8Array,
  farR: readonly boolean[],
  farL: readonly boolean[],
  out: StickingFault[],
): void {
  const n = frame.grid.instants;
  const { ticks, run } = frame;
  const onFarR = (i: number): boolean => ((who[i] ?? 0) & 1) !== 0 && !!farR[voiceR[i] ?? 0];
  const onFarL = (i: number): boolean => ((who[i] ?? 0) & 2) !== 0 && !!farL[voiceL[i] ?? 0];
  const both = (i: number): string =>
    `the right hand plays the ${word(voiceR[i] ?? 0)} and the left hand the ${word(voiceL[i] ?? 0)}`;
  const sides = [
    [1, voiceR],
    [2, voiceL],
  ] as const;
  for (let i = 0; i < n; i++) {
    if (onFarR(i) && onFarL(i)) {
      const message = `${capital(both(i))} at once: the arms cross both ways.`;
      out.push(fault('hands', 'crossing', i, message));
    }
    const j = (i + 1) % n;
    if (n < 2 || (ticks[i + 1] ?? 0) - (ticks[i] ?? 0) > run) continue;
    if ((onFarR(i) && onFarL(j)) || (onFarL(i) && onFarR(j))) {
      const [r, l] = onFarR(i) ? [i, j] : [j, i];
      const message = `The right hand plays the ${word(voiceR[r] ?? 0)} right ${r === i ? 'before' : 'after'} the left hand plays the ${word(voiceL[l] ?? 0)}: the arms cross both ways.`;
      out.push(fault('hands', 'crossing', j, message));
    }
    // A leap: one hand from one side of the kit to the other between two run notes.
    for (const [bit, voices] of sides) {
      if (!((who[i] ?? 0) & bit) || !((who[j] ?? 0) & bit)) continue;
      const a = voices[i] ?? 0;
      const b = voices[j] ?? 0;
      if ((farR[a] && farL[b]) || (farL[a] && farR[b])) {
        const message = `${capital(handWord(bit === 1 ? 'R' : 'L'))} leaps from the ${word(a)} to the ${word(b)} between two notes of a run, across the kit.`;
        out.push(fault('hands', 'crossing', j, message));
      }
    }
  }
}

/** Rule 6 for one hand: far-side strokes need the other hand busy around them. */
function crossingFaults(
  card: StickingCard,
  n: number,
  hand: Hand,
  mine: readonly number[],
  myVoice: Uint8Array,
  who: Uint8Array,
  exempt: Uint16Array,
  out: StickingFault[],
): void {
  const count = mine.length;
  if (count === 0) return;
  const otherBit = hand === 'R' ? 2 : 1;
  const far = VOICE_IDS.map((voice) => onFarSide(voice, hand, card.hand));
  let prefix: Int32Array | null = null;
  for (let k = 0; k < count; k++) {
    const i = mine[k] ?? 0;
    const v = myVoice[i] ?? 0;
    if (!far[v]) continue;
    if ((who[i] ?? 0) & otherBit || ((exempt[i] ?? 0) >> v) & 1) continue;
    if (!prefix) {
      // prefix[i]: the other hand's strokes before instant i.
      prefix = new Int32Array(n + 1);
      for (let j = 0; j < n; j++)
        prefix[j + 1] = (prefix[j] ?? 0) + ((who[j] ?? 0) & otherBit ? 1 : 0);
    }
    const before = k > 0 ? (mine[k - 1] ?? 0) : (mine[count - 1] ?? 0) - n;
    const after = k < count - 1 ? (mine[k + 1] ?? 0) : (mine[0] ?? 0) + n;
    if (strokesBetween(prefix, n, before, after) > 0) continue;
    out.push(
      fault(
        'hands',
        'crossing',
        i,
        `${capital(handWord(hand))} crosses to the ${word(v)} while ${handWord(otherHand(hand))} is free.`,
      ),
    );
  }
}

/** Strokes counted by `prefix` in the instants a..b (inclusive, may run round the loop). */
function strokesBetween(prefix: Int32Array, n: number, a: number, b: number): number {
  const total = prefix[n] ?? 0;
  if (b - a + 1 >= n) return total;
  const lo = ((a % n) + n) % n;
  const hi = ((b % n) + n) % n;
  return lo <= hi
    ? (prefix[hi + 1] ?? 0) - (prefix[lo] ?? 0)
    : total - (prefix[lo] ?? 0) + (prefix[hi + 1] ?? 0);
}

/** Rule 7: three notes in a row of a run on one hand while the other is free. */
function runFaults(
  frame: Frame,
  who: Uint8Array,
  handNotes: Uint8Array,
  voiceR: Uint8Array,
  voiceL: Uint8Array,
  exempt: Uint16Array,
  out: StickingFault[],
): void {
  const n = frame.grid.instants;
  const { ticks, run } = frame;
  const alone = (i: number): number => (handNotes[i] === 1 ? (who[i] ?? 0) : 0);
  const isExempt = (i: number): boolean =>
    (((exempt[i] ?? 0) >> ((who[i] === 1 ? voiceR[i] : voiceL[i]) ?? 0)) & 1) === 1;
  for (let a = 0; a < n; a++) {
    const hand = alone(a);
    if (hand === 0) continue;
    const b = (a + 1) % n;
    const c = (a + 2) % n;
    if (alone(b) !== hand || alone(c) !== hand) continue;
    if ((ticks[a + 1] ?? 0) - (ticks[a] ?? 0) > run) continue;
    if ((ticks[b + 1] ?? 0) - (ticks[b] ?? 0) > run) continue;
    if (isExempt(a) && isExempt(b) && isExempt(c)) continue;
    const h: Hand = hand === 1 ? 'R' : 'L';
    out.push(
      fault(
        'hands',
        'run',
        c,
        `${capital(handWord(h))} plays three notes of a run in a row while ${handWord(otherHand(h))} is free.`,
      ),
    );
  }
}

/** The sticking rules on a drill's located hits, as checker violations. */
export function checkHands(
  card: StickingCard,
  grid: Grid,
  cells: readonly Located[][],
  out: Violation[],
): void {
  const table = tabulateBy(cells, grid.instants, (l: Located) => l.hit);
  for (const f of faultsOf(card, frameOf(grid, card.tempo), table)) {
    const p = positionOf(grid, f.instant);
    out.push({ code: f.code, message: f.message, bar: p.bar, beat: p.beat, slot: p.slot });
  }
}
