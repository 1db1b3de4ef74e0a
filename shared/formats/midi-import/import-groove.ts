import {
  ENGINE_VERSION,
  drillDifficulty,
  generateDrill,
  measureTension,
  parseRuleCard,
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
  type Drill,
  type DrillBar,
  type DrillHit,
  type Dynamic,
  type RuleCard,
  type VoiceId,
  VOICE_IDS,
} from '../../generator/index';
import { MidiImportError } from './errors';
import { GM_PERCUSSION_CHANNEL_INDEX, voiceOfKey } from './gm-percussion';
import {
  cardGrid,
  inferBackbeat,
  inferOstinato,
  TIME_CYMBALS,
  type DraftCard,
  type PlainBar,
  type PlainHit,
} from './infer-card';
import { fitBeat } from './quantise';
import { readMidi, type MidiNote, type MidiTrackSummary } from './read-midi';
import { byPlace, sourceOf, stickInstant } from './sources';
import { Timeline, type Meter } from './timeline';

/** Bars a groove may have: as many as a rule card. */
export const MAX_BARS = 64;
/** The seed an imported drill records: it was read from a file, not drawn. */
export const IMPORT_SEED = 'imported';

/**
 * Velocity bounds of the three dynamics: the midpoints between the velocities Tensile's own
 * playback gives ghost notes, normal strokes and accents (38, 91 and 127 of 127), so a file
 * Tensile wrote reads back with its dynamics.
 */
export const GHOST_BELOW = 64;
export const ACCENT_FROM = 109;

export interface MidiImportOptions {
  /** Index of the track that holds the drums; by default every track on channel 10. */
  readonly track?: number;
}

/** How far the notes of one beat lay from the slots they were put on (the worst of them). */
export interface BeatResidual {
  readonly bar: number;
  readonly beat: number;
  readonly slots: number;
  readonly notes: number;
  /** As a share of the beat. */
  readonly beats: number;
  readonly ms: number;
}

export interface MidiImport {
  readonly drill: Drill;
  /** The inferred rule card, normalised (what `parseRuleCard` returns); generates variations. */
  readonly card: RuleCard;
  readonly residuals: readonly BeatResidual[];
  /** Each bar's tension, as measured by the card's measure. */
  readonly tensions: readonly number[];
  readonly tracks: readonly MidiTrackSummary[];
  /** The track read, or null when every channel-10 track was. */
  readonly track: number | null;
  readonly warnings: readonly string[];
}

const dynamicOf = (velocity: number): Dynamic =>
  velocity < GHOST_BELOW ? 'ghost' : velocity >= ACCENT_FROM ? 'accent' : 'normal';
const round = (x: number, places: number): number => Number(x.toFixed(places));
const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/**
 * Reads a Standard MIDI File's drum part as a drill and a rule card that generates drills like
 * it. Pure: bytes in, data out. Throws only `MidiImportError`, with a reason a teacher can read.
 */
