/**
 * Swing: the card's `swing: { unit, ratio }` moves the second note of every eighth (or sixteenth)
 * pair from half-way through the pair to `ratio` of it. It changes playback only; notation stays
 * straight under a swing marking.
 *
 * Every position stays an exact fraction of a beat:
 * - The ratio is read as the simplest fraction within half a unit of its fourth decimal
 *   (|p/q − ratio| ≤ 0.00005), so `0.6667` (or `2 / 3` as a double) is exactly 2/3, `0.6` is
 *   3/5 and `0.5` is 1/2: cards write ratios with four decimals at most, and the triplet feel
 *   cannot be written exactly in decimals.
 * - A pair starts where it starts: only positions inside a pair move. Its off-beat (the pair's
 *   half-way point) goes to `ratio` of the pair; any finer position (a 32nd inside a swung pair
 *   of sixteenths, a sixteenth inside a swung pair of eighths) is interpolated linearly within
 *   the half of the pair it lies in, so the long note's half is stretched evenly and the short
 *   note's half is squeezed evenly, and order is kept.
 * - Beats on a tuplet grid (a slot count that is not a power of two: triplets, quintuplets,
 *   sextuplets…) are played as written: a tuplet already says where its notes fall.
 * - Pairs never cross a beat (eighth pairs in quarter or half beats, sixteenth pairs in quarter,
 *   half or eighth beats); anything else (swung eighths in an eighth-note meter, which the card
 *   parser refuses) plays straight.
 */
import {
  addRational,
  multiplyRational,
  rational,
  subtractRational,
  type Rational,
} from './rational';

/** The card's swing field as playback reads it. */
export interface SwingSpec {
  /** 8: eighth pairs; 16: sixteenth pairs. */
  readonly unit: number;
  /** The long note's share of the pair, 0.5 (straight) to 0.75. */
  readonly ratio: number;
}

/** Swing resolved against the meter: what the schedule applies to every binary beat. */
export interface SwingFeel {
  /** Swung pairs in one beat of the meter (a whole number, at least 1). */
  readonly pairsPerBeat: number;
  /** The long note's share of each pair, exact. */
  readonly ratio: Rational;
}

/** Decimals a card's swing ratio is read to. */
const RATIO_DECIMALS = 10_000;

/**
 * The exact ratio for a card's decimal: the simplest fraction (smallest denominator) within
 * half a unit of the fourth decimal.
 */
export function swingRatio(ratio: number): Rational {
  if (!Number.isFinite(ratio) || ratio <= 0 || ratio >= 1) {
    throw new RangeError(`A swing ratio is a share of the pair between 0 and 1, got ${ratio}.`);
  }
  const tenThousandths = Math.round(ratio * RATIO_DECIMALS);
  const [num, den] = simplestBetween(
    2 * tenThousandths - 1,
    2 * RATIO_DECIMALS,
    2 * tenThousandths + 1,
    2 * RATIO_DECIMALS,
  );
  return rational(num, den);
}

/**
 * The fraction with the smallest denominator in the closed interval [ln/ld, hn/hd] (positive
 * integers, ln/ld < hn/hd), by continued fractions: exact integer arithmetic throughout.
 */
function simplestBetween(ln: number, ld: number, hn: number, hd: number): [number, number] {
  const whole = Math.floor(ln / ld);
  if (whole * ld === ln) return [whole, 1];
  if (whole < Math.floor(hn / hd)) return [whole + 1, 1];
  // Same whole part: the simplest fraction between the reciprocals of the fractional parts.
  const [p, q] = simplestBetween(hd, hn - whole * hd, ld, ln - whole * ld);
  return [whole * p + q, p];
}

/**
 * The feel a card's swing gives in a meter with beat unit `meterUnit` (2, 4, 8, 16): `null` when
 * it plays straight (no swing, a ratio of 1/2, or pairs that would cross a beat).
 */
export function swingFeel(
  swing: SwingSpec | null | undefined,
  meterUnit: number,
): SwingFeel | null {
  if (!swing) return null;
  const ratio = swingRatio(swing.ratio);
  if (ratio.num * 2 === ratio.den) return null;
  // A pair is two notes of `unit`, i.e. 2 × meterUnit / unit beats.
  const pairsPerBeat = swing.unit / (2 * meterUnit);
  if (!Number.isInteger(pairsPerBeat) || pairsPerBeat < 1) return null;
  return { pairsPerBeat, ratio };
}

function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}

const ONE = rational(1);

/**
 * Where slot `slot` of a beat of `slots` slots sounds, in beats from the beat's start: `slot /
 * slots` when straight, else moved as described above.
 */
export function swungOffset(slot: number, slots: number, feel: SwingFeel | null): Rational {
  const straight = rational(slot, slots);
  if (feel === null || !isPowerOfTwo(slots)) return straight;
  const { pairsPerBeat, ratio } = feel;
  // The position counted in pairs: whole pairs before it, and how far into its pair it is.
  const inPairs = slot * pairsPerBeat;
  const pair = Math.floor(inPairs / slots);
  const into = rational(inPairs - pair * slots, slots);
  const twice = multiplyRational(into, rational(2));
  // First half [0, 1/2] → [0, ratio]; second half [1/2, 1] → [ratio, 1].
  const moved =
    into.num * 2 <= into.den
      ? multiplyRational(twice, ratio)
      : addRational(
          ratio,
          multiplyRational(subtractRational(twice, ONE), subtractRational(ONE, ratio)),
        );
  return multiplyRational(addRational(rational(pair), moved), rational(1, pairsPerBeat));
}
