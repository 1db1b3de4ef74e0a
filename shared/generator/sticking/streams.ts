import { isHandVoice, VOICE_IDS, type VoiceId } from '../drill';
import type { Grid } from '../grid';
import type { RuleCard } from '../schema';
import { voiceWord } from '../words';
import {
  FOOT_LIMITS,
  HAND_LIMITS,
  instantTicks,
  paceOf,
  runTicks,
  thresholdsOf,
  type Pace,
  type Thresholds,
} from './limits';

/** What sticking reads of a note: its voice and the part of the card that placed it. */
export interface NoteLike {
  readonly voice: VoiceId;
  readonly source: string;
}

/** The card fields sticking reads. */
export type StickingCard = Pick<
  RuleCard,
  'voices' | 'roles' | 'ostinato' | 'layers' | 'sticking' | 'hand' | 'tempo'
> &
  Partial<Pick<RuleCard, 'meter'>>;

/** A card's grid and tempo with what every sticking test needs, worked out once. */
export interface Frame {
  readonly grid: Grid;
  readonly pace: Pace;
  /** Ticks of each instant from the drill's start; `ticks[instants]` is the loop. */
  readonly ticks: Float64Array;
  readonly hand: Thresholds;
  readonly foot: Thresholds;
  /** The longest gap between two grid notes of a run. */
  readonly run: number;
}

/** The grid's frame at a tempo; the last one is kept (a drill asks for it seven times). */
export function frameOf(grid: Grid, tempo: number): Frame {
  if (lastFrame?.grid === grid && lastTempo === tempo) return lastFrame;
  const pace = paceOf(grid, tempo);
  lastFrame = {
    grid,
    pace,
    ticks: instantTicks(grid),
    hand: thresholdsOf(pace, HAND_LIMITS),
    foot: thresholdsOf(pace, FOOT_LIMITS),
    run: runTicks(pace),
  };
  lastTempo = tempo;
  return lastFrame;
}

let lastFrame: Frame | null = null;
let lastTempo = 0;

/** Each voice's index in VOICE_IDS, and whether a hand plays it. */
export const VOICE_INDEX: Readonly<Record<VoiceId, number>> = Object.fromEntries(
  VOICE_IDS.map((voice, i) => [voice, i]),
) as Record<VoiceId, number>;
export const HAND_VOICE: readonly boolean[] = VOICE_IDS.map(isHandVoice);
/** VOICE_INDEX as a map: faster to read with a voice that varies, as `tabulate` does. */
const VOICE_NUMBER: ReadonlyMap<VoiceId, number> = new Map(VOICE_IDS.map((voice, i) => [voice, i]));

/** Where a note came from, as sticking distinguishes it. */
export const FROM_FILL = 0;
export const FROM_POLYRHYTHM = 1;
export const FROM_EUCLID = 2;
export const FROM_RULE = 3;
export const FROM_OSTINATO = 4;

/**
 * A drill's notes by instant in flat arrays (one pass over the note objects; every later pass
 * reads numbers): the notes of instant i are `start[i]` to `start[i + 1] - 1`.
 */
export interface NoteTable<N extends NoteLike = NoteLike> {
  readonly start: Int32Array;
  /** VOICE_IDS index of each note. */
  readonly voice: Uint8Array;
  /** FROM_FILL, FROM_POLYRHYTHM, FROM_EUCLID, FROM_OSTINATO (the time layers) or FROM_RULE. */
  readonly from: Uint8Array;
  readonly notes: readonly N[];
}

export function tabulate<N extends NoteLike>(
  cells: readonly (readonly N[] | undefined)[],
  instants: number,
): NoteTable<N> {
  const start = new Int32Array(instants + 1);
  const notes: N[] = [];
  for (let i = 0; i < instants; i++) {
    start[i] = notes.length;
    const cell = cells[i];
    if (cell) for (let k = 0; k < cell.length; k++) notes.push(cell[k] as N);
  }
  start[instants] = notes.length;
  return tableOf(start, notes);
}

