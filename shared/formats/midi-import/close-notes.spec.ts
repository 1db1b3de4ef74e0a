import { writeMidi, type MidiEvent } from 'midi-file';
import { describe, expect, it } from 'vitest';
import { closeOpenNotes } from './close-notes';
import { readMidi } from './read-midi';
import { grooveFile } from './testing/groove-file';

const PPQ = 480;

/** A one-track file on channel 10 (0-based 9) of the given events, then end of track. */
function file(events: MidiEvent[]): Uint8Array {
  const track: MidiEvent[] = [...events, { deltaTime: 0, meta: true, type: 'endOfTrack' }];
  return Uint8Array.from(
    writeMidi({ header: { format: 0, numTracks: 1, ticksPerBeat: PPQ }, tracks: [track] }),
  );
}

const on = (deltaTime: number, noteNumber: number): MidiEvent => ({
  deltaTime,
  type: 'noteOn',
  channel: 9,
  noteNumber,
  velocity: 100,
});
const off = (deltaTime: number, noteNumber: number): MidiEvent => ({
  deltaTime,
  type: 'noteOff',
  channel: 9,
  noteNumber,
  velocity: 0,
});

const hits = (bytes: Uint8Array) =>
  readMidi(bytes)
    .tracks.flatMap((t) => t.notes.map((n) => `${n.ticks}:${n.key}`))
    .sort((a, b) => parseInt(a) - parseInt(b) || a.localeCompare(b));

describe('hits sent as note-ons only', () => {
  // Closed hi-hat (42) on each eighth, kick (36) on 1 and 3, snare (38) on 2 and 4, never released.
  const eighths = Array.from({ length: 8 }, (_, i) => i * (PPQ / 2));
  const expected = [
    ...eighths.map((t) => `${t}:42`),
    ...[0, 2 * PPQ].map((t) => `${t}:36`),
    ...[PPQ, 3 * PPQ].map((t) => `${t}:38`),
  ].sort((a, b) => parseInt(a) - parseInt(b) || a.localeCompare(b));

  function noteOnsOnly(): Uint8Array {
    const events: MidiEvent[] = [];
    let now = 0;
    for (const t of eighths) {
      events.push(on(t - now, 42));
      now = t;
      if (t % (2 * PPQ) === 0) events.push(on(0, 36));
      else if (t % PPQ === 0) events.push(on(0, 38));
    }
    return file(events);
  }

  it('are all read, each at its own tick', () => {
    expect(hits(noteOnsOnly())).toEqual(expected);
  });

  it('are read when only some repeated strokes of a key are released', () => {
    // Three hi-hat strokes, one release after the second: every stroke still counts.
    const bytes = file([on(0, 42), on(240, 42), off(10, 42), on(230, 42)]);
    expect(hits(bytes)).toEqual(['0:42', '240:42', '480:42']);
  });

  it('leave a file whose notes are all released as it was', () => {
    const bytes = grooveFile({
      bpm: 90,
      notes: [
        { key: 36, at: 0 },
        { key: 38, at: 1 },
      ],
    });
    expect(closeOpenNotes(bytes)).toBe(bytes);
  });
});
