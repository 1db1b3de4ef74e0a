/**
 * Drill → notation model: everything a renderer (screen, SVG for print) needs to engrave a drill
 * in two-voice drum-set writing, computed without any drawing library.
 *
 * Hands and feet are separate voices (hands stems up, feet stems down, as in two-voice kit
 * writing). Each voice is spelled beat by beat (see `spellBeat`), so a tuplet bracket never spans
 * beats and beams break at every beat; except in grouped eighth meters (6/8, 12/8, 7/8 as
 * 2+2+3 …), where each group of beats is spelled and beamed as one unit (see `spellGroup`): 6/8
 * eighths are beamed in threes, never left as single flagged eighths, and a silent dotted-quarter
 * beat is one dotted-quarter rest. Beams and rests so show the grouping.
 */
import type { DrillBar, DrillHit, Hand, VoiceId } from '../generator/drill';
import { defaultGrouping } from '../generator/meter';
import { countBar } from './counting';
import { headerMarks, type HeaderMarks, type MarkedCard } from './header-marks';
import {
  spellBeat,
  spellGroup,
  type RhythmEvent,
  type TupletRatio,
  type WrittenDuration,
} from './rhythm';
import { STAFF_PLACEMENTS, vexKeyOf, type Layer } from './staff-placement';
import { syncopatedInstants, type Instant } from './syncopation';
import { polyrhythmGroups, type PolyrhythmGroup, type PolyrhythmSource } from './polyrhythm';
import { carriedIntoFirstBar, type CarriedNote, type SeamRuleSource } from './seam';

/** The meter as notation reads it. */
export interface NotationMeter {
  readonly beats: number;
  readonly unit: number;
  /** Beats per group (`meter.grouping`); left out, the meter's default grouping is used. */
  readonly grouping?: readonly number[] | undefined;
}

