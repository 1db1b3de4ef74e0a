/**
 * Drill → Standard MIDI File (format 1: a conductor track with the title, tempo and time
 * signature, then one drum track on channel 10), written with `@tonejs/midi`.
 *
 * Every hit starts on its exact tick (see `timing.ts` for the division), with the General MIDI
 * percussion key of its voice (`GM_DRUM_NOTE`, the same map playback uses) and a velocity from its
 * dynamic (`DYNAMIC_VELOCITY`, as playback sounds it). The notes are written straight: swing is a
 * playback feel, not part of the written drill (notation stays straight too).
 */
import type { Drill, Dynamic } from '../generator/drill';
import { GM_DRUM_NOTE, GM_PERCUSSION_CHANNEL } from '../playback/gm-drum-map';
import { DYNAMIC_VELOCITY, midiVelocity } from '../playback/schedule';
import { Midi } from './tonejs-midi';
import { compoundMeter, hitTick, quarterBpm, slotTicks, ticksPerQuarter } from './timing';

/** MIDI velocity (1–127) of each dynamic: ghost 38, normal 91, accent 127. */
export const MIDI_VELOCITY: Readonly<Record<Dynamic, number>> = {
  ghost: midiVelocity(DYNAMIC_VELOCITY.ghost),
  normal: midiVelocity(DYNAMIC_VELOCITY.normal),
  accent: midiVelocity(DYNAMIC_VELOCITY.accent),
};

/** The tempo meta event's value: microseconds a quarter note, rounded to a whole one. */
export function microsecondsPerQuarter(tempo: number, unit: number): number {
  return Math.round(60_000_000 / quarterBpm(tempo, unit));
}

/** MIDI clocks in a quarter note (Standard MIDI File 1.0, time signature meta event). */
const CLOCKS_PER_QUARTER = 24;

/**
 * MIDI clocks per metronome click: one beat of the meter, or the dotted beat of three units in
 * compound time (6/8 clicks every dotted quarter: 36).
 */
export function clocksPerClick(meter: {
  readonly beats: number;
  readonly unit: number;
  readonly grouping?: readonly number[] | undefined;
}): number {
  const unitClocks = (CLOCKS_PER_QUARTER * 4) / meter.unit;
  return compoundMeter(meter) ? unitClocks * 3 : unitClocks;
}

/**
 * The file's name text: Standard MIDI File text events are bytes, so the title is kept to
 * printable ASCII (accents dropped, curly quotes straightened, anything else as "?").
 */
export function asciiTitle(title: string): string {
  return title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[\u2018\u2019]/g, "'")
    .replace(/[\u201c\u201d]/g, '"')
    .replace(/[\u2013\u2014]/g, '-')
    .replace(/[^\x20-\x7e]/g, '?')
    .slice(0, 120);
}

/** The drill as the bytes of a Standard MIDI File. */
export function drillToMidi(drill: Drill, title: string): Uint8Array {
  const { meter, tempo } = drill.card;
  const ppq = ticksPerQuarter(meter.unit);
  const midi = new Midi();
  // The library keeps its division private; its JSON form is the documented way to set it.
  midi.header.fromJSON({
    name: asciiTitle(title),
    ppq,
    // The library writes floor(60 000 000 / bpm) µs a quarter; this bpm makes that the rounded
    // exact value.
    tempos: [{ ticks: 0, bpm: 60_000_000 / (microsecondsPerQuarter(tempo, meter.unit) + 0.5) }],
    timeSignatures: [{ ticks: 0, timeSignature: [meter.beats, meter.unit] }],
    keySignatures: [],
    meta: [],
  });
  const track = midi.addTrack();
  track.name = 'Drum set';
  // Channels count from 0 in the library, from 1 in the General MIDI specification.
  track.channel = GM_PERCUSSION_CHANNEL - 1;
  drill.bars.forEach((bar, index) => {
    for (const hit of bar.hits) {
      const slot = slotTicks(meter.unit, bar.beats[hit.beat - 1] ?? 1);
      track.addNote({
        midi: GM_DRUM_NOTE[hit.voice],
        ticks: hitTick(meter, index, bar, hit),
        // Half a slot: a drum note has no length to speak of, and the next stroke of the same
        // key never starts before the previous one ends.
        durationTicks: Math.max(1, Math.floor(slot / 2)),
        // The library writes floor(velocity × 127); the half keeps float error off the floor.
        velocity: (MIDI_VELOCITY[hit.dynamic] + 0.5) / 127,
      });
    }
  });
  return withClickEvery(midi.toArray(), meter);
}

/**
 * The library writes every time signature with a click each quarter note (24 clocks); a
 * compound or eighth meter clicks on its own beat. The one time signature event of the
 * conductor track is found by its exact bytes and its click byte set.
 */
function withClickEvery(
  bytes: Uint8Array,
  meter: { readonly beats: number; readonly unit: number; readonly grouping?: readonly number[] },
): Uint8Array {
  const clocks = clocksPerClick(meter);
  if (clocks === CLOCKS_PER_QUARTER) return bytes;
  const event = [0xff, 0x58, 0x04, meter.beats, Math.log2(meter.unit), CLOCKS_PER_QUARTER, 8];
  const found: number[] = [];
  for (let i = 0; i + event.length <= bytes.length; i++) {
    if (event.every((byte, k) => bytes[i + k] === byte)) found.push(i);
  }
  if (found.length !== 1) {
    throw new Error(`Expected one time signature event in the MIDI file, found ${found.length}.`);
  }
  const out = bytes.slice();
  out[found[0]! + 5] = clocks;
  return out;
}
