import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { generateDrill, measureTension, parseRuleCard } from '../../generator/index';
import {
  ACCENT_FROM,
  GHOST_BELOW,
  GM_PERCUSSION_VOICE,
  importMidiGroove,
  MidiImportError,
  type MidiImportRefusal,
} from './index';
import { countNoteOns, MAX_NOTES } from './read-midi';
import { grooveFile, rockGroove } from './testing/groove-file';

const NUM_RUNS = Number(process.env['FC_RUNS'] ?? 1000);

function refusal(run: () => unknown): MidiImportRefusal {
  try {
    run();
  } catch (error) {
    if (error instanceof MidiImportError) return error.code;
    throw error;
  }
  throw new Error('the file was accepted');
}

const text = (s: string) => new TextEncoder().encode(s);

describe('importMidiGroove: a rock groove', () => {
  const result = importMidiGroove(rockGroove(2, 100));
  const bar1 = result.drill.bars[0]!;
  const at = (voice: string) =>
    bar1.hits
      .filter((h) => h.voice === voice)
      .map((h) => `${h.beat}:${h.slot}/${bar1.beats[h.beat - 1]}`);

  it('reads every hit on its beat and slot', () => {
    expect(result.drill.bars).toHaveLength(2);
    expect(bar1.beats).toEqual([2, 2, 2, 4]);
    expect(at('hihat')).toEqual([
      '1:0/2',
      '1:1/2',
      '2:0/2',
      '2:1/2',
      '3:0/2',
      '3:1/2',
      '4:0/4',
      '4:2/4',
    ]);
    expect(at('kick')).toEqual(['1:0/2', '3:1/2']);
    expect(at('snare')).toEqual(['2:0/2', '4:0/4', '4:3/4']);
  });

  it('reads dynamics from velocity', () => {
    const snare = bar1.hits.filter((h) => h.voice === 'snare').map((h) => h.dynamic);
    expect(snare).toEqual(['accent', 'accent', 'ghost']);
    expect(bar1.hits.find((h) => h.voice === 'kick')!.dynamic).toBe('normal');
  });

  it('infers a card the engine accepts: hi-hat ostinato, backbeat on 2 and 4, ghost-note fills', () => {
    const card = parseRuleCard(result.card);
    expect(card).toEqual(result.card);
    expect(card.meter).toEqual({ beats: 4, unit: 4 });
    expect(card.subdivision).toBe(4);
    expect(card.tempo).toBe(100);
    expect(card.ostinato).toEqual({ voice: 'hihat', slots: [0, 2], dynamic: 'normal' });
    expect(card.rules).toContainEqual({
      kind: 'backbeat',
      voice: 'snare',
      beats: [2, 4],
      shift: 0,
      dynamic: 'accent',
    });
    expect(card.rules).toContainEqual({
      kind: 'fillHoles',
      voices: ['snare'],
      ghost: 1,
      accent: 0,
    });
    expect(() => generateDrill(card, 'lesson-1')).not.toThrow();
    expect(result.warnings).toEqual([]);
  });

  it('names each hit by the part of the card that would place it, and sticks the hands', () => {
    const hihat = bar1.hits.filter((h) => h.voice === 'hihat');
    expect(hihat.every((h) => h.source === 'ostinato' && h.hand === 'R')).toBe(true);
    expect(bar1.hits.filter((h) => h.voice === 'snare').map((h) => h.source)).toEqual([
      'backbeat',
      'backbeat',
      'fill',
    ]);
    expect(bar1.hits.filter((h) => h.voice === 'kick').map((h) => h.source)).toEqual([
      'anchor',
      'fill',
    ]);
    // Backbeat under the hi-hat: the left hand (the right keeps time, crossed; common practice).
    expect(bar1.hits.find((h) => h.voice === 'snare')!.hand).toBe('L');
    expect(bar1.hits.filter((h) => h.voice === 'kick').every((h) => h.hand === null)).toBe(true);
  });

  it("measures each bar's tension with the engine's measure", () => {
    for (const bar of result.drill.bars) {
      expect(bar.tension).toBe(measureTension(bar, result.card.meter.grouping ?? null, 'lhl'));
    }
    expect(result.tensions).toEqual(result.drill.bars.map((b) => b.tension));
    expect(result.tensions[0]).toBeGreaterThan(0);
  });

  it('reports no residual for notes on exact slots', () => {
    expect(result.residuals).toHaveLength(8);
    expect(result.residuals.every((r) => r.beats === 0 && r.ms === 0)).toBe(true);
    expect(result.residuals[3]).toMatchObject({ bar: 1, beat: 4, slots: 4, notes: 4 });
  });
});