/** The part of a drill that notation reads (structurally a subset of the engine's `Drill`). */
export interface NotationSource {
  readonly card: MarkedCard & {
    readonly meter: NotationMeter;
    readonly voices?: readonly VoiceId[];
    readonly rules?: readonly (PolyrhythmSource & SeamRuleSource)[];
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
  /** Placed by the ostinato: it keeps time, and the tension is read without it. */
  readonly keepsTime: boolean;
}

export interface NotationEvent {
  readonly kind: 'note' | 'rest';
  /** The beat (from 1) the note or rest starts in. */
  readonly beat: number;
  /** Start as a slot of the drill's subdivision of that beat (0-based). */
  readonly slot: number;
  readonly duration: WrittenDuration;
  /** Heads sounding together, lowest on the staff first; empty for a rest. */
  readonly heads: readonly NotationHead[];
  /** Any head accented: the accent is written once for the chord. */
  readonly accent: boolean;
  /** A whole-bar rest: the layer is silent for the whole bar (drawn centred, in any meter). */
  readonly barRest?: boolean;
}

/** Notes of one voice joined by a beam. */
export interface NotationBeam {
  /** Indices into the layer's `events` (notes only), in time order. */
  readonly notes: readonly number[];
  /**
   * Positions in `notes` after which the secondary beams (sixteenths and shorter) break, so a
   * dotted-quarter group of sixteenths reads as its three eighths.
   */
  readonly breaks: readonly number[];
}

/** A tuplet bracket over some events of one voice (one beat's, never across beats). */
export interface NotationTuplet {
  readonly ratio: TupletRatio;
  /** Indices into the layer's `events`, in time order. */
  readonly events: readonly number[];
  /**
   * Whether the bracket and its number are printed. In a drill in quintuplets (sextuplets,
   * septuplets) throughout, after "sim." only the groups that do not count themselves are (see
   * `simileTuplets`); the others still time their notes. Triplets keep every number (see `keepsNumber`).
   */
  readonly shown: boolean;
  /** "sim." follows this bracket: the ones after it are understood. */
  readonly simile: boolean;
  /**
   * Whether the bracket line is drawn with the number. A group whose one beam spans exactly its
   * notes, from its first event to its last, shows the number alone (see `bracketedTuplet`).
   */
  readonly bracketed: boolean;
}

/** One voice layer of one bar. */
export interface LayerBar {
  readonly layer: Layer;
  /** Notes and rests in time order; their lengths fill the bar. */
  readonly events: readonly NotationEvent[];
  readonly beams: readonly NotationBeam[];
  readonly tuplets: readonly NotationTuplet[];
}

export interface NotationBeat {
  /** Beat in the bar, from 1. */
  readonly beat: number;
  readonly subdivision: number;
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
  /** Printed bold: a counted beat's number, or a group's first count (see `countBar`). */
  readonly strong: boolean;
  /** A hit sounds on this slot (else it is counted silently). */
  readonly sounding: boolean;
}

export interface NotationBar {
  readonly bar: number;
  readonly tension: number;
  readonly beats: readonly NotationBeat[];
  /** One entry per voice layer of the model, in the model's order. */
  readonly layers: readonly LayerBar[];
  /** The instants whose notes make the bar tense (see `syncopatedInstants`), in time order. */
  readonly syncopated: readonly Instant[];
  /** Bar 1 only: notes the loop carries over from its last bar (see `carriedIntoFirstBar`). */
  readonly carried?: readonly CarriedNote[];
}

export interface NotationModel {
  readonly meter: {
    readonly beats: number;
    readonly unit: number;
    /** Beats per group, or null where the beats stand alone (x/4, and x/8 bars of 1–3 beats). */
    readonly grouping: readonly number[] | null;
  };
  /** Voice layers written, hands first. */
  readonly layers: readonly Layer[];
  /** Voices that appear in the drill's card or hits, in staff order from the top. */
  readonly voices: readonly VoiceId[];
  readonly bars: readonly NotationBar[];
  /** The metronome mark and swing marking above the first system. */
  readonly marks: HeaderMarks;
  /** Each cycle of a polyrhythm rule, bracketed with its ratio. */
  readonly polyrhythms: readonly PolyrhythmGroup[];
}

/** Build the notation model of a drill. */
export function buildNotation(drill: NotationSource): NotationModel {
  const voices = voicesOf(drill);
  const layers = (['hands', 'feet'] as const).filter((layer) =>
    voices.some((voice) => STAFF_PLACEMENTS[voice].layer === layer),
  );
  const { beats, unit } = drill.card.meter;
  const given = drill.card.meter.grouping;
  const grouping = given && given.length > 0 ? given.slice() : defaultGrouping({ beats, unit });
  const meter = { beats, unit, grouping };
  const bars = drill.bars.map((bar) => notateBar(bar, layers, meter));
  const carried = carriedIntoFirstBar(drill.card.rules ?? [], drill.bars);
  return {
    meter,
    layers,
    voices,
    bars: simileTuplets(bars).map((bar, i) =>
      i === 0 && carried.length > 0 ? { ...bar, carried } : bar,
    ),
    marks: headerMarks(drill.card),
    polyrhythms: polyrhythmGroups(drill.card.rules ?? [], drill.bars, beats),
  };
}

/**
 * A drill in one tuplet throughout (every beat in five, or in six or seven) writes its number
 * on each voice's groups until "sim." is marked, then only where a group does not count itself
 * (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets": once a tuplet pattern is
 * established the numbers may be dropped, but only where that is unambiguous; from memory).
 * A group counts itself when it plays all its values one by one (five sixteenth notes): a group
 * with a rest, a combined rest or a longer value reads as plain sixteenths without its "5". So
 * "sim." follows the first group after which every group of the voice counts itself (and whose
 * next group follows it in its bar): no number comes back after it, and where the voice's last
 * group does not count itself there is no "sim." and every group keeps its number. "Sim." rather
 * than a number at the start of each system: the model knows no systems, and the screen, the
 * phone and the page break the same drill differently. Each voice is a part of its own here: a
 * marking over the hands alone would say nothing of the kick. Other drills keep every number,
 * and so do triplets (see `keepsNumber`).
 */
function simileTuplets(bars: NotationBar[]): NotationBar[] {
  const first = bars[0]?.beats[0]?.subdivision ?? 1;
  const tuplet = (first & (first - 1)) !== 0;
  const uniform = bars.every((bar) => bar.beats.every((beat) => beat.subdivision === first));
  if (!tuplet || !uniform) return bars;
  // Per voice, the group "sim." follows (as bar and group): the first after which every group
  // counts itself, and whose next group is the very next in its bar. None where no group is.
  const simileAt = new Map<string, { readonly bar: number; readonly group: number }>();
  for (const layerName of new Set(bars.flatMap((bar) => bar.layers.map((l) => l.layer)))) {
    const groups = bars.flatMap((bar, b) =>
      bar.layers
        .filter((layer) => layer.layer === layerName)
        .flatMap((layer) =>
          layer.tuplets.map((tuplet, i) => ({
            at: { bar: b, group: i },
            counts: keepsNumber(tuplet) || countsItself(tuplet, layer.events),
            adjacent:
              layer.tuplets[i + 1]?.events[0] === tuplet.events[tuplet.events.length - 1]! + 1,
          })),
        ),
    );
    let from = 0;
    groups.forEach((group, g) => {
      if (!group.counts) from = g;
    });
    const after = groups.findIndex((group, g) => g >= from && group.adjacent);
    if (after >= 0) simileAt.set(layerName, groups[after]!.at);
  }
  return bars.map((bar, b) => ({
    ...bar,
    layers: bar.layers.map((layer) => {
      const at = simileAt.get(layer.layer);
      const { bar: simileBar, group: simileGroup } = at ?? { bar: Infinity, group: Infinity };
      return {
        ...layer,
        tuplets: layer.tuplets.map((tuplet, i) => {
          if (keepsNumber(tuplet)) return tuplet;
          const past = b > simileBar || (b === simileBar && i > simileGroup);
          const isSimile = b === simileBar && i === simileGroup;
          return { ...tuplet, shown: !past, simile: isSimile };
        }),
      };
    }),
  }));
}

/**
 * Whether a group plays every value of its tuplet (five sixteenth notes under a "5"). A group
 * with a rest keeps its number: four sixteenths and a rest read as a plain beat (common practice).
 */
function countsItself(tuplet: NotationTuplet, events: readonly NotationEvent[]): boolean {
  return (
    tuplet.events.length === tuplet.ratio.numNotes &&
    tuplet.events.every((i) => events[i]!.kind === 'note')
  );
}

/**
 * Triplets keep every "3": a triplet is written with values longer than its grid (a quarter and
 * an eighth, a quarter rest and an eighth), the commonest figures of plain time, and a shuffle's
 * quarter-and-eighth without its number reads as straight eighths (common practice: shuffle parts
 * written in triplets mark every group; a group under one beam keeps its number alone, see
 * `bracketedTuplet`). Quintuplets, sextuplets and septuplets are written in their grid value
 * throughout (see `spellBeat`), so every group shows its count of values and "sim." serves.
 */
function keepsNumber(tuplet: NotationTuplet): boolean {
  return tuplet.ratio.numNotes === 3;
}

/**
 * Whether a tuplet needs its bracket line: not where one beam joins exactly its notes and the
 * group starts and ends with a note of one value, since the beam then shows the group and the
 * number alone names it (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets": a bracket is
 * needed only where a beam does not show the tuplet's extent; from memory). Rests at either end,
 * mixed values or notes split over beams keep the bracket.
 */
function bracketedTuplet(
  events: readonly NotationEvent[],
  indices: readonly number[],
  beams: readonly NotationBeam[],
): boolean {
  const firstEvent = events[indices[0]!];
  const lastEvent = events[indices[indices.length - 1]!];
  if (firstEvent?.kind !== 'note' || lastEvent?.kind !== 'note') return true;
  const notes = indices.filter((i) => events[i]!.kind === 'note');
  const value = events[notes[0]!]!.duration;
  if (notes.some((i) => events[i]!.duration.value !== value.value || events[i]!.duration.dots))
    return true;
  const beam = beams.find((b) => b.notes.includes(notes[0]!));
  return !beam || beam.notes.length !== notes.length || beam.notes.some((n, i) => n !== notes[i]);
}

/** "2+2+3" for an uneven grouping; null where the meter says it (even groups, or none). */
export function groupingLabel(model: Pick<NotationModel, 'meter'>): string | null {
  const grouping = model.meter.grouping;
  if (!grouping || new Set(grouping).size < 2) return null;
  return grouping.join('+');
}

function voicesOf(drill: NotationSource): VoiceId[] {
  const used = new Set<VoiceId>(drill.card.voices ?? []);
  for (const bar of drill.bars) for (const hit of bar.hits) used.add(hit.voice);
  return [...used].sort((a, b) => STAFF_PLACEMENTS[b].position - STAFF_PLACEMENTS[a].position);
}

function notateBar(
  bar: DrillBar,
  layers: readonly Layer[],
  meter: NotationModel['meter'],
): NotationBar {
  const syllables = countBar(bar.beats, meter);
  const beats = bar.beats.map((subdivision, i) => {
    const beat = i + 1;
    const hits = bar.hits.filter((hit) => hit.beat === beat);
    const struck = new Set(hits.map((hit) => hit.slot));
    const counts = (syllables[i] ?? []).map((syllable, slot) => ({
      slot,
      ...syllable,
      sounding: struck.has(slot),
    }));
    const sticking = [...struck]
      .sort((a, b) => a - b)
      .map((slot) => ({ slot, hands: handsAt(hits, slot) }))
      .filter((entry) => entry.hands.length > 0);
    return { beat, subdivision, counts, sticking };
  });
  const spans = beamSpans(bar.beats, meter);
  // An uneven meter (7/8 as 2+2+3) is counted eighth by eighth, 6/8 and 9/8 by the dotted
  // quarter (see `countBar`).
  const countedByBeat = meter.grouping !== null && meter.grouping.some((size) => size !== 3);
  const layerBars = layers.map((layer) =>
    notateLayer(
      layer,
      bar,
      spans,
      { unit: meter.unit, countedByBeat },
      bar.hits.filter((h) => STAFF_PLACEMENTS[h.voice].layer === layer),
    ),
  );
  return {
    bar: bar.bar,
    tension: bar.tension,
    beats,
    layers: layerBars,
    syncopated: syncopatedInstants(bar, meter.grouping),
  };
}

/** A run of beats spelled and beamed together: one group of a grouped eighth meter, or a beat. */
interface Span {
  /** First beat, 0-based. */
  readonly first: number;
  readonly count: number;
  /** Spelled as one unit (every beat of the group on one binary subdivision). */
  readonly together: boolean;
}

/**
 * The spans of a bar. Eighth and sixteenth meters group their beats (the meter's grouping; a bar
 * of one to three beats without one is a single group, as 3/8's three eighths are beamed
 * together); quarter and half-note beats each stand alone. A group is spelled as one unit when
 * all its beats share one binary subdivision; a group holding tuplets is spelled beat by beat.
 */
function beamSpans(beats: readonly number[], meter: NotationModel['meter']): Span[] {
  const groups = meter.unit >= 8 ? (meter.grouping ?? [beats.length]) : beats.map(() => 1);
  const spans: Span[] = [];
  let first = 0;
  for (const count of groups) {
    const slots = beats.slice(first, first + count);
    const binary = slots.every((n) => n === slots[0] && (n & (n - 1)) === 0);
    if (count > 1 && binary) spans.push({ first, count, together: true });
    else
      for (let b = first; b < first + count; b++)
        spans.push({ first: b, count: 1, together: false });
    first += count;
  }
  return spans;
}

function notateLayer(
  layer: Layer,
  bar: DrillBar,
  spans: readonly Span[],
  { unit, countedByBeat }: { readonly unit: number; readonly countedByBeat: boolean },
  hits: readonly DrillHit[],
): LayerBar {
  const events: NotationEvent[] = [];
  const beams: NotationBeam[] = [];
  const tuplets: NotationTuplet[] = [];
  if (hits.length === 0) {
    // A voice silent for a whole bar gets one whole-bar rest, whatever the meter (E. Gould,
    // "Behind Bars", Faber Music 2011, ch. "Rests": the semibreve rest fills any empty bar; from
    // memory).
    const rest = { value: 1, dots: 0 } as const;
    events.push({ kind: 'rest', beat: 1, slot: 0, duration: rest, heads: [], accent: false });
    return { layer, events: [{ ...events[0]!, barRest: true }], beams, tuplets };
  }
  const silent = (beat: number) => !hits.some((hit) => hit.beat === beat);
  for (let s = 0; s < spans.length; s++) {
    const span = spans[s]!;
    const from = events.length;
    let ratio: TupletRatio | null = null;
    if (halfBarRest(span, bar.beats, unit, silent)) {
      // Two silent beats making a half of a 4/4 bar (beats 1–2 or 3–4) take one half rest; never
      // across the middle of the bar (E. Gould, "Behind Bars", ch. "Rests", from memory; common
      // practice).
      events.push({
        kind: 'rest',
        beat: span.first + 1,
        slot: 0,
        duration: { value: 2, dots: 0 },
        heads: [],
        accent: false,
      });
      s++;
      continue;
    }
    if (span.together) {
      const slots = bar.beats[span.first] ?? 1;
      const inSpan = hits.filter(
        (hit) => hit.beat > span.first && hit.beat <= span.first + span.count,
      );
      const rhythm = spellGroup(
        span.count,
        slots,
        inSpan.map((hit) => (hit.beat - 1 - span.first) * slots + hit.slot),
        unit,
        countedByBeat,
      );
      const toSlot = slots / rhythm.grid;
      for (const event of rhythm.events) {
        const beat = span.first + Math.floor(event.gridSlot / rhythm.grid) + 1;
        const slot = (event.gridSlot % rhythm.grid) * toSlot;
        events.push(eventOf(event, beat, slot, inSpan));
      }
    } else {
      const beat = span.first + 1;
      const subdivision = bar.beats[span.first] ?? 1;
      const inBeat = hits.filter((hit) => hit.beat === beat);
      const rhythm = spellBeat(
        subdivision,
        inBeat.map((hit) => hit.slot),
        unit,
      );
      const toSlot = subdivision / rhythm.grid;
      for (const event of rhythm.events)
        events.push(eventOf(event, beat, event.gridSlot * toSlot, inBeat));
      ratio = rhythm.tuplet;
    }
    const spanBeams = beamsOf(events, from, span.count === 3 || span.count === 4);
    beams.push(...spanBeams);
    if (ratio) {
      const indices = Array.from({ length: events.length - from }, (_, i) => from + i);
      const bracketed = bracketedTuplet(events, indices, spanBeams);
      tuplets.push({ ratio, events: indices, shown: true, simile: false, bracketed });
    }
  }
  return { layer, events, beams, tuplets };
}

/** Whether `span` opens a silent half of a 4/4 bar (beats 1–2 or 3–4, quarter-note beats). */
function halfBarRest(
  span: Span,
  beats: readonly number[],
  unit: number,
  silent: (beat: number) => boolean,
): boolean {
  if (unit !== 4 || beats.length !== 4 || span.together || span.first % 2 !== 0) return false;
  return silent(span.first + 1) && silent(span.first + 2);
}

function eventOf(
  event: RhythmEvent,
  beat: number,
  slot: number,
  hits: readonly DrillHit[],
): NotationEvent {
  const heads =
    event.kind === 'note'
      ? headsAt(
          hits.filter((hit) => hit.beat === beat),
          slot,
        )
      : [];
  return {
    kind: event.kind,
    beat,
    slot,
    duration: event.duration,
    heads,
    accent: heads.some((head) => head.accent),
  };
}

/**
 * Beams over the events from `from` on (one span): each run of flagged notes (eighths and
 * shorter) is beamed, over any rests between them; a quarter or longer note ends the run, and a
 * lone flagged note keeps its flag. With `breakAtBeats`, secondary beams break where a new beat
 * begins, so sixteenths in a group of three eighths read as three pairs (common practice; the
 * VexFlow documentation of `Beam.setPartialBeamSideAt` calls the three-eighths reading of 6/8
 * the typical one).
 */
function beamsOf(
  events: readonly NotationEvent[],
  from: number,
  breakAtBeats: boolean,
): NotationBeam[] {
  const beams: NotationBeam[] = [];
  let run: number[] = [];
  const close = (): void => {
    if (run.length >= 2) {
      const breaks = breakAtBeats
        ? run.slice(0, -1).flatMap((index, i) => {
            const next = run[i + 1]!;
            return events[next]!.beat !== events[index]!.beat ? [i] : [];
          })
        : [];
      beams.push({ notes: run, breaks });
    }
    run = [];
  };
  for (let i = from; i < events.length; i++) {
    const event = events[i]!;
    if (event.kind === 'rest') continue;
    if (event.duration.value >= 8) run.push(i);
    else close();
  }
  close();
  return beams;
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
        keepsTime: hit.source === 'ostinato',
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
