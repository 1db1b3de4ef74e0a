/**
 * Where each counting syllable goes along a bar: under the note or rest written on its slot, or,
 * where nothing is written on that slot (a longer note or rest covers it), at the point between
 * the neighbouring written instants that its place in time gives it. That way a student sees
 * every slot of the subdivision, in time order, lined up with the music that is written.
 */

export interface BeatAnchors {
  /** Slots in this beat. */
  readonly subdivision: number;
  /** Centre x of the note or rest written on each slot that has one. */
  readonly written: ReadonlyMap<number, number>;
}

/**
 * The x of every slot of every beat of one bar (outer index: beat, inner: slot). `startX` and
 * `endX` bound the bar's note area; they stand in for the downbeat when no note or rest is written
 * there, and for the next bar's downbeat after the last beat.
 */
export function countPositions(
  beats: readonly BeatAnchors[],
  startX: number,
  endX: number,
): number[][] {
  const known = knownPoints(beats, startX, endX);
  return beats.map((beat, index) =>
    Array.from({ length: beat.subdivision }, (_, slot) => {
      const written = beat.written.get(slot);
      return written ?? interpolate(known, index + slot / beat.subdivision);
    }),
  );
}

interface Point {
  /** Time in beats from the bar line. */
  readonly t: number;
  readonly x: number;
}

function knownPoints(beats: readonly BeatAnchors[], startX: number, endX: number): Point[] {
  const points: Point[] = [];
  beats.forEach((beat, index) => {
    const slots = [...beat.written.keys()].filter((s) => s >= 0 && s < beat.subdivision);
    for (const slot of slots.sort((a, b) => a - b)) {
      points.push({ t: index + slot / beat.subdivision, x: beat.written.get(slot)! });
    }
  });
  const first = points[0];
  if (first === undefined || first.t > 0)
    points.unshift({ t: 0, x: Math.min(startX, first?.x ?? startX) });
  const last = points[points.length - 1]!;
  points.push({ t: beats.length, x: Math.max(endX, last.x) });
  return points;
}

/** Linear between the known instants on either side of time `t`. */
function interpolate(points: readonly Point[], t: number): number {
  const after = points.findIndex((p) => p.t >= t);
  if (after <= 0) return points[Math.max(after, 0)]!.x;
  const a = points[after - 1]!;
  const b = points[after]!;
  return a.x + ((b.x - a.x) * (t - a.t)) / (b.t - a.t);
}

/** Size of the syllables after the beat number, in pixels, when there is room. */
export const SYLLABLE_SIZE = 13;
/** The smallest the text rows shrink to on a screen, in pixels (print sets its own floor). */
export const SMALLEST_TEXT = 10;
/**
 * Moves the syllables of a bar (all its slots, in time order) apart where they sit closer than
 * `gap` (one distance for every neighbour pair, or one per pair: `gap[i]` between syllable i and
 * i + 1), as little as possible and within `startX`..`endX`: a slot whose notes the formatter
 * set tightly still gets room for its syllable, so silent syllables never run into their
 * neighbours ("&a3"). Where the bar is too short for the gaps everywhere, the syllables are
 * spread evenly over it.
 */
export function spreadPositions(
  xs: readonly number[],
  startX: number,
  endX: number,
  gap: number | readonly number[],
): number[] {
  if (xs.length === 0) return [];
  const gapAfter = (i: number): number => (typeof gap === 'number' ? gap : (gap[i] ?? 0));
  let needed = 0;
  for (let i = 0; i + 1 < xs.length; i++) needed += gapAfter(i);
  if (needed > endX - startX)
    return xs.map((_, i) => startX + ((endX - startX) * i) / Math.max(xs.length - 1, 1));
  const out = [...xs];
  out[0] = Math.max(out[0]!, startX);
  for (let i = 1; i < out.length; i++) out[i] = Math.max(out[i]!, out[i - 1]! + gapAfter(i - 1));
  out[out.length - 1] = Math.min(out[out.length - 1]!, endX);
  for (let i = out.length - 2; i >= 0; i--) out[i] = Math.min(out[i]!, out[i + 1]! - gapAfter(i));
  return out;
}

/**
 * Advance of a syllable's characters as a share of the font size (Academico, bold digits
 * included; a safe over-estimate measured from the face's widest syllable characters, "&").
 */
const CHAR_ADVANCE = 0.62;
/** Clear ink kept between two neighbouring syllables, in pixels. */
export const SYLLABLE_GAP = 4;

/** Width a syllable takes at `size` pixels. */
export function syllableWidth(text: string, size: number): number {
  return [...text].length * size * CHAR_ADVANCE;
}

/**
 * Centre-to-centre room each neighbour pair of `texts` needs at `size`: half of each one's
 * width and a clear gap, so one-letter syllables ("e", "a") may stand as close as their notes.
 */
export function syllableGaps(texts: readonly string[], size: number): number[] {
  return texts
    .slice(1)
    .map((t, i) => (syllableWidth(texts[i]!, size) + syllableWidth(t, size)) / 2 + SYLLABLE_GAP);
}

/**
 * The largest size (from `SYLLABLE_SIZE` down to `least`, in half pixels) at which the
 * syllables `texts`, set at `xs` (in order) and followed by a clear space of `tail` pixels to
 * the bar line, all keep their gap without moving; `least` where none does (the syllables are
 * then moved apart, see `spreadPositions`).
 */
export function fittingSyllableSize(
  texts: readonly string[],
  xs: readonly number[],
  tail: number,
  least = SMALLEST_TEXT,
): number {
  for (let size = Math.max(SYLLABLE_SIZE, least); size > least; size -= 0.5) {
    const gaps = syllableGaps(texts, size);
    const fits = gaps.every((g, i) => xs[i + 1]! - xs[i]! >= g - 1e-9);
    const last = texts[texts.length - 1];
    if (fits && (last === undefined || tail >= syllableWidth(last, size) / 2)) return size;
  }
  return least;
}

/** Room a row of syllables needs at `size`: each one's width and a clear gap after it. */
export function syllableRowWidth(texts: readonly string[], size: number): number {
  return texts.reduce((sum, text) => sum + syllableWidth(text, size) + SYLLABLE_GAP, 0);
}
