/**
 * The exported MIDI files read byte by byte with a reader written from the specification
 * (tests/formats/smf-reader.ts), not with the library that wrote them.
 *
 * SMF = MIDI Manufacturers Association, "Standard MIDI Files 1.0" (RP-001), 1996; section names
 * as in its text ("1 – Sequences, Tracks, Chunks: File Block Structure", "2 – Chunk
 * Descriptions": Header Chunks, Track Chunks; "3 – Meta-Events").
 * GM1 = MIDI Manufacturers Association, "General MIDI System Level 1", 1991, "Percussion Key Map".
 */
import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { drillToMidi } from '../../shared/formats/midi-export';
import { FORMAT_CARDS, formatDrills } from './drills';
import { readSmf, readVlq, writeVlq, type SmfEvent } from './smf-reader';

/** GM1 "Percussion Key Map": the keys Tensile's voices use, by the map's own names. */
const GM1_PERCUSSION: Readonly<Record<number, string>> = {
  36: 'Bass Drum 1',
  37: 'Side Stick',
  38: 'Acoustic Snare',
  42: 'Closed Hi-Hat',
  43: 'High Floor Tom',
  44: 'Pedal Hi-Hat',
  46: 'Open Hi-Hat',
  47: 'Low-Mid Tom',
  49: 'Crash Cymbal 1',
  50: 'High Tom',
  51: 'Ride Cymbal 1',
  53: 'Ride Bell',
};

/** Which GM1 sound each voice means (docs/formats.md gives the reasons). */
const VOICE_SOUND: Readonly<Record<string, string>> = {
  kick: 'Bass Drum 1',
  snare: 'Acoustic Snare',
  rim: 'Side Stick',
  hihat: 'Closed Hi-Hat',
  hihatOpen: 'Open Hi-Hat',
  hihatFoot: 'Pedal Hi-Hat',
  ride: 'Ride Cymbal 1',
  rideBell: 'Ride Bell',
  crash: 'Crash Cymbal 1',
  tomHigh: 'High Tom',
  tomMid: 'Low-Mid Tom',
  tomFloor: 'High Floor Tom',
};

const hex = (bytes: readonly number[]) =>
  bytes.map((b) => b.toString(16).toUpperCase().padStart(2, '0')).join(' ');

const metas = (events: SmfEvent[], type: number) =>
  events.filter(
    (e): e is Extract<SmfEvent, { kind: 'meta' }> => e.kind === 'meta' && e.type === type,
  );

function drillOf(name: string, changes: Record<string, unknown> = {}): Drill {
  return generateDrill(parseRuleCard({ ...(FORMAT_CARDS[name] as object), ...changes }), 'formats');
}

describe('variable-length quantities (SMF §1, Conventions: the worked examples)', () => {
  // The specification's table of numbers and their variable-length form.
  const table: [number, string][] = [
    [0x00000000, '00'],
    [0x00000040, '40'],
    [0x0000007f, '7F'],
    [0x00000080, '81 00'],
    [0x00002000, 'C0 00'],
    [0x00003fff, 'FF 7F'],
    [0x00004000, '81 80 00'],
    [0x00100000, 'C0 80 00'],
    [0x001fffff, 'FF FF 7F'],
    [0x00200000, '81 80 80 00'],
    [0x08000000, 'C0 80 80 00'],
    [0x0fffffff, 'FF FF FF 7F'],
  ];
  it.each(table)('%i is written and read as %s', (value, bytes) => {
    expect(hex(writeVlq(value))).toBe(bytes);
    const parsed = bytes.split(' ').map((b) => parseInt(b, 16));
    expect(readVlq(parsed, 0)).toEqual({ value, length: parsed.length });
  });
});

