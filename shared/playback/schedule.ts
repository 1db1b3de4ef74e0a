/**
 * Playback events computed from a drill's exact positions.
 *
 * An event at bar b, beat n, slot s of a beat with `slots` subdivisions sits at
 * `(barOffset + n − 1 + s / slots)` beats from the start of its pass, where `barOffset` is the
 * number of beats in the bars before it. Loop k adds `k × loopLength` beats, and a count-in bar
 * (if any) comes first. Seconds are `beats × 60 / tempo`, one division per event: nothing is
 * accumulated, so the thousandth loop is as exact as the first.
 *
 * When the card swings, `s / slots` is replaced by the swung offset inside the beat (see
 * `swing.ts`): the off-beat of each pair moves to the card's ratio, exactly. Beats never move,
 * so bar and beat boundaries (and the cursor) are the same as straight.
 */
import { VOICE_IDS, type Dynamic, type DrillBar, type VoiceId } from '../generator/drill';
import { gmDrumNote } from './gm-drum-map';
import { addRational, beatsToSeconds, compareRational, rational, type Rational } from './rational';
import { swingFeel, swungOffset, type SwingFeel, type SwingSpec } from './swing';

/** What playback needs from a drill (a `Drill` from the engine satisfies it). */
export interface PlayableDrill {
  readonly bars: readonly DrillBar[];
  /** The card's beat unit and swing; without a card (or its swing) playback is straight. */
  readonly card?: {
    readonly meter: { readonly unit: number };
    readonly swing?: SwingSpec | undefined;
  };
}

/** Bars to loop, counted from 1, both ends included. */
export interface BarRange {
  readonly from: number;
  readonly to: number;
}

export interface MetronomeOptions {
  readonly enabled: boolean;
  /** A higher click on beat 1 of each bar (and of the count-in). */
  readonly accentFirstBeat: boolean;
  /** Quieter clicks on every subdivision of the beat, e.g. all five notes of a quintuplet. */
  readonly subdivisions: boolean;
}

/** Everything that decides which events sound and when. */
export interface ScheduleOptions {
  /** Beats per minute; the beat is the meter's unit. */
  readonly tempo: number;
  /** Bars to loop; `null` loops the whole drill. */
  readonly range: BarRange | null;
  /** One bar of clicks before the drill. */
  readonly countIn: boolean;
  readonly metronome: MetronomeOptions;
  readonly mute: ReadonlySet<VoiceId>;
  /** When not empty, only these voices sound. */
  readonly solo: ReadonlySet<VoiceId>;
}

/** Where a click falls: decides its sound once the metronome options are known. */
export type ClickRole = 'downbeat' | 'beat' | 'subdivision';
/** The sound of a click. */
export type ClickSound = 'accent' | 'beat' | 'subdivision';

export interface PlaybackEvent {
  readonly kind: 'hit' | 'click';
  /** Beats from the start of playback (the count-in included). */
  readonly at: Rational;
  /** Seconds from the start of playback at the options' tempo. */
  readonly time: number;
  /** 0-based pass through the loop; −1 for the count-in. */
  readonly loop: number;
  /** Bar number as written (0 for the count-in), beat from 1, 0-based slot. */
  readonly bar: number;
  readonly beat: number;
  readonly slot: number;
  readonly voice: VoiceId | null;
  /** General MIDI percussion key for hits, `null` for clicks. */
  readonly midiNote: number | null;
  readonly dynamic: Dynamic | null;
  /** 0..1, from the dynamic (hits) or the click's role. */
  readonly velocity: number;
  readonly clickRole: ClickRole | null;
}

/**
 * Velocity per dynamic, 0..1 (MIDI velocity = round(v × 127)). Ghost notes are played well
 * under a normal stroke and accents at full strength: common practice.
 */
export const DYNAMIC_VELOCITY: Readonly<Record<Dynamic, number>> = {
  ghost: 0.3,
  normal: 0.72,
  accent: 1,
};

