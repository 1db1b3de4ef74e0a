/**
 * Drill → notation model: everything a renderer (screen, SVG for print) needs to engrave a drill
 * in two-voice drum-set writing, computed without any drawing library.
 *
 * Hands and feet are separate voices (hands stems up, feet stems down, as in two-voice kit
 * writing); each beat of each voice is spelled on its own (see `spellBeat`), so a tuplet bracket
 * never spans beats and beams break at every beat.
 */
import type { DrillBar, DrillHit, Hand, VoiceId } from '../generator/drill';
import { countSyllable } from './counting';
import { headerMarks, type HeaderMarks, type MarkedCard } from './header-marks';
import { spellBeat, type TupletRatio, type WrittenDuration } from './rhythm';
import { STAFF_PLACEMENTS, vexKeyOf, type Layer } from './staff-placement';

/** The part of a drill that notation reads (structurally a subset of the engine's `Drill`). */
export interface NotationSource {
  readonly card: MarkedCard & {
    readonly voices?: readonly VoiceId[];
  };
  readonly bars: readonly DrillBar[];
}

export interface NotationHead {
  readonly voice: VoiceId;
  /** VexFlow key, e.g. `g/5/x2`. */
  readonly key: string;
  /** Staff steps from the middle line (see `StaffPlacement.position`). */
  readonly position: number;
  readonly ghost: boolean;
  readonly accent: boolean;
  /** Open hi-hat: a small circle above. */
  readonly open: boolean;
}

export interface NotationEvent {
  readonly kind: 'note' | 'rest';
  /** Start as a slot of the drill's subdivision of this beat (0-based). */
  readonly slot: number;
  readonly duration: WrittenDuration;
  /** Heads sounding together, lowest on the staff first; empty for a rest. */
  readonly heads: readonly NotationHead[];
  /** Any head accented: the accent is written once for the chord. */
  readonly accent: boolean;
}

export interface LayerBeat {
  readonly layer: Layer;
  readonly tuplet: TupletRatio | null;
  readonly events: readonly NotationEvent[];
  /** Indices into `events` of the notes beamed together (empty when nothing is beamed). */
  readonly beam: readonly number[];
}

export interface NotationBeat {
  /** Beat in the bar, from 1. */
  readonly beat: number;
  readonly subdivision: number;
  readonly layers: readonly LayerBeat[];
  /**
   * Counting syllables, one for every slot of the beat's subdivision (the beat's number first),
   * so a student can count every slot; `sounding` tells whether anything is struck there.
   */
  readonly counts: readonly BeatCount[];
  /** Hands at every instant where a hand strikes, for the voice on the staff from top down. */
  readonly sticking: readonly { readonly slot: number; readonly hands: readonly Hand[] }[];
}

export interface BeatCount {
  readonly slot: number;
  readonly text: string;
  /** A hit sounds on this slot (else it is counted silently). */
  readonly sounding: boolean;
}

export interface NotationBar {
  readonly bar: number;
  readonly tension: number;
  readonly beats: readonly NotationBeat[];
}

export interface NotationModel {
  readonly meter: { readonly beats: number; readonly unit: number };
  /** Voice layers written, hands first. */
  readonly layers: readonly Layer[];
  /** Voices that appear in the drill's card or hits, in staff order from the top. */
  readonly voices: readonly VoiceId[];
  readonly bars: readonly NotationBar[];
  /** The metronome mark and swing marking above the first system. */
  readonly marks: HeaderMarks;
}

/** Build the notation model of a drill. */
export function buildNotation(drill: NotationSource): NotationModel {
  const voices = voicesOf(drill);
  const layers = (['hands', 'feet'] as const).filter((layer) =>
    voices.some((voice) => STAFF_PLACEMENTS[voice].layer === layer),
  );
  const bars = drill.bars.map((bar) => notateBar(bar, layers, drill.card.meter.unit));
  return { meter: drill.card.meter, layers, voices, bars, marks: headerMarks(drill.card) };
}

function voicesOf(drill: NotationSource): VoiceId[] {
  const used = new Set<VoiceId>(drill.card.voices ?? []);
  for (const bar of drill.bars) for (const hit of bar.hits) used.add(hit.voice);
  return [...used].sort((a, b) => STAFF_PLACEMENTS[b].position - STAFF_PLACEMENTS[a].position);
}

function notateBar(bar: DrillBar, layers: readonly Layer[], unit: number): NotationBar {
  const beats = bar.beats.map((subdivision, i) => {
    const beat = i + 1;
    const hits = bar.hits.filter((hit) => hit.beat === beat);
    return notateBeat(beat, subdivision, hits, layers, unit);
  });
  return { bar: bar.bar, tension: bar.tension, beats };
}

function notateBeat(
  beat: number,
  subdivision: number,
  hits: readonly DrillHit[],
  layers: readonly Layer[],
  unit: number,
): NotationBeat {
  const layerBeats = layers.map((layer) =>
    notateLayer(
      layer,
      subdivision,
      hits.filter((h) => STAFF_PLACEMENTS[h.voice].layer === layer),
      unit,
    ),
  );
  const struck = [...new Set(hits.map((hit) => hit.slot))].sort((a, b) => a - b);
  const counts = Array.from({ length: subdivision }, (_, slot) => ({
    slot,
    text: countSyllable(beat, slot, subdivision),
    sounding: struck.includes(slot),
  }));
  const sticking = struck
    .map((slot) => ({ slot, hands: handsAt(hits, slot) }))
    .filter((entry) => entry.hands.length > 0);
  return { beat, subdivision, layers: layerBeats, counts, sticking };
}

function notateLayer(
  layer: Layer,
  subdivision: number,
  hits: readonly DrillHit[],
  unit: number,
): LayerBeat {
  const rhythm = spellBeat(
    subdivision,
    hits.map((hit) => hit.slot),
    unit,
  );
  const toSlot = subdivision / rhythm.grid;
  const events = rhythm.events.map((event): NotationEvent => {
    const slot = event.gridSlot * toSlot;
    const heads = event.kind === 'note' ? headsAt(hits, slot) : [];
    return {
      kind: event.kind,
      slot,
      duration: event.duration,
      heads,
      accent: heads.some((head) => head.accent),
    };
  });
  return { layer, tuplet: rhythm.tuplet, events, beam: beamOf(events) };
}

function headsAt(hits: readonly DrillHit[], slot: number): NotationHead[] {
  return hits
    .filter((hit) => hit.slot === slot)
    .map((hit) => {
      const placement = STAFF_PLACEMENTS[hit.voice];
      return {
        voice: hit.voice,
        key: vexKeyOf(hit.voice),
        position: placement.position,
        ghost: hit.dynamic === 'ghost',
        accent: hit.dynamic === 'accent',
        open: placement.mark === 'open',
      };
    })
    .sort((a, b) => a.position - b.position);
}

/** Hands striking at `slot`, for the voice highest on the staff first. */
function handsAt(hits: readonly DrillHit[], slot: number): Hand[] {
  return hits
    .filter((hit) => hit.slot === slot && hit.hand !== null)
    .sort((a, b) => STAFF_PLACEMENTS[b.voice].position - STAFF_PLACEMENTS[a.voice].position)
    .map((hit) => hit.hand as Hand);
}

/** Flagged notes of one beat share one beam; a single flagged note keeps its flag. */
function beamOf(events: readonly NotationEvent[]): number[] {
  const flagged = events.flatMap((event, i) =>
    event.kind === 'note' && event.duration.value >= 8 ? [i] : [],
  );
  return flagged.length >= 2 ? flagged : [];
}
