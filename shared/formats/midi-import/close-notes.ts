import { parseMidi, writeMidi, type MidiEvent } from 'midi-file';

/**
 * Many drum files send note-ons only: a drum hit has no length, and the Standard MIDI File
 * specification lets a receiver ignore note-offs on percussion ("Standard MIDI-File Format Spec.
 * 1.1", International MIDI Association; common practice for drum machines). `@tonejs/midi` keeps
 * only notes it can pair with a note-off, so such hits would be lost. This gives every note left
 * open at the end of its track a note-off there, and returns the file unchanged when none is open.
 */
export function closeOpenNotes(bytes: Uint8Array): Uint8Array {
  const midi = parseMidi(bytes);
  let changed = false;
  const tracks = midi.tracks.map((events) => {
    const closing = openNoteOffs(events);
    if (closing.length === 0) return events;
    changed = true;
    const end = events.findIndex((event) => event.type === 'endOfTrack');
    const at = end === -1 ? events.length : end;
    // The end-of-track event keeps its delta time; the note-offs sound at the same tick.
    const endDelta = at < events.length ? events[at]!.deltaTime : 0;
    const closed = closing.map((event, i) => ({ ...event, deltaTime: i === 0 ? endDelta : 0 }));
    const tail = at < events.length ? [{ ...events[at]!, deltaTime: 0 }] : [];
    return [...events.slice(0, at), ...closed, ...tail, ...events.slice(at + 1)];
  });
  return changed ? Uint8Array.from(writeMidi({ header: midi.header, tracks })) : bytes;
}

/**
 * Note-offs for the notes still sounding at the end of a track: a note-off (or a note-on of
 * velocity 0, which the parser reports as a note-off) ends the earliest open note of its key and
 * channel.
 */
function openNoteOffs(events: readonly MidiEvent[]): MidiEvent[] {
  const open = new Map<string, { channel: number; noteNumber: number; count: number }>();
  for (const event of events) {
    if (event.type !== 'noteOn' && event.type !== 'noteOff') continue;
    const key = `${event.channel}:${event.noteNumber}`;
    const entry = open.get(key) ?? {
      channel: event.channel,
      noteNumber: event.noteNumber,
      count: 0,
    };
    entry.count = Math.max(0, entry.count + (event.type === 'noteOn' ? 1 : -1));
    open.set(key, entry);
  }
  const offs: MidiEvent[] = [];
  for (const { channel, noteNumber, count } of open.values()) {
    for (let i = 0; i < count; i++) {
      offs.push({ deltaTime: 0, type: 'noteOff', channel, noteNumber, velocity: 0 });
    }
  }
  return offs;
}