/** `tabulate` on cells of items that each carry a note (no copy of the cells is made). */
export function tabulateBy<C, N extends NoteLike>(
  cells: readonly (readonly C[] | undefined)[],
  instants: number,
  noteOf: (item: C) => N,
): NoteTable<N> {
  const start = new Int32Array(instants + 1);
  const notes: N[] = [];
  for (let i = 0; i < instants; i++) {
    start[i] = notes.length;
    const cell = cells[i];
    if (cell) for (let k = 0; k < cell.length; k++) notes.push(noteOf(cell[k] as C));
  }
  start[instants] = notes.length;
  return tableOf(start, notes);
}

function tableOf<N extends NoteLike>(start: Int32Array, notes: N[]): NoteTable<N> {
  const voice = new Uint8Array(notes.length);
  const from = new Uint8Array(notes.length);
  for (let k = 0; k < notes.length; k++) {
    const note = notes[k] as N;
    voice[k] = VOICE_NUMBER.get(note.voice) ?? 0;
    const source = note.source;
    from[k] =
      source === 'fill'
        ? FROM_FILL
        : source === 'polyrhythm'
          ? FROM_POLYRHYTHM
          : source === 'euclid'
            ? FROM_EUCLID
            : source === 'ostinato'
              ? FROM_OSTINATO
              : FROM_RULE;
  }
  return { start, voice, from, notes };
}

/**
 * A line of notes that one hand plays from start to end: the time cymbal, or a figure a
 * polyrhythm or euclid rule places on one hand voice. At most one note per instant.
 */
export interface Stream {
  readonly kind: 'time' | 'polyrhythm' | 'euclid';
  /** Ascending instants, and the VOICE_IDS index of the note at each. */
  readonly instants: readonly number[];
  readonly voices: readonly number[];
}

/** The stream in the teacher's words: "the hi-hat time", "the polyrhythm on the ride". */
export function streamWords(stream: Stream): string {
  const named = [...new Set(stream.voices)].map((v) => voiceWord(VOICE_IDS[v] ?? 'snare'));
  return stream.kind === 'time'
    ? `the ${named.join(' and ')} time`
    : `the ${stream.kind} on the ${named.join(' and ')}`;
}

/** True when one hand can play these ascending instants as single strokes, round the loop. */
export function oneHandCanPlay(frame: Frame, instants: readonly number[]): boolean {
  const count = instants.length;
  if (count === 0) return true;
  const { ticks } = frame;
  const single = frame.hand.single;
  let before = (ticks[instants[count - 1] ?? 0] ?? 0) - frame.pace.loop;
  for (let k = 0; k < count; k++) {
    const now = ticks[instants[k] ?? 0] ?? 0;
    if (now - before <= single) return false;
    before = now;
  }
  return true;
}

/**
 * The time the leading hand keeps (common practice: the leading hand rides the time cymbal for
 * the whole pattern; the other hand plays what meets it). Its notes are the pattern's own (source
 * `ostinato`: the ostinato's and the layers') on the card's hand voices with role `time`; notes
 * that other rules add on those voices are not part of it. When two of them strike at one
 * instant, only the first keeps time: the ostinato's voice, else the first layer's, else the
 * first in the card's voice list.
 * The time note right before a phrase's fill (the fill's first stroke at the next instant) is
 * not part of it: the leading hand may leave the cymbal one note early to start the fill (common
 * practice), so a hi-hat time need not cross the arms into a fill on the floor tom.
 * There is none when the card asks for `alternate` sticking or when one hand cannot play the
 * notes as single strokes (then the hands share the time, hand to hand).
 */
