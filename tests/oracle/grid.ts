/**
 * The oracle's own grid arithmetic. It shares no code with the engine: positions are integers
 * (bars, beats, slots, and the index of a slot in the drill's flattened grid), times are exact
 * rationals of integers, never floats.
 *
 * Counting follows the drill contract: bars and beats count from 1, a slot is the 0-based position
 * inside its beat, and a hit lies `(beat − 1) + slot / slots` beats after the start of its bar.
 */

export interface Place {
  readonly bar: number;
  readonly beat: number;
  readonly slot: number;
}

export function gcd(a: number, b: number): number {
  let x = Math.abs(a);
  let y = Math.abs(b);
  while (y !== 0) [x, y] = [y, x % y];
  return x;
}

/** Non-negative remainder (JavaScript's `%` keeps the dividend's sign). */
export function mod(a: number, n: number): number {
  return ((a % n) + n) % n;
}

/**
 * One drill's grid: every bar has the same beats, beat `b` (1-based) has `subs[b − 1]` slots.
 * A slot's *index* counts slots from the first slot of bar 1 (0-based), straight through beats
 * and bar lines: moving by `n` slots is adding `n` to the index, and wrapping around the drill
 * (drills are loops) is taking the index modulo `totalSlots`.
 */
export class Grid {
  readonly beatsPerBar: number;
  readonly slotsPerBar: number;
  readonly totalSlots: number;
  readonly totalBeats: number;
  /** Index (inside a bar) of each beat's first slot. */
  private readonly beatStart: number[];

  constructor(
    readonly subs: readonly number[],
    readonly bars: number,
  ) {
    this.beatsPerBar = subs.length;
    this.beatStart = [];
    let at = 0;
    for (const s of subs) {
      this.beatStart.push(at);
      at += s;
    }
    this.slotsPerBar = at;
    this.totalSlots = at * bars;
    this.totalBeats = subs.length * bars;
  }

  slotsIn(beat: number): number {
    return this.subs[beat - 1]!;
  }

  index(bar: number, beat: number, slot: number): number {
    return (bar - 1) * this.slotsPerBar + this.beatStart[beat - 1]! + slot;
  }

  /** The place of a slot index, wrapped around the drill. */
  place(index: number): Place {
    const i = mod(index, this.totalSlots);
    const bar = Math.floor(i / this.slotsPerBar) + 1;
    let rest = i % this.slotsPerBar;
    let beat = 1;
    while (rest >= this.subs[beat - 1]!) {
      rest -= this.subs[beat - 1]!;
      beat += 1;
    }
    return { bar, beat, slot: rest };
  }

  downbeat(bar: number): number {
    return this.index(bar, 1, 0);
  }

  /** The last slot of a bar (its last beat's last slot). */
  lastSlot(bar: number): number {
    return this.index(bar + 1, 1, 0) - 1;
  }

  /**
   * The slot at `num / den` beats after the start of the drill (0-based beats, as a rational), or
   * null when that time falls between slots. Times past the drill's end keep counting bars (bar
   * numbers above `bars`): the caller decides whether they exist.
   */
  atBeats(num: number, den: number): number | null {
    const whole = Math.floor(num / den);
    const restNum = num - whole * den; // the fraction of a beat is restNum / den, in [0, 1)
    const bar = Math.floor(whole / this.beatsPerBar) + 1;
    const beat = (whole % this.beatsPerBar) + 1;
    const slots = this.subs[beat - 1]!;
    // slot = (restNum / den) * slots must be a whole number
    if ((restNum * slots) % den !== 0) return null;
    return (bar - 1) * this.slotsPerBar + this.beatStart[beat - 1]! + (restNum * slots) / den;
  }

  /** Bar number of a slot index that lies inside the drill. */
  barOf(index: number): number {
    return Math.floor(index / this.slotsPerBar) + 1;
  }

  /**
   * Time between a slot and the next one, in seconds, as the exact fraction `60 / (tempo × slots)`:
   * returned as its denominator `tempo × slots` (notes per minute at that slot's rate).
   */
  notesPerMinuteAt(index: number, tempo: number): number {
    return tempo * this.slotsIn(this.place(index).beat);
  }

  describe(index: number): string {
    const p = this.place(index);
    return `bar ${p.bar} beat ${p.beat} slot ${p.slot}`;
  }
}
