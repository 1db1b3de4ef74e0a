import * as tonejs from '@tonejs/midi';

const Midi: typeof tonejs.Midi =
  tonejs.Midi ?? (tonejs as unknown as { default: typeof tonejs }).default.Midi;

export interface GrooveNote {
  /** GM key. */
  readonly key: number;
  /** Start in beats of the meter's unit from the start of the file. */
  readonly at: number;
  /** 1–127. */
  readonly velocity?: number;
}

export interface GrooveFile {
  readonly bpm?: number;
  readonly meter?: readonly [number, number];
  readonly channel?: number;
  readonly notes: readonly GrooveNote[];
  /**
   * Tempo and time-signature events after the start, at `at` quarter notes from the start of the
   * file (the notes' `at` stays in beats of the first meter's unit).
   */
  readonly changes?: readonly {
    readonly at: number;
    readonly bpm?: number;
    readonly meter?: readonly [number, number];
  }[];
  /** Another track's notes (channel 1, a piano part). */
  readonly melody?: readonly GrooveNote[];
}

/** Writes a small Standard MIDI File with `@tonejs/midi` (480 ticks per quarter), for tests. */
export function grooveFile(spec: GrooveFile): Uint8Array {
  const midi = new Midi();
  const [beats, unit] = spec.meter ?? [4, 4];
  if (spec.bpm !== undefined) midi.header.setTempo(spec.bpm);
  if (spec.meter) midi.header.timeSignatures.push({ ticks: 0, timeSignature: [beats, unit] });
  for (const change of spec.changes ?? []) {
    const ticks = Math.round(change.at * midi.header.ppq);
    if (change.bpm !== undefined) midi.header.tempos.push({ ticks, bpm: change.bpm });
    if (change.meter) midi.header.timeSignatures.push({ ticks, timeSignature: [...change.meter] });
  }
  midi.header.update();
  const beatTicks = (midi.header.ppq * 4) / unit;
  const track = midi.addTrack();
  track.channel = spec.channel ?? 9;
  for (const note of spec.notes) {
    track.addNote({
      midi: note.key,
      ticks: Math.round(note.at * beatTicks),
      durationTicks: 20,
      velocity: (note.velocity ?? 96) / 127,
    });
  }
  if (spec.melody) {
    const piano = midi.addTrack();
    piano.channel = 0;
    for (const note of spec.melody) {
      piano.addNote({
        midi: note.key,
        ticks: Math.round(note.at * beatTicks),
        durationTicks: 100,
        velocity: 0.7,
      });
    }
  }
  return midi.toArray();
}

/** A two-bar rock groove in 4/4: eighth hi-hats, kick on 1 and the "&" of 3, snare on 2 and 4. */
export function rockGroove(bars = 2, bpm = 100): Uint8Array {
  const notes: GrooveNote[] = [];
  for (let bar = 0; bar < bars; bar++) {
    const start = bar * 4;
    for (let e = 0; e < 8; e++) notes.push({ key: 42, at: start + e / 2 });
    notes.push({ key: 36, at: start }, { key: 36, at: start + 2.5 });
    notes.push(
      { key: 38, at: start + 1, velocity: 120 },
      { key: 38, at: start + 3, velocity: 120 },
    );
    notes.push({ key: 38, at: start + 3.75, velocity: 40 });
  }
  return grooveFile({ bpm, meter: [4, 4], notes });
}