export function timeStream(card: StickingCard, frame: Frame, table: NoteTable): Stream | null {
  if (card.sticking.lead === 'alternate') return null;
  const isTime = new Uint8Array(VOICE_IDS.length);
  let primary = -1;
  for (const v of card.voices) {
    if (!isHandVoice(v) || card.roles[v] !== 'time') continue;
    isTime[VOICE_INDEX[v]] = 1;
    if (primary < 0) primary = VOICE_INDEX[v];
  }
  if (primary < 0) return null;
  const layerVoice = card.layers.find((l) => isTime[VOICE_INDEX[l.voice]])?.voice;
  if (layerVoice) primary = VOICE_INDEX[layerVoice];
  const pattern = card.ostinato?.voice;
  if (pattern && isTime[VOICE_INDEX[pattern]]) primary = VOICE_INDEX[pattern];
  const instants: number[] = [];
  const voices: number[] = [];
  const primaryOnly: number[] = [];
  let crowded = false;
  const { start, voice, from } = table;
  const n = start.length - 1;
  const ostinato = FROM_OSTINATO;
  for (let i = 0; i < n; i++) {
    let here = 0;
    for (let k = start[i] ?? 0; k < (start[i + 1] ?? 0); k++) {
      const v = voice[k] ?? 0;
      if (from[k] !== ostinato || !isTime[v]) continue;
      if (v === primary) primaryOnly.push(i);
      if (++here === 1) {
        instants.push(i);
        voices.push(v);
      } else crowded = true;
    }
  }
  let line = crowded ? primaryOnly : instants;
  let lineVoices = crowded ? line.map(() => primary) : voices;
  const beforeFill = (i: number): boolean => {
    const next = (i + 1) % n;
    for (let k = start[next] ?? 0; k < (start[next + 1] ?? 0); k++)
      if (table.notes[k]?.source === 'phrase' && HAND_VOICE[voice[k] ?? 0]) return true;
    return false;
  };
  if (n > 1 && line.some(beforeFill)) {
    const keep = line.map((i) => !beforeFill(i));
    line = line.filter((_, k) => keep[k]);
    lineVoices = lineVoices.filter((_, k) => keep[k]);
  }
  if (line.length === 0 || !oneHandCanPlay(frame, line)) return null;
  return { kind: 'time', instants: line, voices: lineVoices };
}

/**
 * Figures that a polyrhythm or euclid rule places on one hand voice (the notes of one source on
 * one voice, outside the time stream): each is one hand's line when one hand can play it as
 * single strokes round the loop (common practice: a 4:3 on the ride is played by one hand, not
 * alternated). None when the card asks for `alternate` sticking.
 */
export function ruleStreams(
  card: StickingCard,
  frame: Frame,
  table: NoteTable,
  time: Stream | null,
): Stream[] {
  const out: Stream[] = [];
  if (card.sticking.lead === 'alternate') return out;
  const { start, voice, from } = table;
  const n = start.length - 1;
  let found: Map<number, number[]> | null = null;
  let inTime: Uint16Array | null = null;
  const handVoice = HAND_VOICE;
  const poly = FROM_POLYRHYTHM;
  const euclid = FROM_EUCLID;
  for (let i = 0; i < n; i++) {
    for (let k = start[i] ?? 0; k < (start[i + 1] ?? 0); k++) {
      const f = from[k] ?? 0;
      const v = voice[k] ?? 0;
      if ((f !== poly && f !== euclid) || !handVoice[v]) continue;
      if (time && !inTime) inTime = voicesAt(n, time);
      if (inTime && ((inTime[i] ?? 0) >> v) & 1) continue;
      found ??= new Map<number, number[]>();
      const key = f * VOICE_IDS.length + v;
      const list = found.get(key);
      if (list) list.push(i);
      else found.set(key, [i]);
    }
  }
  if (!found) return out;
  for (const f of [FROM_POLYRHYTHM, FROM_EUCLID]) {
    for (const name of card.voices) {
      const v = VOICE_INDEX[name];
      const instants = found.get(f * VOICE_IDS.length + v);
      if (!instants || instants.length < 2 || !oneHandCanPlay(frame, instants)) continue;
      out.push({
        kind: f === FROM_POLYRHYTHM ? 'polyrhythm' : 'euclid',
        instants,
        voices: instants.map(() => v),
      });
    }
  }
  return out;
}

/** Per instant, a bit per VOICE_IDS index of the stream's voices there. */
export function voicesAt(instants: number, ...streams: readonly Stream[]): Uint16Array {
  const mask = new Uint16Array(instants);
  for (const stream of streams) {
    for (let k = 0; k < stream.instants.length; k++) {
      const i = stream.instants[k] ?? 0;
      mask[i] = (mask[i] ?? 0) | (1 << (stream.voices[k] ?? 0));
    }
  }
  return mask;
}
