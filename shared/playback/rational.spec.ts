import { describe, expect, it } from 'vitest';
import { compareRational, multiplyRational, rational } from './rational';

describe('rational', () => {
  it('multiplies and reduces', () => {
    expect(multiplyRational(rational(2, 3), rational(9, 4))).toEqual({ num: 3, den: 2 });
    expect(multiplyRational(rational(-1, 6), rational(3))).toEqual({ num: -1, den: 2 });
  });

  it('compares exactly when the cross products pass 2^53', () => {
    // 2^53 + 1 is not a double, so a float comparison would call these two equal.
    const a = rational(2 ** 52 + 1, 3);
    const b = rational(2 ** 52, 3);
    expect(compareRational(a, b)).toBeGreaterThan(0);
    const big = rational(9_007_199_254_740_991, 1_000_003);
    const bigger = rational(9_007_199_254_740_990, 1_000_002);
    expect(Math.sign(compareRational(big, bigger))).toBe(-1);
    expect(compareRational(big, big)).toBe(0);
  });
});
