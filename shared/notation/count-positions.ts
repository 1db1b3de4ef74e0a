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
const SMALLEST_SYLLABLE = 10;
/** Centre-to-centre room a two-letter syllable needs at `SYLLABLE_SIZE` (from its set width). */
const ROOM_AT_FULL_SIZE = 17;
/** The room every syllable is given from its neighbour where the bar has it (clear air between two syllables at full size). */
export const COUNT_ROOM = 22;

/**
 * Font size for the syllables of one beat whose slots sit at `xs` (in order, followed by the next
 * downbeat's x): full size where they have room, smaller in a tightly set beat so neighbouring
 * syllables do not run together, never under 10 px.
 */
export function syllableSize(xs: readonly number[]): number {
  let tightest = Infinity;
  for (let i = 1; i < xs.length; i++) tightest = Math.min(tightest, xs[i]! - xs[i - 1]!);
  if (tightest >= ROOM_AT_FULL_SIZE) return SYLLABLE_SIZE;
  const scaled = Math.floor(((SYLLABLE_SIZE * tightest) / ROOM_AT_FULL_SIZE) * 2) / 2;
  return Math.max(SMALLEST_SYLLABLE, scaled);
}

/**
 * Moves the syllables of a bar (all its slots, in time order) apart where they sit closer than
 * `gap`, as little as possible and within `startX`..`endX`: a slot whose notes the formatter set
 * tightly (a sixteenth beside a dotted eighth in another voice) still gets room for its syllable,
 * so silent syllables never run into their neighbours ("&a3"). Where the bar is too short for
 * `gap` everywhere, the syllables are spread evenly over it.
 */
export function spreadPositions(
  xs: readonly number[],
  startX: number,
  endX: number,
  gap: number,
): number[] {
  if (xs.length === 0) return [];
  if ((xs.length - 1) * gap > endX - startX)
    return xs.map((_, i) => startX + ((endX - startX) * i) / Math.max(xs.length - 1, 1));
  const out = [...xs];
  for (let i = 1; i < out.length; i++) out[i] = Math.max(out[i]!, out[i - 1]! + gap);
  out[out.length - 1] = Math.min(out[out.length - 1]!, endX);
  for (let i = out.length - 2; i >= 0; i--) out[i] = Math.min(out[i]!, out[i + 1]! - gap);
  return out;
}
