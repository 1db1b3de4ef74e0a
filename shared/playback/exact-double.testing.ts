/**
 * Test helpers for exact time checks: a double is compared with an exact fraction of BigInts,
 * so a check never re-uses the float arithmetic it is checking.
 */

/** A non-negative double as the exact fraction `mantissa × 2^exponent`. */
export function doubleParts(value: number): { mantissa: bigint; exponent: number } {
  if (!(value >= 0) || !Number.isFinite(value)) throw new RangeError(`Not a finite time: ${value}`);
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, value);
  const bits = view.getBigUint64(0);
  const biased = Number((bits >> 52n) & 0x7ffn);
  const fraction = bits & ((1n << 52n) - 1n);
  if (biased === 0) return { mantissa: fraction, exponent: -1074 };
  return { mantissa: fraction | (1n << 52n), exponent: biased - 1075 };
}

/**
 * Whether `value` is the double nearest to `num / den` (ties either way): the best any float
 * code can do, so "exact" in the only sense a double can be.
 */
export function isNearestDouble(value: number, num: bigint, den: bigint): boolean {
  const { mantissa, exponent } = doubleParts(value);
  const scale = 1n << BigInt(Math.max(0, -exponent));
  const valueNum = mantissa << BigInt(Math.max(0, exponent));
  // value − num/den = diff / (den × scale); half the spacing above is 2^max(e,0) / (2 × scale).
  const diff = valueNum * den - num * scale;
  const abs = diff < 0n ? -diff : diff;
  const spacing = (1n << BigInt(Math.max(0, exponent))) * den;
  const atBinadeStart = mantissa === 1n << 52n && exponent > -1074;
  // Just below a power of two the doubles are twice as dense.
  if (diff > 0n && atBinadeStart) return 4n * abs <= spacing;
  return 2n * abs <= spacing;
}

/** An exact non-negative fraction of BigInts, reduced. */
export interface BigFraction {
  readonly num: bigint;
  readonly den: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  while (b !== 0n) [a, b] = [b, a % b];
  return a < 0n ? -a : a;
}

export function fraction(num: bigint | number, den: bigint | number = 1n): BigFraction {
  const n = BigInt(num);
  const d = BigInt(den);
  const g = gcd(n, d) || 1n;
  return { num: n / g, den: d / g };
}

export function addFractions(a: BigFraction, b: BigFraction): BigFraction {
  return fraction(a.num * b.den + b.num * a.den, a.den * b.den);
}

export function scaleFraction(
  a: BigFraction,
  num: bigint | number,
  den: bigint | number,
): BigFraction {
  return fraction(a.num * BigInt(num), a.den * BigInt(den));
}