export function importMidiGroove(bytes: Uint8Array, options: MidiImportOptions = {}): MidiImport {
  const file = readMidi(bytes);
  const warnings: string[] = [];
  const tracks = file.tracks.map((t) => t.summary);
  if (file.tracks.every((t) => t.notes.length === 0)) {
    throw new MidiImportError('no_notes', 'The file holds no notes.');
  }
  const notes = chooseNotes(file.tracks, options.track);
  const mapped = notes.flatMap((note) => {
    const voice = voiceOfKey(note.key);
    return voice ? [{ ...note, voice }] : [];
  });
  if (mapped.length === 0) {
    throw new MidiImportError(
      'no_drum_notes',
      'None of the notes is a drum-set sound of the General MIDI percussion key map.',
    );
  }
  if (mapped.length < notes.length) {
    const keys = [...new Set(notes.filter((n) => !voiceOfKey(n.key)).map((n) => n.key))];
    warnings.push(
      `Left out ${plural(notes.length - mapped.length, 'note')} whose keys (${keys.slice(0, 8).join(', ')}) are not drum-set sounds in General MIDI.`,
    );
  }

  const timeline = new Timeline(file.ppq, file.meters, file.tempos);
  // Each note's bar and beat in the file (an early note belongs to the next beat).
  const placed = mapped.map((n) => ({ ...n, ...timeline.place(n.ticks) }));
  // Loops, not Math.min(...): a 1 MB file can hold more notes than a call takes arguments.
  let firstBar = Infinity;
  let lastBar = -Infinity;
  for (const n of placed) {
    firstBar = Math.min(firstBar, n.bar);
    lastBar = Math.max(lastBar, n.bar);
  }
  const barCount = lastBar - firstBar + 1;
  if (barCount > MAX_BARS) {
    throw new MidiImportError(
      'too_long',
      `The groove runs ${barCount} bars; a drill holds at most ${MAX_BARS}. Cut the file to ${MAX_BARS} bars or fewer.`,
    );
  }
  const meter = checkedMeter(timeline.meterOf(firstBar, lastBar), file.meters.length, warnings);
  const quarterBpm = grooveTempo(timeline, firstBar, lastBar, warnings);
  const unitBpm = (quarterBpm * meter.unit) / 4;
  const tempo = Math.min(320, Math.max(20, Math.round(unitBpm)));
  if (tempo !== Math.round(unitBpm)) {
    warnings.push(`The tempo, ${round(unitBpm, 1)} beats a minute, is held to 20–320: ${tempo}.`);
  }
  if (firstBar > 0)
    warnings.push(`Left out ${plural(firstBar, 'empty bar')} before the first note.`);
  // A beat's residual in milliseconds at the tempo in force where that beat starts.
  const msPerBeat = (bar: number, beat: number): number => {
    const start = timeline.barStart(firstBar + bar) + beat * timeline.beatTicksAt(firstBar + bar);
    return 60_000 / ((timeline.tempoAt(start) * meter.unit) / 4);
  };
  const grooveNotes = placed.map((n) => ({
    ...n,
    index: (n.bar - firstBar) * meter.beats + n.beat,
  }));

  const { bars, residuals, merged } = quantise(grooveNotes, barCount, meter.beats, msPerBeat);
  if (merged > 0) {
    warnings.push(
      `${plural(merged, 'note')} fell on a slot its voice already played and merged with it.`,
    );
  }

  const card = chooseCard(bars, meter, tempo, warnings);
  const drillBars = finishBars(bars, card, warnings);
  const drill: Omit<Drill, 'difficulty'> = {
    engine: ENGINE_VERSION,
    seed: IMPORT_SEED,
    card,
    // An imported groove has no card reach: its bars read on the measure's own 0..1 scale.
    tensionReach: { least: 0, most: 1 },
    variety: 'single',
    bars: drillBars,
  };
  return {
    drill: { ...drill, difficulty: drillDifficulty(drill) },
    card,
    residuals,
    tensions: drillBars.map((bar) => bar.tension),
    tracks,
    track: options.track ?? null,
    warnings,
  };
}

function chooseNotes(
  tracks: ReturnType<typeof readMidi>['tracks'],
  track: number | undefined,
): MidiNote[] {
  if (track !== undefined) {
    const chosen = Number.isInteger(track) ? tracks[track] : undefined;
    if (!chosen) {
      throw new MidiImportError(
        'no_such_track',
        `There is no track ${track}: the file's tracks are numbered 0 to ${tracks.length - 1}.`,
      );
    }
    if (chosen.notes.length === 0) {
      throw new MidiImportError('no_notes', `Track ${track} holds no notes.`);
    }
    return chosen.notes;
  }
  const drums = tracks
    .filter((t) => t.summary.channel === GM_PERCUSSION_CHANNEL_INDEX + 1)
    .flatMap((t) => t.notes);
  if (drums.length === 0) {
    throw new MidiImportError(
      'no_drum_notes',
      'No notes are on channel 10, the General MIDI drum channel: choose the track that holds the drums.',
    );
  }
  return drums;
}