const CLICK_VELOCITY: Readonly<Record<ClickSound, number>> = {
  accent: 1,
  beat: 0.8,
  subdivision: 0.45,
};

/** MIDI velocity (1–127) for a 0..1 velocity. */
export function midiVelocity(velocity: number): number {
  return Math.min(127, Math.max(1, Math.round(velocity * 127)));
}

/** The loop's geometry: which bars, where each starts, and how long the count-in is. */
export interface LoopShape {
  readonly bars: readonly DrillBar[];
  /** Beats before each of `bars` inside one pass. */
  readonly barOffsets: readonly number[];
  readonly lengthBeats: number;
  /** 0 without a count-in, else the beats of the loop's first bar. */
  readonly countInBeats: number;
  /** The card's swing against its meter; `null` plays straight. */
  readonly swing: SwingFeel | null;
}

/** Checks a bar range against the drill and returns the bars it covers. */
export function barsInRange(drill: PlayableDrill, range: BarRange | null): readonly DrillBar[] {
  const count = drill.bars.length;
  if (count === 0) throw new RangeError('The drill has no bars to play.');
  if (range === null) return drill.bars;
  const { from, to } = range;
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 1 || to > count || from > to) {
    throw new RangeError(`Loop bars must run from 1 to ${count} with "from" not after "to".`);
  }
  return drill.bars.slice(from - 1, to);
}

export function loopShape(
  drill: PlayableDrill,
  range: BarRange | null,
  countIn: boolean,
): LoopShape {
  const bars = barsInRange(drill, range);
  const barOffsets: number[] = [];
  let lengthBeats = 0;
  for (const bar of bars) {
    barOffsets.push(lengthBeats);
    lengthBeats += bar.beats.length;
  }
  return {
    bars,
    barOffsets,
    lengthBeats,
    countInBeats: countIn ? (bars[0]?.beats.length ?? 0) : 0,
    swing: drill.card ? swingFeel(drill.card.swing, drill.card.meter.unit) : null,
  };
}

/** Beats from playback start to the first beat of pass `loop` (an integer). */
export function loopStartBeat(shape: LoopShape, loop: number): number {
  return shape.countInBeats + loop * shape.lengthBeats;
}

function clickEvent(
  at: Rational,
  tempo: number,
  place: { loop: number; bar: number; beat: number; slot: number },
  role: ClickRole,
): PlaybackEvent {
  return {
    kind: 'click',
    at,
    time: beatsToSeconds(at, tempo),
    ...place,
    voice: null,
    midiNote: null,
    dynamic: null,
    velocity: CLICK_VELOCITY[role === 'downbeat' ? 'accent' : role],
    clickRole: role,
  };
}

/** The count-in bar: a click on every beat of the loop's first bar. */
export function countInEvents(shape: LoopShape, tempo: number): PlaybackEvent[] {
  const events: PlaybackEvent[] = [];
  for (let beat = 1; beat <= shape.countInBeats; beat += 1) {
    const role: ClickRole = beat === 1 ? 'downbeat' : 'beat';
    events.push(clickEvent(rational(beat - 1), tempo, { loop: -1, bar: 0, beat, slot: 0 }, role));
  }
  return events;
}

/**
 * Every event of one pass: all hits, and a click on every slot (role-tagged), before muting
 * and metronome settings are applied, so a live player can honour changes at once. Subdivision
 * clicks swing with the hits, so the metronome never argues with the groove.
 */
