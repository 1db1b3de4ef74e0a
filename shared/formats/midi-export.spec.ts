import { describe, expect, it } from 'vitest';
import type { Drill } from '../generator/drill';
import { formatDrills } from '../../tests/formats/drills';
import { asciiTitle, clocksPerClick, drillToMidi, MIDI_VELOCITY } from './midi-export';
import { Midi } from './tonejs-midi';

/** Every hit as [tick, key, velocity], sorted, from the drill by exact fractions. */
function expectedNotes(drill: Drill, ppq: number): [number, number, number][] {
  const { beats, unit } = drill.card.meter;
  const keys: Record<string, number> = {
    kick: 36,
    snare: 38,
    rim: 37,
    hihat: 42,
    hihatOpen: 46,
    hihatFoot: 44,
    ride: 51,
    rideBell: 53,
    crash: 49,
    tomHigh: 50,
    tomMid: 47,
    tomFloor: 43,
  };
  const notes = drill.bars.flatMap((bar, index) =>
    bar.hits.map((hit): [number, number, number] => {
      const slots = bar.beats[hit.beat - 1]!;
      // Quarters from the start: ((bars and beats before) + slot / slots) × 4 / unit.
      const numerator = ppq * 4 * ((index * beats + hit.beat - 1) * slots + hit.slot);
      const denominator = unit * slots;
      expect(numerator % denominator, `${hit.beat}.${hit.slot} of ${slots}`).toBe(0);
      return [numerator / denominator, keys[hit.voice]!, MIDI_VELOCITY[hit.dynamic]];
    }),
  );
  return notes.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

describe('drillToMidi read back with @tonejs/midi', () => {
  for (const [name, drill] of formatDrills()) {
    it(`puts every hit of the ${name} drill on its exact tick, key and velocity`, () => {
      const midi = new Midi(drillToMidi(drill, `Drill: ${name}`));
      const { unit, beats } = drill.card.meter;
      // 1680 ticks a quarter (3360 with sixteenth beats): every slot on a whole tick.
      expect(midi.header.ppq).toBe(unit === 16 ? 3360 : 1680);
      expect(midi.tracks).toHaveLength(1);
      const track = midi.tracks[0]!;
      // General MIDI percussion is channel 10, 9 counted from 0 (MMA, General MIDI System
      // Level 1, 1991).
      expect(track.channel).toBe(9);
      const read = track.notes
        .map((n): [number, number, number] => [n.ticks, n.midi, Math.round(n.velocity * 127)])
        .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
      expect(read).toEqual(expectedNotes(drill, midi.header.ppq));
      expect(midi.header.timeSignatures.map((t) => t.timeSignature)).toEqual([[beats, unit]]);
      expect(midi.header.tempos).toHaveLength(1);
      // The card counts beats of its unit a minute; the file, microseconds a quarter note.
      // A beat of the unit lasts 60 000 000 / tempo µs, a quarter note unit / 4 beats.
      const exact = (60_000_000 / drill.card.tempo) * (unit / 4);
      expect(Math.abs(60_000_000 / midi.header.tempos[0]!.bpm - exact)).toBeLessThanOrEqual(0.5);
      expect(midi.header.name).toBe(`Drill: ${name}`);
    });
  }

  it('ends each note before the next stroke of the same key', () => {
    for (const [, drill] of formatDrills()) {
      const notes = new Midi(drillToMidi(drill, 'x')).tracks[0]!.notes;
      const byKey = new Map<number, typeof notes>();
      for (const n of notes) byKey.set(n.midi, [...(byKey.get(n.midi) ?? []), n]);
      for (const same of byKey.values()) {
        const sorted = [...same].sort((a, b) => a.ticks - b.ticks);
        sorted.slice(1).forEach((n, i) => {
          expect(sorted[i]!.ticks + sorted[i]!.durationTicks).toBeLessThan(n.ticks);
        });
        for (const n of same) expect(n.durationTicks).toBeGreaterThan(0);
      }
    }
  });
});

describe('MIDI details', () => {
  it('uses three velocities, ghost < normal < accent', () => {
    expect(MIDI_VELOCITY).toEqual({ ghost: 38, normal: 91, accent: 127 });
  });

  it('clicks on the beat of the meter: the dotted quarter in compound time', () => {
    // 24 MIDI clocks a quarter note (Standard MIDI Files 1.0, §3 "Meta-Events", Time Signature).
    expect(clocksPerClick({ beats: 4, unit: 4 })).toBe(24);
    expect(clocksPerClick({ beats: 6, unit: 8, grouping: [3, 3] })).toBe(36);
    expect(clocksPerClick({ beats: 12, unit: 8 })).toBe(36);
    expect(clocksPerClick({ beats: 7, unit: 8, grouping: [2, 2, 3] })).toBe(12);
    expect(clocksPerClick({ beats: 2, unit: 2 })).toBe(48);
    expect(clocksPerClick({ beats: 3, unit: 16 })).toBe(6);
  });

  it('keeps the title to printable ASCII', () => {
    expect(asciiTitle('Café “groove” – it’s 7/8 ♩')).toBe('Cafe "groove" - it\'s 7/8 ?');
  });
});