/** The groove's meter, if a drill can have it; says when the file gives none. */
function checkedMeter(meter: Meter, events: number, warnings: string[]): Meter {
  if (events === 0) {
    // Standard MIDI File 1.1: without a time-signature event a file is in 4/4.
    warnings.push('The file gives no time signature: read as 4/4, as the MIDI file standard says.');
  }
  const { beats, unit } = meter;
  if (!(beats >= 1 && beats <= 15 && [2, 4, 8, 16].includes(unit))) {
    throw new MidiImportError(
      'unsupported_meter',
      `The groove is in ${beats}/${unit}; a drill has 1–15 beats of halves, quarters, eighths or sixteenths.`,
    );
  }
  return meter;
}

/**
 * The tempo of the groove's first bar, in quarter notes a minute: a drill has one tempo. Changes
 * within the groove's bars are named in a warning.
 */
function grooveTempo(
  timeline: Timeline,
  firstBar: number,
  lastBar: number,
  warnings: string[],
): number {
  if (!timeline.hasTempo) {
    // Standard MIDI File 1.1: without a tempo event a file plays at 120 quarter notes a minute.
    warnings.push(
      'The file gives no tempo: read at 120 quarter notes a minute, as the MIDI file standard says.',
    );
    return 120;
  }
  const first = timeline.tempoAt(timeline.barStart(firstBar));
  const changes = timeline
    .tempoChanges(timeline.barStart(firstBar), timeline.barStart(lastBar + 1))
    .filter((c, i, all) => Math.abs(c.bpm - (i === 0 ? first : all[i - 1]!.bpm)) > 0.01);
  if (changes.length > 0) {
    const listed = changes
      .slice(0, 4)
      .map((c) => `to ${round(c.bpm, 1)} at bar ${timeline.barAt(c.ticks) - firstBar + 1}`)
      .join(', ');
    warnings.push(
      `The tempo changes (${listed}${changes.length > 4 ? ', …' : ''}, in quarter notes a minute); a drill has one tempo: it keeps ${round(first, 1)}, its first bar's.`,
    );
  }
  return first;
}

interface Placed {
  /** The note's beat counted from the groove's first beat. */
  readonly index: number;
  readonly x: number;
  readonly voice: VoiceId;
  readonly velocity: number;
}

function quantise(
  placed: readonly Placed[],
  barCount: number,
  beatsPerBar: number,
  msPerBeat: (bar: number, beat: number) => number,
): { bars: PlainBar[]; residuals: BeatResidual[]; merged: number } {
  const byBeat = new Map<number, Placed[]>();
  for (const n of placed) {
    const notes = byBeat.get(n.index);
    if (notes) notes.push(n);
    else byBeat.set(n.index, [n]);
  }
  const bars: PlainBar[] = [];
  const residuals: BeatResidual[] = [];
  let merged = 0;
  for (let b = 0; b < barCount; b++) {
    const beats: number[] = [];
    const hits = new Map<string, PlainHit & { velocity: number }>();
    for (let beat = 1; beat <= beatsPerBar; beat++) {
      const notes = byBeat.get(b * beatsPerBar + beat - 1) ?? [];
      const fit = fitBeat(notes.map((n) => n.x));
      beats.push(fit.slots);
      residuals.push({
        bar: b + 1,
        beat,
        slots: fit.slots,
        notes: notes.length,
        beats: round(fit.error, 4),
        ms: round(fit.error * msPerBeat(b, beat - 1), 1),
      });
      notes.forEach((n, i) => {
        const slot = fit.slotOf[i]!;
        const key = `${beat}/${slot}/${n.voice}`;
        const before = hits.get(key);
        if (before) merged += 1;
        if (!before || before.velocity < n.velocity) {
          hits.set(key, {
            beat,
            slot,
            voice: n.voice,
            dynamic: dynamicOf(n.velocity),
            velocity: n.velocity,
          });
        }
      });
    }
    bars.push({ beats, hits: [...hits.values()].map(({ velocity: _v, ...hit }) => hit) });
  }
  return { bars, residuals, merged };
}