describe('importMidiGroove: quantising', () => {
  it('reads quintuplets and triplets, and reports how far played notes lay from their slots', () => {
    // 120 BPM: a beat is 500 ms; the second beat's "&" is played 10 ticks of 480 late.
    const notes = [0, 0.2, 0.4, 0.6, 0.8, 1, 1.5 + 10 / 480, 2, 2 + 1 / 3, 2 + 2 / 3, 3].map(
      (at) => ({
        key: 38,
        at,
      }),
    );
    const result = importMidiGroove(grooveFile({ bpm: 120, meter: [4, 4], notes }));
    expect(result.drill.bars[0]!.beats).toEqual([5, 2, 3, 2]);
    const late = result.residuals[1]!;
    expect(late.slots).toBe(2);
    expect(late.beats).toBeCloseTo(10 / 480, 4);
    expect(late.ms).toBeCloseTo((10 / 480) * 500, 1);
    expect(result.residuals[0]!.ms).toBeLessThan(1);
  });

  it('reads 6/8 with eighth-note beats and its tempo in eighths', () => {
    const notes = [0, 1, 2, 3, 4, 5].map((at) => ({ key: 42, at }));
    notes.push({ key: 36, at: 0 }, { key: 38, at: 3 }, { key: 38, at: 4.5 });
    const result = importMidiGroove(grooveFile({ bpm: 60, meter: [6, 8], notes }));
    expect(result.card.meter).toMatchObject({ beats: 6, unit: 8 });
    // 60 quarter notes a minute are 120 eighths.
    expect(result.card.tempo).toBe(120);
    expect(result.drill.bars[0]!.beats).toEqual([2, 2, 2, 2, 2, 2]);
    const snare = result.drill.bars[0]!.hits.filter((h) => h.voice === 'snare');
    expect(snare.map((h) => [h.beat, h.slot])).toEqual([
      [4, 0],
      [5, 1],
    ]);
  });

  it('reads a file without tempo or time signature as 4/4 at 120, and says so', () => {
    // Standard MIDI-File Format Spec. 1.1 (International MIDI Association), Meta-Events: a file
    // without them is taken as 4/4 at 120 beats a minute.
    const result = importMidiGroove(
      grooveFile({
        notes: [
          { key: 36, at: 0 },
          { key: 38, at: 1 },
        ],
      }),
    );
    expect(result.card.meter).toMatchObject({ beats: 4, unit: 4 });
    expect(result.card.tempo).toBe(120);
    expect(result.warnings.join(' ')).toMatch(/no time signature/);
    expect(result.warnings.join(' ')).toMatch(/no tempo/);
  });

  it('leaves out keys off the drum set, and three hands at once, with a warning', () => {
    const notes = [
      { key: 36, at: 0 },
      { key: 54, at: 1 }, // Tambourine
      { key: 42, at: 2 },
      { key: 38, at: 2 },
      { key: 49, at: 2 },
    ];
    const result = importMidiGroove(grooveFile({ bpm: 90, meter: [4, 4], notes }));
    const voices = result.drill.bars[0]!.hits.map((h) => h.voice);
    expect(voices).toEqual(['kick', 'crash', 'snare']);
    expect(result.warnings.join(' ')).toMatch(/Left out 1 note whose keys \(54\)/);
    expect(result.warnings.join(' ')).toMatch(/three hands at once; left out the hihat/);
  });

  it('merges two notes of one voice that land on one slot (a flam) into the louder', () => {
    const notes = [
      { key: 38, at: 0, velocity: 50 },
      { key: 38, at: 0.01, velocity: 120 },
      { key: 38, at: 1 },
    ];
    const result = importMidiGroove(grooveFile({ bpm: 90, meter: [4, 4], notes }));
    const first = result.drill.bars[0]!.hits[0]!;
    expect(first).toMatchObject({ beat: 1, slot: 0, voice: 'snare', dynamic: 'accent' });
    expect(result.warnings.join(' ')).toMatch(/merged/);
  });

  it('splits dynamics at the midpoints of the playback velocities', () => {
    const dyn = (velocity: number) =>
      importMidiGroove(grooveFile({ bpm: 90, notes: [{ key: 38, at: 0, velocity }] })).drill
        .bars[0]!.hits[0]!.dynamic;
    expect([
      dyn(GHOST_BELOW - 1),
      dyn(GHOST_BELOW),
      dyn(ACCENT_FROM - 1),
      dyn(ACCENT_FROM),
    ]).toEqual(['ghost', 'normal', 'normal', 'accent']);
  });

  it('reads a chosen track whatever its channel', () => {
    const file = grooveFile({
      bpm: 90,
      channel: 0,
      notes: [
        { key: 36, at: 0 },
        { key: 38, at: 1 },
      ],
      melody: [{ key: 60, at: 0 }],
    });
    expect(refusal(() => importMidiGroove(file))).toBe('no_drum_notes');
    const result = importMidiGroove(file, { track: 0 });
    expect(result.track).toBe(0);
    expect(result.tracks.map((t) => t.notes)).toEqual([2, 1]);
    expect(result.drill.bars[0]!.hits.map((h) => h.voice)).toEqual(['kick', 'snare']);
  });
});

