import * as tonejs from '@tonejs/midi';
import { closeOpenNotes } from './close-notes';
import { MidiImportError } from './errors';

// Node loads the package's CommonJS build (only a default export); bundlers load its ES build.
const Midi: typeof tonejs.Midi =
  tonejs.Midi ?? (tonejs as unknown as { default: typeof tonejs }).default.Midi;

/** A note as the file holds it: key, start in ticks, velocity 1–127. */
export interface MidiNote {
  readonly key: number;
  readonly ticks: number;
  readonly velocity: number;
}

/** One track of the file, as the page lists them for the teacher to choose from. */
export interface MidiTrackSummary {
  /** Position in the file's track list (format 0 files are split by channel). */
  readonly index: number;
  readonly name: string;
  /** MIDI channel counted from 1, as the specification does (10 = percussion). */
  readonly channel: number;
  readonly notes: number;
}

export interface MidiFileContent {
  /** Ticks per quarter note. */
  readonly ppq: number;
  readonly tempos: readonly { readonly ticks: number; readonly bpm: number }[];
  readonly meters: readonly {
    readonly ticks: number;
    readonly beats: number;
    readonly unit: number;
  }[];
  readonly tracks: readonly { readonly summary: MidiTrackSummary; readonly notes: MidiNote[] }[];
}

const ascii = (bytes: Uint8Array, at: number): string =>
  String.fromCharCode(bytes[at]!, bytes[at + 1]!, bytes[at + 2]!, bytes[at + 3]!);
const u32 = (bytes: Uint8Array, at: number): number =>
  bytes[at]! * 0x1000000 + (bytes[at + 1]! << 16) + (bytes[at + 2]! << 8) + bytes[at + 3]!;
const u16 = (bytes: Uint8Array, at: number): number => (bytes[at]! << 8) + bytes[at + 1]!;

/**
 * Checks the chunk structure of a Standard MIDI File ("Standard MIDI-File Format Spec. 1.1",
 * International MIDI Association: an `MThd` chunk of at least 6 bytes, then chunks of a 4-byte
 * type and a 32-bit big-endian length) and returns the header with only its `MThd` and `MTrk`
 * chunks (readers skip chunk types they do not know, as the specification asks; the library
 * expects track chunks only). Throws a refusal for anything else.
 */
export function checkChunks(bytes: Uint8Array): Uint8Array {
  if (bytes.length < 8 || ascii(bytes, 0) !== 'MThd') {
    throw new MidiImportError(
      'not_midi',
      'This is not a Standard MIDI File: it does not begin with the "MThd" header.',
    );
  }
  const headerLength = u32(bytes, 4);
  if (bytes.length < 8 + Math.max(6, headerLength)) {
    throw new MidiImportError(
      'truncated',
      'The file ends inside its MIDI header: it is cut short.',
    );
  }
  if (headerLength < 6) {
    throw new MidiImportError('not_midi', 'The MIDI header is too short to be a MIDI file.');
  }
  const format = u16(bytes, 8);
  const tracks = u16(bytes, 10);
  const division = u16(bytes, 12);
  if (format > 2) {
    throw new MidiImportError(
      'not_midi',
      `The MIDI header names format ${format}; only 0, 1 and 2 exist.`,
    );
  }
  if (division & 0x8000) {
    throw new MidiImportError(
      'unsupported_timing',
      'The file counts time in SMPTE frames; Tensile reads files that count ticks per quarter note.',
    );
  }
  if (division === 0) {
    throw new MidiImportError('not_midi', 'The MIDI header gives 0 ticks per quarter note.');
  }
  const kept: Uint8Array[] = [bytes.subarray(0, 8 + headerLength)];
  let notes = 0;
  let found = 0;
  let at = 8 + headerLength;
  while (at < bytes.length && found < tracks) {
    if (bytes.length - at < 8) {
      throw new MidiImportError(
        'truncated',
        'The file ends inside a chunk header: it is cut short.',
      );
    }
    const length = u32(bytes, at + 4);
    if (length > bytes.length - at - 8) {
      throw new MidiImportError(
        'truncated',
        `Track ${found + 1} is cut short: it announces ${length} bytes but the file ends after ${bytes.length - at - 8}.`,
      );
    }
    if (ascii(bytes, at) === 'MTrk') {
      kept.push(bytes.subarray(at, at + 8 + length));
      found += 1;
      notes += countNoteOns(bytes.subarray(at + 8, at + 8 + length));
      if (notes > MAX_NOTES) {
        throw new MidiImportError(
          'too_many_notes',
          `The file holds more than ${MAX_NOTES.toLocaleString('en')} notes; a groove of at most 64 bars needs far fewer.`,
        );
      }
    }
    at += 8 + length;
  }
  if (found < tracks) {
    throw new MidiImportError(
      'truncated',
      `The header announces ${tracks} track${tracks === 1 ? '' : 's'} but the file holds ${found}: it is cut short.`,
    );
  }
  const out = new Uint8Array(kept.reduce((sum, part) => sum + part.length, 0));
  let offset = 0;
  for (const part of kept) {
    out.set(part, offset);
    offset += part.length;
  }
  return out;
}

