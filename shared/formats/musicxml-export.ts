/**
 * Drill → MusicXML 4.0 partwise score, one drum-set part on a five-line percussion staff.
 *
 * The rhythm is the one the notation shows (`buildNotation`): the same notes and rests, beams,
 * tuplets, whole-bar rests and compound-meter grouping, so a score program shows what Tensile
 * prints. Two voices, as in two-voice kit writing: voice 1 the hands (stems up), then a `backup`
 * to the start of the bar, voice 2 the feet (stems down). Each head is an `unpitched` note placed
 * by the notation's staff-placement table (display step and octave read as treble clef), with an
 * x notehead for cymbals and a diamond for the ride bell, ghost notes in parentheses, accents,
 * and the open hi-hat's circle. The first bar carries the metronome mark and the tempo for
 * playback (`sound tempo`, quarter notes a minute).
 *
 * Durations are counted in divisions of a quarter note (the MIDI export's ticks), so every slot
 * of 1–8 a beat is a whole number; each is computed from the written value and the tuplet ratio.
 */
import type { Drill, VoiceId } from '../generator/drill';
import {
  buildNotation,
  groupingLabel,
  type LayerBar,
  type NotationEvent,
} from '../notation/notation-model';
import { headerMarks, type MarkNote } from '../notation/header-marks';
import { STAFF_PLACEMENTS } from '../notation/staff-placement';
import type { TupletRatio } from '../notation/rhythm';
import { GM_DRUM_NOTE, GM_PERCUSSION_CHANNEL } from '../playback/gm-drum-map';
import { swingRatio } from '../playback/swing';
import { barTicks, quarterBpm, ticksPerQuarter } from './timing';

const PART = 'P1';

const TYPE_NAMES: Readonly<Record<number, string>> = {
  1: 'whole',
  2: 'half',
  4: 'quarter',
  8: 'eighth',
  16: '16th',
  32: '32nd',
  64: '64th',
  128: '128th',
};

/** The drill as a MusicXML 4.0 partwise document. */
export function drillToMusicXml(drill: Drill, title: string): string {
  const model = buildNotation(drill);
  const { beats, unit } = drill.card.meter;
  const divisions = ticksPerQuarter(unit);
  const bar = barTicks({ beats, unit });
  const measures = model.bars.map((notated, index) => {
    const lines: string[] = [`<measure number="${notated.bar}">`];
    if (index === 0) {
      lines.push(attributes(divisions, beats, unit));
      lines.push(...tempoDirection(drill));
      const label = groupingLabel(model);
      if (label) lines.push(words(label));
    }
    notated.layers.forEach((layer, i) => {
      if (i > 0) lines.push(`<backup><duration>${bar}</duration></backup>`);
      lines.push(...layerNotes(layer, divisions, bar));
    });
    if (index === model.bars.length - 1) {
      lines.push('<barline location="right"><bar-style>light-heavy</bar-style></barline>');
    }
    lines.push('</measure>');
    return lines.join('\n');
  });
  return [
    '<?xml version="1.0" encoding="UTF-8" standalone="no"?>',
    '<!DOCTYPE score-partwise PUBLIC "-//Recordare//DTD MusicXML 4.0 Partwise//EN" ' +
      '"http://www.musicxml.org/dtds/partwise.dtd">',
    '<score-partwise version="4.0">',
    `<work><work-title>${escapeXml(title)}</work-title></work>`,
    '<identification><encoding><software>Tensile</software></encoding></identification>',
    '<part-list>',
    scorePart(model.voices),
    '</part-list>',
    `<part id="${PART}">`,
    ...measures,
    '</part>',
    '</score-partwise>',
    '',
  ].join('\n');
}

/** The part with one score instrument per voice, each sounding its General MIDI drum key. */
function scorePart(voices: readonly VoiceId[]): string {
  const instruments = voices.map(
    (v) =>
      `<score-instrument id="${instrumentId(v)}">` +
      `<instrument-name>${escapeXml(STAFF_PLACEMENTS[v].label)}</instrument-name>` +
      '</score-instrument>',
  );
  // midi-unpitched counts keys from 1, MIDI from 0.
  const midi = voices.map(
    (v) =>
      `<midi-instrument id="${instrumentId(v)}"><midi-channel>${GM_PERCUSSION_CHANNEL}</midi-channel>` +
      `<midi-unpitched>${GM_DRUM_NOTE[v] + 1}</midi-unpitched></midi-instrument>`,
  );
  return [
    `<score-part id="${PART}">`,
    '<part-name>Drum set</part-name>',
    ...instruments,
    ...midi,
    '</score-part>',
  ].join('\n');
}