describe('importMidiGroove: General MIDI keys', () => {
  it('maps the kit keys of the GM percussion key map to voices', () => {
    // MIDI Manufacturers Association, "General MIDI System Level 1" (1991), Percussion Key Map:
    // 35 Acoustic Bass Drum, 36 Bass Drum 1, 37 Side Stick, 38 Acoustic Snare, 40 Electric
    // Snare, 41 Low Floor Tom, 42 Closed Hi-Hat, 43 High Floor Tom, 44 Pedal Hi-Hat, 45 Low Tom,
    // 46 Open Hi-Hat, 47 Low-Mid Tom, 48 Hi-Mid Tom, 49 Crash Cymbal 1, 50 High Tom, 51 Ride
    // Cymbal 1, 52 Chinese Cymbal, 53 Ride Bell, 55 Splash Cymbal, 57 Crash Cymbal 2, 59 Ride
    // Cymbal 2; 39 Hand Clap, 54 Tambourine, 56 Cowbell, 58 Vibraslap are not drum-set voices.
    expect(GM_PERCUSSION_VOICE).toEqual({
      35: 'kick',
      36: 'kick',
      37: 'rim',
      38: 'snare',
      40: 'snare',
      41: 'tomFloor',
      42: 'hihat',
      43: 'tomFloor',
      44: 'hihatFoot',
      45: 'tomMid',
      46: 'hihatOpen',
      47: 'tomMid',
      48: 'tomHigh',
      49: 'crash',
      50: 'tomHigh',
      51: 'ride',
      52: 'crash',
      53: 'rideBell',
      55: 'crash',
      57: 'crash',
      59: 'ride',
    });
  });
});