/** Every draft of the card, fullest first: the first that parses and generates is kept. */
function chooseCard(
  bars: readonly PlainBar[],
  meter: { beats: number; unit: number },
  tempo: number,
  warnings: string[],
): RuleCard {
  const grid = cardGrid(bars, meter.beats);
  const voices = VOICE_IDS.filter((v) => bars.some((bar) => bar.hits.some((h) => h.voice === v)));
  const ostinato = inferOstinato(bars, grid);
  const backbeat = inferBackbeat(bars, meter.beats);
  // The kick's default role anchors it on beat 1 of every bar; a groove that leaves beat 1
  // without it gets a card that does not oblige it there.
  const kickOnOne = bars.every((bar) =>
    bar.hits.some((h) => h.voice === 'kick' && h.beat === 1 && h.slot === 0),
  );
  const base: DraftCard = {
    meter,
    bars: bars.length,
    subdivision: grid,
    tempo,
    voices,
    ...(ostinato ? { ostinato } : {}),
    density: 0,
    rules: backbeat ? [backbeat] : [],
    ...(voices.includes('kick') && !kickOnOne ? { roles: { kick: 'embellishment' } } : {}),
  };
  const plain = parseRuleCard(base);
  const fills = fillRule(bars, plain);
  const withFills = {
    ...base,
    density: densityOf(bars, plain),
    rules: [...base.rules, ...(fills ? [fills] : [])],
  };
  const curve = tensionCurve(bars, parseRuleCard(withFills));
  const drafts: [DraftCard, string | null][] = [
    [
      { ...withFills, rules: [...withFills.rules, ...(curve ? [{ kind: 'tension', curve }] : [])] },
      null,
    ],
    [withFills, 'the tension curve'],
    [{ ...withFills, rules: base.rules }, 'the tension curve and the fill rule'],
    [{ ...withFills, rules: [] }, 'every rule'],
  ];
  if (ostinato) {
    const { ostinato: _o, ...bare } = withFills;
    drafts.push([{ ...bare, rules: [] }, 'every rule and the ostinato']);
  }
  // The fullest draft that generates variations and accepts the groove's own bars (pinned, as
  // written on its grid), else the fullest that generates, else the plainest.
  let generating: [RuleCard, string | null] | null = null;
  for (const [draft, without] of drafts) {
    const card = parseRuleCard(draft);
    if (!engineAccepts(() => generateDrill(card, IMPORT_SEED))) continue;
    generating ??= [card, without];
    const own = barsOnGrid(finishBars(bars, card, []), card);
    if (!own || !engineAccepts(() => generateDrill(card, IMPORT_SEED, { keep: own }))) continue;
    if (without)
      warnings.push(
        `The inferred card leaves out ${without}: with it the engine could not generate variations that keep the groove's own bars.`,
      );
    return card;
  }
  if (generating) {
    warnings.push(
      "The inferred card does not take the groove's own bars as they are (its grid or its rules differ from some of them); it still generates variations.",
    );
    return generating[0];
  }
  warnings.push(
    'The engine could not generate variations from any card inferred from this groove.',
  );
  return plain;
}

/** Whether the engine runs `generate` without refusing (a refusal is an answer, not a fault). */
function engineAccepts(generate: () => unknown): boolean {
  try {
    generate();
    return true;
  } catch (error) {
    if (isRefusal(error)) return false;
    throw error;
  }
}

/**
 * Bars rewritten on the card's grid (an eighth on a sixteenth grid is slot 2 of 4), or null when
 * a hit has no slot there (a triplet on a sixteenth grid).
 */
export function barsOnGrid(bars: readonly DrillBar[], card: RuleCard): DrillBar[] | null {
  const slotsAt = (beat: number) =>
    typeof card.subdivision === 'number' ? card.subdivision : card.subdivision[beat - 1]!;
  const out: DrillBar[] = [];
  for (const bar of bars) {
    const hits: DrillHit[] = [];
    for (const hit of bar.hits) {
      const slot = (hit.slot * slotsAt(hit.beat)) / bar.beats[hit.beat - 1]!;
      if (!Number.isInteger(slot)) return null;
      hits.push({ ...hit, slot });
    }
    out.push({ ...bar, beats: bar.beats.map((_, i) => slotsAt(i + 1)), hits });
  }
  return out;
}

const isRefusal = (error: unknown): boolean =>
  error instanceof RuleConflictError ||
  error instanceof SearchExhaustedError ||
  error instanceof RuleCardError;