describe('exported files, byte by byte', () => {
  for (const [name, drill] of formatDrills()) {
    it(`writes the ${name} drill as the specification lays it out`, () => {
      const bytes = drillToMidi(drill, name);
      const file = readSmf(bytes);
      const { beats, unit } = drill.card.meter;
      const division = unit === 16 ? 3360 : 1680;
      // SMF §2 Header Chunks: "MThd", length 6, format 1, two tracks, ticks a quarter note
      // (bit 15 clear), each 16 bits most significant byte first; 14 bytes in all.
      expect(hex(file.headerBytes)).toBe(
        hex([0x4d, 0x54, 0x68, 0x64, 0, 0, 0, 6, 0, 1, 0, 2, division >> 8, division & 0xff]),
      );
      expect(file.trackEvents).toHaveLength(2);

      for (const events of file.trackEvents) {
        // SMF §2 Track Chunks: every delta time is a variable-length quantity in its shortest
        // form; §3: each track ends with End of Track (FF 2F 00) and nothing after it.
        const previous = [0, ...events.map((e) => e.tick)];
        events.forEach((event, i) => {
          expect(hex(event.delta)).toBe(hex(writeVlq(event.tick - previous[i]!)));
        });
        const last = events.at(-1)!;
        expect(last.kind === 'meta' && last.type === 0x2f && last.data.length === 0).toBe(true);
        expect(metas(events, 0x2f)).toHaveLength(1);
      }

      const [conductor, drums] = file.trackEvents as [SmfEvent[], SmfEvent[]];
      // SMF §3 Set Tempo: FF 51 03 and microseconds a quarter note in 24 bits. The card counts
      // beats of its unit a minute: a beat lasts 60 000 000 / tempo µs, a quarter unit / 4 beats.
      const [tempo] = metas(conductor, 0x51);
      const micro = Math.round((60_000_000 / drill.card.tempo) * (unit / 4));
      expect(tempo?.tick).toBe(0);
      expect(hex(tempo!.data)).toBe(hex([micro >> 16, (micro >> 8) & 0xff, micro & 0xff]));
      // SMF §3 Time Signature: FF 58 04 nn dd cc bb: numerator, the denominator as a power of
      // two, MIDI clocks a metronome click, 32nd notes a quarter (8).
      const [signature] = metas(conductor, 0x58);
      expect(signature?.tick).toBe(0);
      expect(signature!.data.slice(0, 2)).toEqual([beats, Math.log2(unit)]);
      expect(signature!.data[3]).toBe(8);

      // Every hit: a note on at its exact tick, on channel 10 (0-based 9), with its voice's key.
      const ons = drums.filter(
        (e): e is Extract<SmfEvent, { kind: 'channel' }> =>
          e.kind === 'channel' && e.status === 0x90 && e.data[1]! > 0,
      );
      const expected = drill.bars
        .flatMap((bar, index) =>
          bar.hits.map((hit) => {
            const slots = bar.beats[hit.beat - 1]!;
            const num = division * 4 * ((index * beats + hit.beat - 1) * slots + hit.slot);
            return { tick: num / (unit * slots), sound: VOICE_SOUND[hit.voice]! };
          }),
        )
        .sort((a, b) => a.tick - b.tick || a.sound.localeCompare(b.sound));
      const found = ons
        .map((e) => ({ tick: e.tick, sound: GM1_PERCUSSION[e.data[0]!] ?? `key ${e.data[0]}` }))
        .sort((a, b) => a.tick - b.tick || a.sound.localeCompare(b.sound));
      expect(found).toEqual(expected);
      expect(found.every((n) => Number.isInteger(n.tick))).toBe(true);
      for (const e of drums.filter((e) => e.kind === 'channel')) {
        expect((e as { channel: number }).channel).toBe(9);
      }
    });
  }

  it('matches the specification’s own 6/8 and 4/4 time signatures and its 120 BPM tempo', () => {
    // SMF §3 Time Signature examples: 6/8 clicking every dotted quarter is FF 58 04 06 03 24 08;
    // 4/4 clicking every quarter is FF 58 04 04 02 18 08. Set Tempo: 120 BPM is 500 000 µs,
    // FF 51 03 07 A1 20.
    const sixEight = readSmf(drillToMidi(drillOf('6/8'), 'x')).trackEvents[0]!;
    expect(hex([0xff, 0x58, 4, ...metas(sixEight, 0x58)[0]!.data])).toBe('FF 58 04 06 03 24 08');
    // The preset's 132 eighths a minute are 66 quarters: 909 091 µs a quarter (computed).
    expect(hex(metas(sixEight, 0x51)[0]!.data)).toBe('0D DF 23');
    const fourFour = readSmf(drillToMidi(drillOf('quintuplets', { tempo: 120 }), 'x'))
      .trackEvents[0]!;
    expect(hex([0xff, 0x58, 4, ...metas(fourFour, 0x58)[0]!.data])).toBe('FF 58 04 04 02 18 08');
    expect(hex([0xff, 0x51, 3, ...metas(fourFour, 0x51)[0]!.data])).toBe('FF 51 03 07 A1 20');
  });

  it('names the file in the conductor track (SMF §3 Sequence/Track Name, FF 03)', () => {
    const events = readSmf(drillToMidi(drillOf('7/8'), 'Seven, for Noor')).trackEvents[0]!;
    const [name] = metas(events, 0x03);
    expect(String.fromCharCode(...name!.data)).toBe('Seven, for Noor');
  });
});