describe('importMidiGroove: refusals', () => {
  const real = rockGroove(4, 96);

  it('refuses what is not a MIDI file', () => {
    expect(refusal(() => importMidiGroove(text('hello, this is text')))).toBe('not_midi');
    expect(refusal(() => importMidiGroove(new Uint8Array()))).toBe('not_midi');
  });

  it('refuses a file cut short, inside the header or inside a track', () => {
    expect(refusal(() => importMidiGroove(real.slice(0, 10)))).toBe('truncated');
    expect(refusal(() => importMidiGroove(real.slice(0, real.length - 5)))).toBe('truncated');
  });

  it('refuses a file without notes, and one without drum notes', () => {
    expect(refusal(() => importMidiGroove(grooveFile({ bpm: 90, notes: [] })))).toBe('no_notes');
    const piano = grooveFile({ bpm: 90, channel: 0, notes: [{ key: 60, at: 0 }] });
    expect(refusal(() => importMidiGroove(piano))).toBe('no_drum_notes');
    const percussion = grooveFile({
      bpm: 90,
      notes: [
        { key: 56, at: 0 },
        { key: 39, at: 1 },
      ],
    });
    expect(refusal(() => importMidiGroove(percussion))).toBe('no_drum_notes');
  });

  it('refuses more than 64 bars', () => {
    const long = grooveFile({
      bpm: 90,
      notes: [
        { key: 36, at: 0 },
        { key: 36, at: 64 * 4 },
      ],
    });
    expect(refusal(() => importMidiGroove(long))).toBe('too_long');
    const sixtyFour = grooveFile({
      bpm: 90,
      notes: [
        { key: 36, at: 0 },
        { key: 36, at: 63 * 4 },
      ],
    });
    expect(importMidiGroove(sixtyFour).drill.bars).toHaveLength(64);
  });

  it('refuses more notes than any groove needs, before the library reads them', () => {
    const notes = Array.from({ length: MAX_NOTES + 1 }, (_, i) => ({ key: 42, at: (i % 128) / 8 }));
    expect(refusal(() => importMidiGroove(grooveFile({ bpm: 90, notes })))).toBe('too_many_notes');
    // The guard counts what the library reads: every note of every track of a real file.
    const dense = Array.from({ length: 3000 }, (_, i) => ({ key: 36 + (i % 12), at: i / 8 }));
    const file = grooveFile({ bpm: 90, notes: dense, melody: [{ key: 60, at: 0 }] });
    let counted = 0;
    for (let at = 14; at < file.length;) {
      const length = new DataView(file.buffer, file.byteOffset + at + 4, 4).getUint32(0);
      counted += countNoteOns(file.subarray(at + 8, at + 8 + length));
      at += 8 + length;
    }
    expect(counted).toBe(3001);
  });

  it('refuses a track that is not there, and SMPTE timing', () => {
    expect(refusal(() => importMidiGroove(real, { track: 3 }))).toBe('no_such_track');
    const smpte = real.slice();
    smpte[12] = 0xe7; // −25 frames a second, 40 ticks a frame
    smpte[13] = 0x28;
    expect(refusal(() => importMidiGroove(smpte))).toBe('unsupported_timing');
  });

  it('fuzzed bytes only ever give a refusal', () => {
    const header = [0x4d, 0x54, 0x68, 0x64, 0, 0, 0, 6, 0, 1, 0, 1, 1, 0xe0];
    const bytes = fc.oneof(
      fc.uint8Array({ maxLength: 200 }),
      fc.uint8Array({ maxLength: 200 }).map((tail) => new Uint8Array([...header, ...tail])),
      fc
        .uint8Array({ maxLength: 200 })
        .map(
          (body) =>
            new Uint8Array([...header, 0x4d, 0x54, 0x72, 0x6b, 0, 0, 0, body.length, ...body]),
        ),
    );
    fc.assert(
      fc.property(bytes, (input) => {
        try {
          importMidiGroove(input);
        } catch (error) {
          expect(error).toBeInstanceOf(MidiImportError);
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('every truncation and corruption of a real file gives a drill or a refusal, never another error', () => {
    fc.assert(
      fc.property(
        fc.nat({ max: real.length - 1 }),
        fc.array(fc.tuple(fc.nat({ max: real.length - 1 }), fc.integer({ min: 0, max: 255 })), {
          maxLength: 4,
        }),
        (cut, flips) => {
          const input = real.slice(0, cut);
          for (const [at, value] of flips) if (at < input.length) input[at] = value;
          try {
            importMidiGroove(input);
          } catch (error) {
            expect(error).toBeInstanceOf(MidiImportError);
          }
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });
});