function instrumentId(voice: VoiceId): string {
  return `${PART}-${voice}`;
}

function attributes(divisions: number, beats: number, unit: number): string {
  return (
    '<attributes>' +
    `<divisions>${divisions}</divisions>` +
    `<time><beats>${beats}</beats><beat-type>${unit}</beat-type></time>` +
    '<clef><sign>percussion</sign></clef>' +
    '<staff-details><staff-lines>5</staff-lines></staff-details>' +
    '</attributes>'
  );
}

/**
 * The metronome mark the notation prints, and for playback the tempo in quarter notes a minute
 * and the card's swing as MusicXML's long : short pair (2 : 1 for a triplet feel).
 */
function tempoDirection(drill: Drill): string[] {
  const marks = headerMarks(drill.card);
  const sound = `<sound tempo="${decimal(quarterBpm(drill.card.tempo, drill.card.meter.unit))}">${swingOf(drill)}</sound>`;
  const mark = marks.tempo;
  const metronome = mark
    ? `<metronome>${beatUnit(mark.note)}<per-minute>${mark.approximate ? 'c. ' : ''}${mark.bpm}</per-minute></metronome>`
    : '<words/>';
  const lines = [
    `<direction placement="above"><direction-type>${metronome}</direction-type>${sound}</direction>`,
  ];
  if (marks.swing) lines.push(words(marks.swing.words));
  return lines;
}

function swingOf(drill: Drill): string {
  const swing = drill.card.swing;
  if (!swing) return '';
  const { num, den } = swingRatio(swing.ratio);
  const type = swing.unit === 16 ? '16th' : 'eighth';
  return `<swing><first>${num}</first><second>${den - num}</second><swing-type>${type}</swing-type></swing>`;
}

function beatUnit(note: MarkNote): string {
  return `<beat-unit>${TYPE_NAMES[note.value]}</beat-unit>${note.dotted ? '<beat-unit-dot/>' : ''}`;
}

function words(text: string): string {
  return `<direction placement="above"><direction-type><words>${escapeXml(text)}</words></direction-type></direction>`;
}

/** The notes and rests of one voice layer in one bar. */
function layerNotes(layer: LayerBar, divisions: number, bar: number): string[] {
  const voice = layer.layer === 'hands' ? 1 : 2;
  const stem = layer.layer === 'hands' ? 'up' : 'down';
  const tupletOf = new Map<
    number,
    { ratio: TupletRatio; start: boolean; stop: boolean; shown: boolean; bracketed: boolean }
  >();
  for (const tuplet of layer.tuplets) {
    tuplet.events.forEach((index, i) =>
      tupletOf.set(index, {
        ratio: tuplet.ratio,
        start: i === 0,
        stop: i === tuplet.events.length - 1,
        shown: tuplet.shown,
        bracketed: tuplet.bracketed,
      }),
    );
  }
  const beamOf = beamValues(layer);
  const out: string[] = [];
  layer.events.forEach((event, index) => {
    const tuplet = tupletOf.get(index) ?? null;
    const duration = event.barRest ? bar : durationOf(event, tuplet?.ratio ?? null, divisions);
    const common = {
      duration,
      voice,
      stem,
      event,
      tuplet,
      beams: beamOf.get(index) ?? [],
    };
    if (event.kind === 'rest') out.push(restNote(common));
    else event.heads.forEach((_, h) => out.push(headNote(common, h)));
  });
  return out;
}

interface NoteParts {
  readonly duration: number;
  readonly voice: number;
  readonly stem: string;
  readonly event: NotationEvent;
  readonly tuplet: {
    ratio: TupletRatio;
    start: boolean;
    stop: boolean;
    shown: boolean;
    bracketed: boolean;
  } | null;
  readonly beams: readonly string[];
}

function restNote(p: NoteParts): string {
  if (p.event.barRest) {
    return `<note><rest measure="yes"/><duration>${p.duration}</duration><voice>${p.voice}</voice></note>`;
  }
  const notations = tupletNotation(p.tuplet);
  return [
    '<note><rest/>',
    `<duration>${p.duration}</duration>`,
    `<voice>${p.voice}</voice>`,
    typeAndDots(p.event),
    timeModification(p.tuplet?.ratio ?? null),
    notations ? `<notations>${notations}</notations>` : '',
    '</note>',
  ].join('');
}

