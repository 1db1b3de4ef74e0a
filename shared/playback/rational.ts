/**
 * Exact musical positions as integer fractions of a beat.
 *
 * Positions inside a drill are rational (`slot / slotsPerBeat`); summing float durations would
 * drift, so every position is kept as `num / den` with integers and turned into seconds with a
 * single division at the very end.
 */

/** A reduced fraction `num / den` with integer parts and `den > 0`. */
export interface Rational {
  readonly num: number;
  readonly den: number;
}

function gcd(a: number, b: number): number {
  let x = Math.abs(a);
  let y = Math.abs(b);
  while (y !== 0) {
    [x, y] = [y, x % y];
  }
  return x;
}

/** Builds a reduced fraction; throws on non-integer parts or a zero denominator. */
export function rational(num: number, den = 1): Rational {
  if (!Number.isSafeInteger(num) || !Number.isSafeInteger(den) || den === 0) {
    throw new RangeError(`A position must be a fraction of whole numbers, got ${num}/${den}.`);
  }
  const sign = den < 0 ? -1 : 1;
  const divisor = gcd(num, den) || 1;
  return { num: (sign * num) / divisor, den: (sign * den) / divisor };
}

export function addRational(a: Rational, b: Rational): Rational {
  return rational(a.num * b.den + b.num * a.den, a.den * b.den);
}

export function subtractRational(a: Rational, b: Rational): Rational {
  return rational(a.num * b.den - b.num * a.den, a.den * b.den);
}

export function multiplyRational(a: Rational, b: Rational): Rational {
  // Cross-reduced first, so the products stay as small as the result allows.
  const g1 = gcd(a.num, b.den) || 1;
  const g2 = gcd(b.num, a.den) || 1;
  return rational((a.num / g1) * (b.num / g2), (a.den / g2) * (b.den / g1));
}

/** Negative when `a < b`, zero when equal, positive when `a > b`. */
export function compareRational(a: Rational, b: Rational): number {
  const left = a.num * b.den;
  const right = b.num * a.den;
  if (Number.isSafeInteger(left) && Number.isSafeInteger(right)) return left - right;
  // Far into a long run with fine swing ratios the products can pass 2^53: compare exactly.
  const diff = BigInt(a.num) * BigInt(b.den) - BigInt(b.num) * BigInt(a.den);
  return diff < 0n ? -1 : diff > 0n ? 1 : 0;
}

/** The fraction as a float (one correctly rounded division). */
export function rationalToNumber(r: Rational): number {
  return r.num / r.den;
}

/**
 * Seconds taken by `beats` at `tempo` beats per minute: `beats × 60 / tempo`, computed as one
 * division of integers so the result is the nearest double to the exact value.
 */
export function beatsToSeconds(beats: Rational, tempo: number): number {
  if (!Number.isSafeInteger(tempo) || tempo <= 0) {
    throw new RangeError(`Tempo must be a whole number of beats per minute, got ${tempo}.`);
  }
  return (beats.num * 60) / (beats.den * tempo);
}

/** The smallest multiple of `1 / grid` that is not below `value`. */
export function ceilToGrid(value: number, grid: number): Rational {
  return rational(Math.ceil(value * grid - 1e-9), grid);
}
