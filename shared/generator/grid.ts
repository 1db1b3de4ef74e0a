/**
 * The drill's time grid. Every position is an *instant*: an integer index over all slots of the
 * drill (bar by bar, beat by beat). Times in beats are exact rationals; `ticks` puts every slot
 * of every beat on one integer scale (the lcm of the subdivisions used), so comparisons of
 * durations never touch floats.
 */

export interface Position {
  /** Bar, counted from 1. */
  readonly bar: number;
  /** Beat in the bar, counted from 1. */
  readonly beat: number;
  /** 0-based slot inside the beat. */
  readonly slot: number;
}

export interface Grid {
  readonly bars: number;
  /** Slots per beat, one entry per beat of the bar. */
  readonly beats: readonly number[];
  readonly slotsPerBar: number;
  readonly beatsPerBar: number;
  readonly instants: number;
  /** Ticks per beat: the lcm of all subdivisions used. */
  readonly ticksPerBeat: number;
  /** Instant of beat (0-based) `b`'s slot 0 inside a bar. */
  readonly beatStart: readonly number[];
  /** Per instant inside a bar: 0-based beat and slot. */
  readonly beatOf: readonly number[];
  readonly slotOf: readonly number[];
}

export const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
export const lcm = (a: number, b: number): number => (a / gcd(a, b)) * b;

/** Slots per beat for each beat, from a card's subdivision (number or per-beat list). */
export function beatsOf(subdivision: number | readonly number[], beats: number): number[] {
  return typeof subdivision === 'number'
    ? Array.from({ length: beats }, () => subdivision)
    : subdivision.slice(0, beats);
}

export function createGrid(bars: number, beats: readonly number[]): Grid {
  const beatStart: number[] = [];
  const beatOf: number[] = [];
  const slotOf: number[] = [];
  let ticksPerBeat = 1;
  beats.forEach((slots, b) => {
    beatStart.push(beatOf.length);
    ticksPerBeat = lcm(ticksPerBeat, slots);
    for (let s = 0; s < slots; s++) {
      beatOf.push(b);
      slotOf.push(s);
    }
  });
  const slotsPerBar = beatOf.length;
  return {
    bars,
    beats,
    slotsPerBar,
    beatsPerBar: beats.length,
    instants: bars * slotsPerBar,
    ticksPerBeat,
    beatStart,
    beatOf,
    slotOf,
  };
}

/** Slots in 0-based beat `b` of the bar. */
export function slotsIn(grid: Grid, b: number): number {
  return grid.beats[b] ?? 1;
}

/** The instant of a position (bar and beat from 1, slot from 0). */
export function instantOf(grid: Grid, bar: number, beat: number, slot: number): number {
  return (bar - 1) * grid.slotsPerBar + (grid.beatStart[beat - 1] ?? 0) + slot;
}

export function positionOf(grid: Grid, instant: number): Position {
  const inBar = instant % grid.slotsPerBar;
  return {
    bar: Math.floor(instant / grid.slotsPerBar) + 1,
    beat: (grid.beatOf[inBar] ?? 0) + 1,
    slot: grid.slotOf[inBar] ?? 0,
  };
}

/** 0-based bar of an instant. */
export function barIndexOf(grid: Grid, instant: number): number {
  return Math.floor(instant / grid.slotsPerBar);
}

/** Time of an instant in ticks from the start of the drill. */
export function ticksOf(grid: Grid, instant: number): number {
  const inBar = instant % grid.slotsPerBar;
  const b = grid.beatOf[inBar] ?? 0;
  const barTicks = grid.beatsPerBar * grid.ticksPerBeat;
  return (
    barIndexOf(grid, instant) * barTicks +
    b * grid.ticksPerBeat +
    ((grid.slotOf[inBar] ?? 0) * grid.ticksPerBeat) / slotsIn(grid, b)
  );
}

/** Wraps an instant into the drill: drills are loops. */
export function wrapInstant(grid: Grid, instant: number): number {
  return ((instant % grid.instants) + grid.instants) % grid.instants;
}

/**
 * The instant `shift` slots away from beat `globalBeat`'s slot 0 (0-based over the drill).
 * The shift counts slots of the beat it starts in; the rest is counted in each neighbouring
 * beat's own slots. Wraps around the drill's ends.
 */
export function shiftedInstant(grid: Grid, globalBeat: number, shift: number): number {
  const totalBeats = grid.bars * grid.beatsPerBar;
  let beat = globalBeat;
  let slot = shift;
  while (slot < 0) {
    beat -= 1;
    slot += slotsIn(grid, mod(beat, grid.beatsPerBar));
  }
  while (slot >= slotsIn(grid, mod(beat, grid.beatsPerBar))) {
    slot -= slotsIn(grid, mod(beat, grid.beatsPerBar));
    beat += 1;
  }
  const wrapped = mod(beat, totalBeats);
  const bar = Math.floor(wrapped / grid.beatsPerBar);
  const b = wrapped % grid.beatsPerBar;
  return bar * grid.slotsPerBar + (grid.beatStart[b] ?? 0) + slot;
}

const mod = (a: number, n: number): number => ((a % n) + n) % n;

/** Where an evenly spaced point lands, or why it does not land on a slot. */
export type Landing =
  | { readonly ok: true; readonly instant: number }
  | { readonly ok: false; readonly beat: number; readonly needs: number };

/**
 * Point `i` of `count` evenly spaced points over `span` beats, in the cycle that starts at
 * 0-based global beat `cycleStart`: at `cycleStart + i * span / count` beats. Returns null past
 * the drill's end (cycles are cut at the end, not wrapped).
 */
export function evenPoint(
  grid: Grid,
  cycleStart: number,
  i: number,
  count: number,
  span: number,
): Landing | null {
  const numerator = i * span; // point = cycleStart + numerator / count beats
  const beat = cycleStart + Math.floor(numerator / count);
  if (beat >= grid.bars * grid.beatsPerBar) return null;
  const remainder = numerator % count; // fraction remainder / count of the beat
  const b = beat % grid.beatsPerBar;
  const slots = slotsIn(grid, b);
  const needs = count / gcd(remainder, count);
  if ((remainder * slots) % count !== 0) return { ok: false, beat: b + 1, needs };
  const bar = Math.floor(beat / grid.beatsPerBar);
  return {
    ok: true,
    instant: bar * grid.slotsPerBar + (grid.beatStart[b] ?? 0) + (remainder * slots) / count,
  };
}