/**
 * Most notes a file may hold: far above any groove of 64 bars (64 bars of 4/4 in thirty-seconds
 * on four voices is 8 192), and low enough to bound the library's note pairing, whose time grows
 * with the square of the notes (a 480 KB file of 60 000 notes took 53 s here, 20 000 notes 3 s,
 * both on 2 cores at a load average of 27).
 */
export const MAX_NOTES = 20_000;

/** Reads a variable-length quantity at `at`: its value and the index after it. */
function vlq(data: Uint8Array, at: number): [number, number] {
  let value = 0;
  for (let i = 0; i < 4 && at < data.length; i++) {
    const byte = data[at++]!;
    value = value * 128 + (byte & 0x7f);
    if (!(byte & 0x80)) break;
  }
  return [value, at];
}

/**
 * Counts the note-on events of a track's data (velocity above 0), as a guard before the library
 * reads it: delta times, running status, meta and system-exclusive lengths as the Standard MIDI
 * File specification lays them out. It stops where the data stops making sense and leaves the
 * verdict on damaged data to the library.
 */
export function countNoteOns(data: Uint8Array): number {
  let count = 0;
  let running = 0;
  let at = 0;
  while (at < data.length) {
    at = vlq(data, at)[1];
    if (at >= data.length) break;
    let status = data[at]!;
    if (status < 0x80) {
      if (!running) break;
      status = running;
    } else {
      at += 1;
    }
    if (status === 0xff || status === 0xf0 || status === 0xf7) {
      if (status === 0xff) at += 1;
      const [length, after] = vlq(data, at);
      at = after + length;
      running = 0;
      continue;
    }
    if (status >= 0xf0) break;
    running = status;
    const kind = status & 0xf0;
    if (kind === 0x90 && (data[at + 1] ?? 0) > 0) count += 1;
    at += kind === 0xc0 || kind === 0xd0 ? 1 : 2;
  }
  return count;
}

/**
 * Reads a Standard MIDI File with `@tonejs/midi`, hits without note-offs included. Throws only `MidiImportError`: the library
 * throws plain strings (and may throw other errors) on damaged track data, which become a
 * `damaged` refusal carrying its words.
 */
export function readMidi(bytes: Uint8Array): MidiFileContent {
  const checked = checkChunks(bytes);
  let midi: InstanceType<typeof Midi>;
  try {
    midi = new Midi(closeOpenNotes(checked));
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    throw new MidiImportError(
      'damaged',
      `The file's track data is damaged (${why.slice(0, 160)}).`,
    );
  }
  return {
    ppq: midi.header.ppq,
    tempos: midi.header.tempos.map((t) => ({ ticks: t.ticks, bpm: t.bpm })),
    meters: midi.header.timeSignatures.map((t) => ({
      ticks: t.ticks,
      beats: t.timeSignature[0] ?? 4,
      unit: t.timeSignature[1] ?? 4,
    })),
    tracks: midi.tracks.map((track, index) => ({
      summary: {
        index,
        name: track.name,
        channel: track.channel + 1,
        notes: track.notes.length,
      },
      notes: track.notes.map((note) => ({
        key: note.midi,
        ticks: note.ticks,
        velocity: Math.max(1, Math.min(127, Math.round(note.velocity * 127))),
      })),
    })),
  };
}
