import { describe, expect, it } from 'vitest';
import { arcCurves, num, pathOperators } from './path-operators';

/** A point of a cubic Bézier from `from` through the curve's (c1, c2, end). */
function bezierAt(from: readonly number[], curve: readonly number[], t: number): number[] {
  const u = 1 - t;
  const [x0, y0] = from;
  const [x1, y1, x2, y2, x3, y3] = curve;
  return [
    u ** 3 * x0! + 3 * u * u * t * x1! + 3 * u * t * t * x2! + t ** 3 * x3!,
    u ** 3 * y0! + 3 * u * u * t * y1! + 3 * u * t * t * y2! + t ** 3 * y3!,
  ];
}

/** Points along an arc's curves, from its start point. */
function along(start: readonly number[], curves: readonly number[][]): number[][] {
  const points: number[][] = [];
  let from = start;
  for (const curve of curves) {
    for (const t of [0.25, 0.5, 0.75, 1]) points.push(bezierAt(from, curve, t));
    from = curve.slice(4);
  }
  return points;
}

describe('pathOperators', () => {
  it('writes absolute and relative lines as PDF path operators', () => {
    expect(pathOperators('M12 168.3L405.56 168.3')).toBe('12 168.3 m 405.56 168.3 l');
    // m, l, h, v and z are relative to the current point; pairs after m are linetos (SVG 1.1, §8.3.2).
    expect(pathOperators('m10 10 l5 0 h5 v5 z')).toBe('10 10 m 15 10 l 20 10 l 20 15 l h');
    expect(pathOperators('M0 0 1 1 2 0')).toBe('0 0 m 1 1 l 2 0 l');
    expect(pathOperators('M1,2 C3,4 5,6 7,8')).toBe('1 2 m 3 4 5 6 7 8 c');
  });

  it('leaves out a sub-path that goes nowhere', () => {
    expect(pathOperators('M5 5')).toBe('');
    expect(pathOperators('M5 5 L5 5 M1 1 L2 2')).toBe('1 1 m 2 2 l');
  });

  it('refuses path data it does not understand, rather than drawing something else', () => {
    expect(() => pathOperators('M0 0 S1 1 2 2')).toThrow(/not supported/);
    expect(() => pathOperators('M0 0 L1')).toThrow(/needs 2 numbers/);
    expect(() => pathOperators('10 10')).toThrow(/without a command/);
  });

  it('draws VexFlow’s dot (two half-circle arcs) on its circle, above then below the centre', () => {
    // SVG 1.1, §8.3.8 and F.6.5: with sweep-flag 0 the arc runs in the negative-angle direction,
    // which with y pointing down is anticlockwise on the page: from the right, over the top.
    const first = arcCurves(91.08, 183.8, 2, 2, 0, false, false, 87.08, 183.8);
    const second = arcCurves(87.08, 183.8, 2, 2, 0, false, false, 91.08, 183.8);
    const points = [...along([91.08, 183.8], first), ...along([87.08, 183.8], second)];
    for (const [x, y] of points) expect(Math.hypot(x! - 89.08, y! - 183.8)).toBeCloseTo(2, 2);
    expect(bezierAt([91.08, 183.8], first[0]!, 1)[1]).toBeCloseTo(181.8, 2);
    expect(bezierAt([87.08, 183.8], second[0]!, 1)[1]).toBeCloseTo(185.8, 2);
  });

  it('takes the large arc when asked, and scales radii too small to reach the end point', () => {
    // From (0,0) to (10,0), radius 10, clockwise on the page: the small arc rises 1.34 above the
    // chord (centre below it), the large one 18.66 (centre above it).
    const small = along([0, 0], arcCurves(0, 0, 10, 10, 0, false, true, 10, 0));
    const large = along([0, 0], arcCurves(0, 0, 10, 10, 0, true, true, 10, 0));
    expect(Math.min(...small.map((p) => p[1]!))).toBeCloseTo(10 * Math.cos(Math.PI / 6) - 10, 1);
    expect(Math.min(...large.map((p) => p[1]!))).toBeCloseTo(-10 - 10 * Math.cos(Math.PI / 6), 1);
    // Radius 1 cannot span 10 units: it is scaled up to a half circle of radius 5 (F.6.6).
    const scaled = along([0, 0], arcCurves(0, 0, 1, 1, 0, false, true, 10, 0));
    for (const [x, y] of scaled) expect(Math.hypot(x! - 5, y!)).toBeCloseTo(5, 2);
  });

  it('writes numbers as PDF content allows: no exponent, at most four decimals', () => {
    expect(num(1e-7)).toBe('0');
    expect(num(-0)).toBe('0');
    expect(num(2 / 3)).toBe('0.6667');
    expect(num(1234.5)).toBe('1234.5');
  });
});