/** Ghost and accent shares of the embellishments, under a fillHoles rule on their voices. */
function fillRule(bars: readonly PlainBar[], card: RuleCard): Record<string, unknown> | undefined {
  const fills = bars.flatMap((bar, i) =>
    bar.hits.filter(
      (h) =>
        card.roles[h.voice] === 'embellishment' &&
        sourceOf(card, i + 1, bar.beats[h.beat - 1]!, h) === 'fill',
    ),
  );
  if (fills.length === 0) return undefined;
  const share = (d: Dynamic) =>
    round(fills.filter((h) => h.dynamic === d).length / fills.length, 2);
  const voices = VOICE_IDS.filter((v) => fills.some((h) => h.voice === v));
  const ghost = share('ghost');
  const accent = Math.min(share('accent'), round(1 - ghost, 2));
  return { kind: 'fillHoles', voices, ghost, accent };
}

/** The share of the card grid's instants where a fill plays, beside what the rules place. */
function densityOf(bars: readonly PlainBar[], card: RuleCard): number {
  let filled = 0;
  let room = 0;
  bars.forEach((bar, i) => {
    for (let beat = 1; beat <= bar.beats.length; beat++) {
      const n =
        typeof card.subdivision === 'number' ? card.subdivision : card.subdivision[beat - 1]!;
      room += n - (card.ostinato ? card.ostinato.slots.length : 0);
    }
    const instants = new Set(
      bar.hits
        .filter((h) => sourceOf(card, i + 1, bar.beats[h.beat - 1]!, h) === 'fill')
        .map((h) => `${h.beat}/${h.slot / bar.beats[h.beat - 1]!}`),
    );
    filled += instants.size;
  });
  return room > 0 ? round(Math.min(1, filled / room), 2) : 0;
}

/** The bars' tensions stretched over 0..1, or nothing when they are all alike. */
function tensionCurve(bars: readonly PlainBar[], card: RuleCard): number[] | undefined {
  if (bars.length < 2) return undefined;
  const t = bars.map((bar, i) => measureBar(bar, i + 1, card));
  const least = Math.min(...t);
  const most = Math.max(...t);
  if (most - least < 1e-9) return undefined;
  return t.map((v) => round((v - least) / (most - least), 2));
}

function sourced(bar: PlainBar, barNo: number, card: RuleCard): Omit<DrillHit, 'hand'>[] {
  return bar.hits.map((h) => ({ ...h, source: sourceOf(card, barNo, bar.beats[h.beat - 1]!, h) }));
}

function measureBar(bar: PlainBar, barNo: number, card: RuleCard): number {
  const draft: DrillBar = {
    bar: barNo,
    beats: bar.beats,
    tension: 0,
    hits: sourced(bar, barNo, card).map((h) => ({ ...h, hand: null })),
  };
  return measureTension(draft, card.meter.grouping ?? null, card.measure);
}

/** Sources, hands (at most two at an instant) and each bar's tension. */
function finishBars(bars: readonly PlainBar[], card: RuleCard, warnings: string[]): DrillBar[] {
  const timeVoice =
    card.ostinato?.voice ??
    TIME_CYMBALS.find((v) => bars.some((bar) => bar.hits.some((h) => h.voice === v))) ??
    null;
  return bars.map((bar, i) => {
    const barNo = i + 1;
    const instants = new Map<string, Omit<DrillHit, 'hand'>[]>();
    for (const hit of sourced(bar, barNo, card)) {
      const key = `${hit.beat}/${hit.slot}`;
      instants.set(key, [...(instants.get(key) ?? []), hit]);
    }
    const hits: DrillHit[] = [];
    for (const group of instants.values()) {
      const { kept, dropped } = stickInstant(group, timeVoice);
      hits.push(...kept);
      if (dropped.length > 0) {
        warnings.push(
          `Bar ${barNo}, beat ${group[0]!.beat}: three hands at once; left out the ${dropped.join(' and ')}.`,
        );
      }
    }
    hits.sort(byPlace);
    const drillBar: DrillBar = { bar: barNo, beats: bar.beats, tension: 0, hits };
    return {
      ...drillBar,
      tension: measureTension(drillBar, card.meter.grouping ?? null, card.measure),
    };
  });
}
