/**
 * The file's bars and tempos, from its time-signature and tempo events. A time signature starts a
 * new bar where it stands (Standard MIDI-File Format Spec. 1.1, Meta-Events: it applies from its
 * own time on); a file without one is in 4/4, and without a tempo at 120 quarter notes a minute
 * until its first tempo event, as the specification says.
 */
import { MidiImportError } from './errors';
import { EARLY_MARGIN } from './quantise';

export interface Meter {
  readonly beats: number;
  readonly unit: number;
}

/** A stretch of the file in one time signature, from `start` (ticks) up to the next one. */
interface Segment {
  readonly start: number;
  readonly end: number;
  readonly meter: Meter;
  readonly beatTicks: number;
  /** The file's bar (counted from 0) that the segment starts. */
  readonly firstBar: number;
}

/** Where a note falls: the file's bar (from 0), its beat (from 0) and its place in that beat. */
export interface NotePlace {
  readonly bar: number;
  readonly beat: number;
  /** Start within the beat as a share of it; slightly negative for a note played early. */
  readonly x: number;
}

const EPSILON = 1e-9;

export class Timeline {
  private readonly segments: Segment[];
  private readonly tempos: readonly { ticks: number; bpm: number }[];

  constructor(
    ppq: number,
    meters: readonly { ticks: number; beats: number; unit: number }[],
    tempos: readonly { ticks: number; bpm: number }[],
  ) {
    this.tempos = [...tempos].sort((a, b) => a.ticks - b.ticks);
    const events = [...meters]
      .filter((m) => m.beats >= 1 && m.unit >= 1)
      .sort((a, b) => a.ticks - b.ticks);
    const segments: Segment[] = [];
    let current: Segment = {
      start: 0,
      end: Infinity,
      meter: { beats: 4, unit: 4 },
      beatTicks: ppq,
      firstBar: 0,
    };
    for (const event of events) {
      const meter = { beats: event.beats, unit: event.unit };
      const barTicks = current.beatTicks * current.meter.beats;
      const bars = (event.ticks - current.start) / barTicks;
      const onBarLine = Math.abs(bars - Math.round(bars)) < EPSILON;
      // The same meter again on a bar line changes nothing.
      if (onBarLine && sameMeter(meter, current.meter)) continue;
      if (event.ticks > current.start) segments.push({ ...current, end: event.ticks });
      current = {
        start: event.ticks,
        end: Infinity,
        meter,
        beatTicks: (ppq * 4) / meter.unit,
        firstBar:
          event.ticks > current.start
            ? current.firstBar + Math.ceil(bars - EPSILON)
            : current.firstBar,
      };
    }
    segments.push(current);
    this.segments = segments;
  }

  /** Whether the file gives a tempo at all. */
  get hasTempo(): boolean {
    return this.tempos.some((t) => t.bpm > 0 && Number.isFinite(t.bpm));
  }

  /** The bar, beat and place of a note at `ticks`; a note just early belongs to the next beat. */
  place(ticks: number): NotePlace {
    let i = this.segmentIndexAt(ticks);
    let segment = this.segments[i]!;
    let at = (ticks - segment.start) / segment.beatTicks;
    let index = Math.floor(at + EARLY_MARGIN);
    const next = this.segments[i + 1];
    if (next && segment.start + index * segment.beatTicks >= next.start - EPSILON) {
      i += 1;
      segment = next;
      at = (ticks - segment.start) / segment.beatTicks;
      index = Math.floor(at + EARLY_MARGIN);
    }
    const beats = segment.meter.beats;
    return {
      bar: segment.firstBar + Math.floor(index / beats),
      beat: index % beats,
      x: at - index,
    };
  }

  /**
   * The one meter of the file's bars `first`..`last`, each whole. A change of meter within
   * them, or a bar a time signature cuts short, is refused: a drill keeps one meter throughout.
   */
  meterOf(first: number, last: number): Meter {
    const within = this.segments.filter(
      (s) => s.firstBar <= last && s.firstBar + this.barsIn(s) > first,
    );
    const meter = within[0]!.meter;
    for (const s of within) {
      if (!sameMeter(s.meter, meter)) {
        throw new MidiImportError(
          'meter_change',
          `The time signature changes from ${show(meter)} to ${show(s.meter)} at bar ${s.firstBar + 1}; a drill keeps one meter throughout. Cut the file at bar ${s.firstBar + 1} and import each part on its own.`,
        );
      }
      const shortBar = s.firstBar + Math.floor(this.barsIn(s));
      if (
        s.end !== Infinity &&
        !wholeBars(this.barsIn(s)) &&
        shortBar >= first &&
        shortBar <= last
      ) {
        throw new MidiImportError(
          'meter_change',
          `Bar ${shortBar + 1} is cut short: a time signature starts inside it. A drill's bars are whole; move the time signature to a bar line.`,
        );
      }
    }
    return meter;
  }

  /** The tick where the file's bar `bar` starts. */
  barStart(bar: number): number {
    const s = [...this.segments].reverse().find((seg) => seg.firstBar <= bar)!;
    return s.start + (bar - s.firstBar) * s.beatTicks * s.meter.beats;
  }

  /** Ticks of one beat at the file's bar `bar`. */
  beatTicksAt(bar: number): number {
    return [...this.segments].reverse().find((seg) => seg.firstBar <= bar)!.beatTicks;
  }

  /** Quarter notes a minute in force at `ticks` (120 before the first tempo event). */
  tempoAt(ticks: number): number {
    let bpm = 120;
    for (const t of this.tempos) {
      if (t.ticks > ticks + EPSILON) break;
      if (t.bpm > 0 && Number.isFinite(t.bpm)) bpm = t.bpm;
    }
    return bpm;
  }

  /** The valid tempo events after `from` and before `to` (ticks), in order. */
  tempoChanges(from: number, to: number): { ticks: number; bpm: number }[] {
    return this.tempos.filter(
      (t) => t.ticks > from && t.ticks < to && t.bpm > 0 && Number.isFinite(t.bpm),
    );
  }

  /** The file's bar (from 0) that holds `ticks`. */
  barAt(ticks: number): number {
    const s = this.segments[this.segmentIndexAt(ticks)]!;
    return s.firstBar + Math.floor((ticks - s.start) / (s.beatTicks * s.meter.beats) + EPSILON);
  }

  private segmentIndexAt(ticks: number): number {
    let i = 0;
    while (i + 1 < this.segments.length && this.segments[i + 1]!.start <= ticks) i++;
    return i;
  }

  /** How many bars a segment holds (a fraction when the next meter cuts its last one short). */
  private barsIn(s: Segment): number {
    return s.end === Infinity ? Infinity : (s.end - s.start) / (s.beatTicks * s.meter.beats);
  }
}

const sameMeter = (a: Meter, b: Meter): boolean => a.beats === b.beats && a.unit === b.unit;
const wholeBars = (n: number): boolean => Math.abs(n - Math.round(n)) < EPSILON;
const show = (m: Meter): string => `${m.beats}/${m.unit}`;
