/**
 * A minimal Standard MIDI File reader for tests, written from the specification alone (MIDI
 * Manufacturers Association, "Standard MIDI Files 1.0", 1996; sections named beside each step) so
 * the exports are checked by something other than the library that wrote them.
 */

/** One event of a track chunk, with its absolute time and the exact bytes of its delta time. */
export type SmfEvent =
  | { kind: 'meta'; tick: number; delta: number[]; type: number; data: number[] }
  | { kind: 'sysex'; tick: number; delta: number[]; data: number[] }
  | {
      kind: 'channel';
      tick: number;
      delta: number[];
      status: number;
      /** 0-based channel (the low nibble of the status byte). */
      channel: number;
      data: number[];
    };

export interface SmfFile {
  /** The header chunk's 14 bytes as found. */
  headerBytes: number[];
  format: number;
  tracks: number;
  division: number;
  trackEvents: SmfEvent[][];
}

/**
 * A variable-length quantity: 7 bits a byte, most significant group first, bit 7 set on every
 * byte but the last (§1 "Sequences, Tracks, Chunks: File Block Structure", Conventions).
 */
export function readVlq(bytes: ArrayLike<number>, at: number): { value: number; length: number } {
  let value = 0;
  for (let i = 0; i < 4; i++) {
    const byte = bytes[at + i];
    if (byte === undefined) throw new Error(`Variable-length quantity runs past the end at ${at}`);
    value = value * 128 + (byte & 0x7f);
    if ((byte & 0x80) === 0) return { value, length: i + 1 };
  }
  throw new Error(`Variable-length quantity longer than four bytes at ${at}`);
}

/** The same encoding the other way, for comparing written delta times byte for byte. */
export function writeVlq(value: number): number[] {
  const groups = [value & 0x7f];
  let rest = Math.floor(value / 128);
  while (rest > 0) {
    groups.unshift((rest & 0x7f) | 0x80);
    rest = Math.floor(rest / 128);
  }
  return groups;
}

function word32(b: ArrayLike<number>, at: number): number {
  return ((b[at]! << 24) >>> 0) + (b[at + 1]! << 16) + (b[at + 2]! << 8) + b[at + 3]!;
}

function text4(b: ArrayLike<number>, at: number): string {
  return String.fromCharCode(b[at]!, b[at + 1]!, b[at + 2]!, b[at + 3]!);
}

/** Data bytes that follow a channel status (§2 "Track Chunks", MIDI event; program change 1). */
function channelDataLength(status: number): number {
  const high = status & 0xf0;
  return high === 0xc0 || high === 0xd0 ? 1 : 2;
}

export function readSmf(bytes: Uint8Array): SmfFile {
  // §2 "Header Chunks": "MThd", a 32-bit length of 6, then format, ntrks and division, 16 bits
  // each, most significant byte first.
  if (text4(bytes, 0) !== 'MThd') throw new Error('No MThd chunk at the start');
  const headerLength = word32(bytes, 4);
  const format = (bytes[8]! << 8) + bytes[9]!;
  const tracks = (bytes[10]! << 8) + bytes[11]!;
  const division = (bytes[12]! << 8) + bytes[13]!;
  let at = 8 + headerLength;
  const trackEvents: SmfEvent[][] = [];
  while (at < bytes.length) {
    const type = text4(bytes, at);
    const length = word32(bytes, at + 4);
    const start = at + 8;
    const end = start + length;
    if (end > bytes.length) throw new Error(`Chunk ${type} runs past the end of the file`);
    if (type === 'MTrk') trackEvents.push(readTrack(bytes, start, end));
    at = end;
  }
  return {
    headerBytes: Array.from(bytes.slice(0, 14)),
    format,
    tracks,
    division,
    trackEvents,
  };
}

/** §2 "Track Chunks": <delta-time> <event> pairs; running status for channel messages. */
function readTrack(bytes: Uint8Array, start: number, end: number): SmfEvent[] {
  const events: SmfEvent[] = [];
  let at = start;
  let tick = 0;
  let running = 0;
  while (at < end) {
    const { value, length } = readVlq(bytes, at);
    const delta = Array.from(bytes.slice(at, at + length));
    at += length;
    tick += value;
    const first = bytes[at]!;
    if (first === 0xff) {
      // §3 "Meta-Events": FF <type> <length as a variable-length quantity> <bytes>.
      const type = bytes[at + 1]!;
      const len = readVlq(bytes, at + 2);
      const dataStart = at + 2 + len.length;
      events.push({
        kind: 'meta',
        tick,
        delta,
        type,
        data: Array.from(bytes.slice(dataStart, dataStart + len.value)),
      });
      at = dataStart + len.value;
      running = 0;
    } else if (first === 0xf0 || first === 0xf7) {
      const len = readVlq(bytes, at + 1);
      const dataStart = at + 1 + len.length;
      events.push({
        kind: 'sysex',
        tick,
        delta,
        data: Array.from(bytes.slice(dataStart, dataStart + len.value)),
      });
      at = dataStart + len.value;
      running = 0;
    } else {
      let status = running;
      if (first & 0x80) {
        status = first;
        at += 1;
      }
      if (!(status & 0x80)) throw new Error(`Data byte without a status at ${at}`);
      running = status;
      const n = channelDataLength(status);
      events.push({
        kind: 'channel',
        tick,
        delta,
        status: status & 0xf0,
        channel: status & 0x0f,
        data: Array.from(bytes.slice(at, at + n)),
      });
      at += n;
    }
  }
  return events;
}