export function loopEvents(shape: LoopShape, tempo: number, loop: number): PlaybackEvent[] {
  const start = loopStartBeat(shape, loop);
  const events: PlaybackEvent[] = [];
  shape.bars.forEach((bar, index) => {
    const barStart = start + (shape.barOffsets[index] ?? 0);
    bar.beats.forEach((slots, beatIndex) => {
      for (let slot = 0; slot < slots; slot += 1) {
        const at = slotTime(barStart + beatIndex, slot, slots, shape.swing);
        const role: ClickRole = slot > 0 ? 'subdivision' : beatIndex === 0 ? 'downbeat' : 'beat';
        events.push(clickEvent(at, tempo, { loop, bar: bar.bar, beat: beatIndex + 1, slot }, role));
      }
    });
    for (const hit of bar.hits) {
      const slots = bar.beats[hit.beat - 1];
      if (slots === undefined || hit.slot < 0 || hit.slot >= slots) {
        throw new RangeError(`Bar ${bar.bar} has a hit outside its beats (beat ${hit.beat}).`);
      }
      const at = slotTime(barStart + hit.beat - 1, hit.slot, slots, shape.swing);
      events.push({
        kind: 'hit',
        at,
        time: beatsToSeconds(at, tempo),
        loop,
        bar: bar.bar,
        beat: hit.beat,
        slot: hit.slot,
        voice: hit.voice,
        midiNote: gmDrumNote(hit.voice),
        dynamic: hit.dynamic,
        velocity: DYNAMIC_VELOCITY[hit.dynamic],
        clickRole: null,
      });
    }
  });
  return events.sort(compareEvents);
}

/** Beats from playback start to a slot of the beat that starts `beatStart` beats in. */
function slotTime(beatStart: number, slot: number, slots: number, swing: SwingFeel | null) {
  if (swing === null) return rational(beatStart * slots + slot, slots);
  return addRational(rational(beatStart), swungOffset(slot, slots, swing));
}

/** Time order; at one instant clicks first, then hits in voice order. */
export function compareEvents(a: PlaybackEvent, b: PlaybackEvent): number {
  const byTime = compareRational(a.at, b.at);
  if (byTime !== 0) return byTime;
  if (a.kind !== b.kind) return a.kind === 'click' ? -1 : 1;
  return voiceRank(a.voice) - voiceRank(b.voice);
}

function voiceRank(voice: VoiceId | null): number {
  return voice === null ? -1 : VOICE_IDS.indexOf(voice);
}

/** Whether a voice sounds under the mute and solo settings (a muted voice stays silent). */
export function isVoiceAudible(
  voice: VoiceId,
  mixer: Pick<ScheduleOptions, 'mute' | 'solo'>,
): boolean {
  return !mixer.mute.has(voice) && (mixer.solo.size === 0 || mixer.solo.has(voice));
}

/** The sound a click makes under the metronome options, or `null` when it stays silent. */
export function clickSound(event: PlaybackEvent, metronome: MetronomeOptions): ClickSound | null {
  const role = event.clickRole;
  if (role === null) return null;
  if (event.loop >= 0 && !metronome.enabled) return null;
  if (role === 'subdivision') return metronome.subdivisions ? 'subdivision' : null;
  return role === 'downbeat' && metronome.accentFirstBeat ? 'accent' : 'beat';
}

/** Whether an event sounds under the options (count-in clicks always sound). */
export function isAudible(event: PlaybackEvent, options: ScheduleOptions): boolean {
  if (event.kind === 'hit') return event.voice !== null && isVoiceAudible(event.voice, options);
  return clickSound(event, options.metronome) !== null;
}

/** The velocity of a click as it will sound (an unaccented downbeat is a plain beat). */
export function clickVelocity(sound: ClickSound): number {
  return CLICK_VELOCITY[sound];
}

/**
 * The audible events of a count-in (if enabled) and `loops` passes at one tempo, sorted by
 * time.
 */
export function scheduleDrill(
  drill: PlayableDrill,
  options: ScheduleOptions,
  loops = 1,
): PlaybackEvent[] {
  if (!Number.isInteger(loops) || loops < 1) throw new RangeError('Play at least one pass.');
  const shape = loopShape(drill, options.range, options.countIn);
  const events = countInEvents(shape, options.tempo);
  for (let loop = 0; loop < loops; loop += 1) {
    events.push(...loopEvents(shape, options.tempo, loop));
  }
  return events
    .filter((event) => isAudible(event, options))
    .map((event) => {
      const sound = clickSound(event, options.metronome);
      return sound === null ? event : { ...event, velocity: clickVelocity(sound) };
    });
}
