import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { generateDrill, type DrillBar } from '../../generator/index';
import { barsOnGrid } from './import-groove';
import { importMidiGroove, MidiImportError } from './index';
import { grooveFile, rockGroove, type GrooveNote } from './testing/groove-file';

// Each run imports a file and generates with every bar pinned: a few dozen runs cover the shapes.
const NUM_RUNS = Math.min(40, Number(process.env['FC_RUNS'] ?? 1000));

function refused(run: () => unknown): MidiImportError {
  try {
    run();
  } catch (error) {
    if (error instanceof MidiImportError) return error;
    throw error;
  }
  throw new Error('the file was accepted');
}

/** Kick on 1, snare on 3, hi-hat on every beat, for `bars` bars of `beats` from quarter `from`. */
function plainBars(from: number, bars: number, beats: number, beatLength = 1): GrooveNote[] {
  const notes: GrooveNote[] = [];
  for (let b = 0; b < bars; b++) {
    const start = from + b * beats * beatLength;
    for (let i = 0; i < beats; i++) notes.push({ key: 42, at: start + i * beatLength });
    notes.push({ key: 36, at: start }, { key: 38, at: start + 2 * beatLength });
  }
  return notes;
}

describe('importMidiGroove: tempo changes', () => {
  // Standard MIDI-File Format Spec. 1.1 (International MIDI Association), Meta-Events: Set Tempo
  // holds from its own time on, so a note's ticks place it whatever the tempo.
  const file = grooveFile({
    bpm: 90,
    meter: [4, 4],
    notes: [...plainBars(0, 4, 4), { key: 38, at: 8 + 1 + 0.05 }],
    changes: [
      { at: 8, bpm: 120 },
      { at: 12, bpm: 60 },
    ],
  });
  const result = importMidiGroove(file);

  it('keeps the first bar’s tempo and names every change with its bar', () => {
    expect(result.card.tempo).toBe(90);
    expect(result.drill.bars).toHaveLength(4);
    const warning = result.warnings.find((w) => w.startsWith('The tempo changes'));
    expect(warning).toBe(
      'The tempo changes (to 120 at bar 3, to 60 at bar 4, in quarter notes a minute); a drill has one tempo: it keeps 90, its first bar’s.'.replace(
        '’',
        "'",
      ),
    );
  });

  it('reports a beat’s timing error in milliseconds at the tempo where that beat is played', () => {
    // A snare 0.05 of a beat late on beat 2 of bar 3, played at 120: 0.05 × 500 ms = 25 ms.
    const late = result.residuals.find((r) => r.bar === 3 && r.beat === 2)!;
    expect(late.beats).toBeCloseTo(0.05, 3);
    expect(late.ms).toBeCloseTo(25, 0);
  });

  it('says nothing of a tempo change outside the groove’s bars', () => {
    const quiet = importMidiGroove(
      grooveFile({
        bpm: 100,
        meter: [4, 4],
        notes: plainBars(0, 2, 4),
        changes: [{ at: 16, bpm: 70 }],
      }),
    );
    expect(quiet.card.tempo).toBe(100);
    expect(quiet.warnings.join(' ')).not.toMatch(/tempo/);
  });
});

