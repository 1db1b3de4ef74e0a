/**
 * Line breaking: which bars go on which system (line of music) for a given width.
 *
 * Bars are packed greedily to find how many systems are needed, then spread as evenly as the
 * width allows (four bars on each of four lines read better than five, five, five and one), and
 * each system's narrower bars are widened to one width to fill the line (see `levelWidth`).
 */

export interface SystemPlan {
  /** 0-based indices of the bars on this system. */
  readonly bars: readonly number[];
  /** Final width of each bar on the line, in the same order. */
  readonly widths: readonly number[];
}

export interface SystemLayoutInput {
  /** Natural width of each bar without the clef and time signature. */
  readonly barWidths: readonly number[];
  /**
   * The least each bar may be set in (default: its natural width). Only a bar alone on a line
   * too narrow for it is set below its natural width, never below this.
   */
  readonly minBarWidths?: readonly number[];
  /**
   * Extra width the first bar of each system needs: clef on every system, plus the time
   * signature on the first.
   */
  readonly systemStartWidth: (systemIndex: number) => number;
  /** Width available for the bars of each line (the first line may be narrower). */
  readonly lineWidth: (systemIndex: number) => number;
  /** Most bars on one line. */
  readonly maxBarsPerSystem: number;
}

/** Break the bars into systems and give every bar its final width. */
export function planSystems(input: SystemLayoutInput): SystemPlan[] {
  const count = greedySystemCount(input);
  const sizes = balancedSizes(input, count) ?? greedySizes(input);
  const plans: SystemPlan[] = [];
  let next = 0;
  sizes.forEach((size, index) => {
    const bars = Array.from({ length: size }, (_, i) => next + i);
    next += size;
    plans.push({ bars, widths: stretch(input, bars, index, short(sizes, index)) });
  });
  return plans;
}

/**
 * Whether system `index` is a short last line, left at its natural widths rather than justified:
 * only a last line holding under half the bars of the fullest other line (or a lone bar alone).
 * A last line that stops at two thirds of the width looks unfinished (common practice: systems
 * are justified, only a last line with little in it is left short).
 */
function short(sizes: readonly number[], index: number): boolean {
  if (index !== sizes.length - 1) return false;
  const others = sizes.slice(0, -1);
  const size = sizes[index]!;
  if (others.length === 0) return size < 2;
  return size * 2 < Math.max(...others);
}

function needed(input: SystemLayoutInput, bars: readonly number[], systemIndex: number): number {
  const start = input.systemStartWidth(systemIndex);
  return bars.reduce((sum, bar) => sum + (input.barWidths[bar] ?? 0), start);
}

function greedySizes(input: SystemLayoutInput): number[] {
  const sizes: number[] = [];
  let start = 0;
  while (start < input.barWidths.length) {
    let size = 1;
    while (
      start + size < input.barWidths.length &&
      size < input.maxBarsPerSystem &&
      needed(input, range(start, size + 1), sizes.length) <= input.lineWidth(sizes.length)
    ) {
      size++;
    }
    sizes.push(size);
    start += size;
  }
  return sizes;
}

function greedySystemCount(input: SystemLayoutInput): number {
  return greedySizes(input).length;
}

/** Sizes as equal as possible (longer lines first) for `count` systems, or null if one overflows. */
function balancedSizes(input: SystemLayoutInput, count: number): number[] | null {
  const total = input.barWidths.length;
  if (count === 0) return [];
  const small = Math.floor(total / count);
  const sizes = Array.from({ length: count }, (_, i) => small + (i < total % count ? 1 : 0));
  let start = 0;
  for (const [index, size] of sizes.entries()) {
    if (size > input.maxBarsPerSystem) return null;
    if (size > 1 && needed(input, range(start, size), index) > input.lineWidth(index)) return null;
    start += size;
  }
  return sizes;
}

/** Widen the bars to the line; a short last line keeps its natural widths (stretched ≤ 1.5×). */
function stretch(
  input: SystemLayoutInput,
  bars: readonly number[],
  systemIndex: number,
  shortLast: boolean,
): number[] {
  const natural = bars.map((bar) => input.barWidths[bar] ?? 0);
  const naturalSum = natural.reduce((a, b) => a + b, 0);
  const start = input.systemStartWidth(systemIndex);
  const line = input.lineWidth(systemIndex) - start;
  if (line < naturalSum && bars.length === 1) {
    // One bar wider than its line (a phone): set it tighter, down to its least width.
    const least = input.minBarWidths?.[bars[0]!] ?? naturalSum;
    return [Math.max(line, Math.min(least, naturalSum)) + start];
  }
  const room = Math.max(line, naturalSum);
  if (shortLast) {
    const factor = Math.min(room / naturalSum, 1.5);
    return natural.map((w, i) => w * factor + (i === 0 ? start : 0));
  }
  const even = levelWidth(natural, room);
  return natural.map((w, i) => Math.max(w, even) + (i === 0 ? start : 0));
}

/**
 * The width every bar of a justified line is brought up to (bars wider than it keep their own):
 * the line's room goes first to the narrowest bars, so a bar of eighths beside one of sixteenths
 * gets the same room for the same time rather than a share of the room in proportion to its
 * notes (E. Gould, "Behind Bars", Faber Music 2011, ch. "Horizontal spacing": equal durations take
 * equal space across a system; from memory). The bars of one drill share one meter.
 */
function levelWidth(natural: readonly number[], room: number): number {
  const widest = [...natural].sort((a, b) => b - a);
  let rest = room;
  for (let kept = 0; kept < widest.length; kept++) {
    const level = rest / (widest.length - kept);
    if (level >= widest[kept]!) return level;
    // Wider than the level: it keeps its own width, the rest share what is left.
    rest -= widest[kept]!;
  }
  return 0;
}

function range(start: number, size: number): number[] {
  return Array.from({ length: size }, (_, i) => start + i);
}