/** One head of a note or chord; the first head carries the beams, tuplet and accent. */
function headNote(p: NoteParts, h: number): string {
  const head = p.event.heads[h]!;
  const placement = STAFF_PLACEMENTS[head.voice];
  const first = h === 0;
  const shape = placement.notehead === 'normal' ? 'normal' : placement.notehead;
  const notehead =
    head.ghost || shape !== 'normal'
      ? `<notehead${head.ghost ? ' parentheses="yes"' : ''}>${shape}</notehead>`
      : '';
  const notations = [
    first ? tupletNotation(p.tuplet) : '',
    first && p.event.accent
      ? `<articulations><accent placement="${p.voice === 1 ? 'above' : 'below'}"/></articulations>`
      : '',
    head.open ? '<technical><open/></technical>' : '',
  ].join('');
  return [
    '<note>',
    first ? '' : '<chord/>',
    `<unpitched><display-step>${placement.displayStep}</display-step>` +
      `<display-octave>${placement.displayOctave}</display-octave></unpitched>`,
    `<duration>${p.duration}</duration>`,
    `<instrument id="${instrumentId(head.voice)}"/>`,
    `<voice>${p.voice}</voice>`,
    typeAndDots(p.event),
    timeModification(p.tuplet?.ratio ?? null),
    `<stem>${p.stem}</stem>`,
    notehead,
    first ? p.beams.map((b, i) => `<beam number="${i + 1}">${b}</beam>`).join('') : '',
    notations ? `<notations>${notations}</notations>` : '',
    '</note>',
  ].join('');
}

function typeAndDots(event: NotationEvent): string {
  const type = TYPE_NAMES[event.duration.value];
  if (!type) throw new Error(`No MusicXML note type for 1/${event.duration.value}`);
  return `<type>${type}</type>${event.duration.dots ? '<dot/>' : ''}`;
}

function timeModification(ratio: TupletRatio | null): string {
  if (!ratio) return '';
  return (
    '<time-modification>' +
    `<actual-notes>${ratio.numNotes}</actual-notes><normal-notes>${ratio.notesOccupied}</normal-notes>` +
    '</time-modification>'
  );
}

function tupletNotation(
  tuplet: { start: boolean; stop: boolean; shown: boolean; bracketed: boolean } | null,
): string {
  if (!tuplet) return '';
  const shown = !tuplet.shown
    ? 'bracket="no" show-number="none"'
    : `bracket="${tuplet.bracketed ? 'yes' : 'no'}" show-number="actual"`;
  return (
    (tuplet.start ? `<tuplet type="start" ${shown}/>` : '') +
    (tuplet.stop ? '<tuplet type="stop"/>' : '')
  );
}

/**
 * A note's length in divisions from its written value, dot and tuplet ratio, computed in whole
 * numbers: divisions × 4 / value, × 3/2 when dotted, × normal / actual in a tuplet.
 */
export function durationOf(
  event: Pick<NotationEvent, 'duration'>,
  ratio: TupletRatio | null,
  divisions: number,
): number {
  const { value, dots } = event.duration;
  const numerator = divisions * 4 * (dots ? 3 : 2) * (ratio?.notesOccupied ?? 1);
  const denominator = value * 2 * (ratio?.numNotes ?? 1);
  if (numerator % denominator !== 0) {
    throw new Error(`A 1/${value} note is not a whole number of ${divisions} divisions.`);
  }
  return numerator / denominator;
}

const BEAM_LEVELS: Readonly<Record<number, number>> = { 8: 1, 16: 2, 32: 3, 64: 4, 128: 5 };

/**
 * MusicXML `beam` values for every beamed note of a layer, one per beam level: the primary beam
 * joins the whole group; a shorter level joins neighbours that both have it, except across a
 * secondary-beam break; a note alone at its level gets a hook towards its partner.
 */
function beamValues(layer: LayerBar): Map<number, string[]> {
  const values = new Map<number, string[]>();
  for (const beam of layer.beams) {
    const levels = beam.notes.map((i) => BEAM_LEVELS[layer.events[i]!.duration.value] ?? 0);
    const last = beam.notes.length - 1;
    beam.notes.forEach((eventIndex, p) => {
      const own: string[] = [];
      for (let level = 1; level <= levels[p]!; level++) {
        const secondary = level > 1;
        const left =
          p > 0 && levels[p - 1]! >= level && !(secondary && beam.breaks.includes(p - 1));
        const right =
          p < last && levels[p + 1]! >= level && !(secondary && beam.breaks.includes(p));
        if (left && right) own.push('continue');
        else if (right) own.push('begin');
        else if (left) own.push('end');
        else own.push(p === 0 || beam.breaks.includes(p - 1) ? 'forward hook' : 'backward hook');
      }
      values.set(eventIndex, own);
    });
  }
  return values;
}

function decimal(n: number): string {
  return String(Math.round(n * 10000) / 10000);
}

export function escapeXml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}