describe('importMidiGroove: time-signature changes', () => {
  it('starts a new bar at a change: a count-in bar of 4/4 before a 3/4 groove is left out', () => {
    const result = importMidiGroove(
      grooveFile({
        bpm: 100,
        meter: [4, 4],
        // The 3/4 groove starts on quarter 4, where the time signature changes.
        notes: plainBars(4, 3, 3),
        changes: [{ at: 4, meter: [3, 4] }],
      }),
    );
    expect(result.card.meter).toMatchObject({ beats: 3, unit: 4 });
    expect(result.drill.bars).toHaveLength(3);
    for (const bar of result.drill.bars) {
      expect(bar.hits.filter((h) => h.voice === 'kick').map((h) => [h.beat, h.slot])).toEqual([
        [1, 0],
      ]);
      expect(bar.hits.filter((h) => h.voice === 'snare').map((h) => h.beat)).toEqual([3]);
    }
    expect(result.warnings.join(' ')).toMatch(/Left out 1 empty bar/);
  });

  it('counts bars from a change that does not fall on a bar line of the meter before it', () => {
    // 4/4 from 0, then 6/8 from quarter 6 (the middle of bar 2): bar 3 of the file starts there.
    const result = importMidiGroove(
      grooveFile({
        bpm: 80,
        meter: [4, 4],
        notes: [
          { key: 36, at: 6 },
          { key: 38, at: 6 + 1.5 },
        ],
        changes: [{ at: 6, meter: [6, 8] }],
      }),
    );
    expect(result.card.meter).toMatchObject({ beats: 6, unit: 8 });
    expect(result.drill.bars).toHaveLength(1);
    const snare = result.drill.bars[0]!.hits.find((h) => h.voice === 'snare')!;
    // Quarter 7.5 is three eighths after the change: beat 4 of the 6/8 bar.
    expect([snare.beat, snare.slot]).toEqual([4, 0]);
    expect(result.warnings.join(' ')).toMatch(/Left out 2 empty bars/);
  });

  it('reads a time signature stated again on a bar line as no change', () => {
    const result = importMidiGroove(
      grooveFile({
        bpm: 100,
        meter: [4, 4],
        notes: plainBars(0, 4, 4),
        changes: [{ at: 8, meter: [4, 4] }],
      }),
    );
    expect(result.drill.bars).toHaveLength(4);
  });

  it('refuses a change of meter inside the groove, naming the bar where it happens', () => {
    const error = refused(() =>
      importMidiGroove(
        grooveFile({
          bpm: 100,
          meter: [4, 4],
          notes: [...plainBars(0, 2, 4), ...plainBars(8, 2, 3)],
          changes: [{ at: 8, meter: [3, 4] }],
        }),
      ),
    );
    expect(error.code).toBe('meter_change');
    expect(error.message).toBe(
      'The time signature changes from 4/4 to 3/4 at bar 3; a drill keeps one meter throughout. Cut the file at bar 3 and import each part on its own.',
    );
  });

  it('refuses a bar that a time signature cuts short inside the groove', () => {
    // 4/4, then 4/4 again after two beats of bar 2: bar 2 is two beats long.
    const error = refused(() =>
      importMidiGroove(
        grooveFile({
          bpm: 100,
          meter: [4, 4],
          notes: [...plainBars(0, 1, 4), { key: 36, at: 4 }, ...plainBars(6, 1, 4)],
          changes: [{ at: 6, meter: [4, 4] }],
        }),
      ),
    );
    expect(error.code).toBe('meter_change');
    expect(error.message).toMatch(/^Bar 2 is cut short/);
  });
});

describe('importMidiGroove: the inferred card accepts the groove’s own bars', () => {
  /** Pinning every imported bar, the engine gives back exactly those bars. */
  function expectAccepted(bytes: Uint8Array): void {
    const result = importMidiGroove(bytes);
    const own = barsOnGrid(result.drill.bars, result.card);
    expect(own, 'every hit has a slot on the card’s grid').not.toBeNull();
    const kept = generateDrill(result.card, 'accepts', { keep: own! });
    // The hits come back as pinned (each bar's tension is the engine's own reading).
    const hitsOf = (bars: readonly DrillBar[] | null) =>
      bars!.map(({ bar, beats, hits }) => ({ bar, beats, hits }));
    expect(hitsOf(kept.bars)).toEqual(hitsOf(own));
    expect(result.warnings.join(' ')).not.toMatch(/does not take the groove/);
  }

  it('a rock groove with ghost notes', () => {
    expectAccepted(rockGroove(4, 100));
  });

  it('a 6/8 groove', () => {
    const notes = [0, 1, 2, 3, 4, 5].map((at) => ({ key: 42, at }));
    notes.push({ key: 36, at: 0 }, { key: 38, at: 3 }, { key: 38, at: 4.5 });
    expectAccepted(grooveFile({ bpm: 60, meter: [6, 8], notes }));
  });

  it('sixteenth-note grooves with kick, snare and tom between a steady eighth-note hi-hat', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }),
        fc.array(
          fc.record({
            key: fc.constantFrom(36, 38, 45),
            // Odd sixteenths: the slots the hi-hat leaves free.
            at: fc.integer({ min: 0, max: 31 }).map((i) => 2 * i + 1),
            velocity: fc.constantFrom(40, 96, 120),
          }),
          { maxLength: 24 },
        ),
        (bars, extra) => {
          const notes: GrooveNote[] = [];
          for (let e = 0; e < bars * 8; e++) notes.push({ key: 42, at: e / 2 });
          for (const n of extra)
            if (n.at < bars * 16) notes.push({ key: n.key, at: n.at / 4, velocity: n.velocity });
          expectAccepted(grooveFile({ bpm: 96, meter: [4, 4], notes }));
        },
      ),
      { numRuns: NUM_RUNS },
    );
  }, 180_000);

  it('says so when it cannot: a ghost note on a hi-hat eighth is not a fill the card can place', () => {
    // Fills go to the slots the time layer leaves free (the engine's rule), so this bar cannot
    // be pinned on a card with the hi-hat ostinato.
    const notes: GrooveNote[] = [0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5].map((at) => ({ key: 42, at }));
    notes.push({ key: 36, at: 0 }, { key: 38, at: 1.5, velocity: 40 });
    const result = importMidiGroove(grooveFile({ bpm: 96, meter: [4, 4], notes }));
    expect(result.warnings.join(' ')).toMatch(/does not take the groove's own bars/);
    expect(() => generateDrill(result.card, 'variations')).not.toThrow();
  });
});
