import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planSystems } from './system-layout';

const input = (widths: number[], line = 1000, start = 60, max = 4) => ({
  barWidths: widths,
  systemStartWidth: () => start,
  lineWidth: () => line,
  maxBarsPerSystem: max,
});

describe('planSystems', () => {
  it('spreads 16 equal bars as four lines of four', () => {
    const plans = planSystems(input(Array(16).fill(200)));
    expect(plans.map((p) => p.bars.length)).toEqual([4, 4, 4, 4]);
  });

  it('balances lines instead of leaving one bar alone on the last', () => {
    // Greedy packing would give 3 + 3 + 1; the balanced plan is 3 + 2 + 2.
    const plans = planSystems(input(Array(7).fill(300), 1000, 60, 4));
    expect(plans.map((p) => p.bars.length)).toEqual([3, 2, 2]);
  });

  it('keeps every bar once, in order, and fills each full line exactly', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 80, max: 700 }), { minLength: 1, maxLength: 24 }),
        (widths) => {
          const plans = planSystems(input(widths));
          expect(plans.flatMap((p) => p.bars)).toEqual(widths.map((_, i) => i));
          plans.forEach((plan, i) => {
            const total = plan.widths.reduce((a, b) => a + b, 0);
            const natural = plan.bars.reduce((sum, bar) => sum + widths[bar]!, 60);
            if (i < plans.length - 1 && natural <= 1000) expect(total).toBeCloseTo(1000, 6);
            // Never narrower than the bars need.
            expect(total).toBeGreaterThanOrEqual(natural - 1e-6);
          });
        },
      ),
    );
  });

  it('gives the first system the wider opening (clef and time signature), the others the clef', () => {
    const plans = planSystems({
      barWidths: Array(8).fill(200),
      systemStartWidth: (i) => (i === 0 ? 90 : 40),
      lineWidth: () => 1000,
      maxBarsPerSystem: 4,
    });
    expect(plans.map((p) => p.bars.length)).toEqual([4, 4]);
    for (const [i, plan] of plans.entries()) {
      const start = i === 0 ? 90 : 40;
      // The bars share what is left after the opening; the first bar carries the opening.
      const share = (1000 - start) / 4;
      expect(plan.widths[0]).toBeCloseTo(share + start, 6);
      expect(plan.widths[1]).toBeCloseTo(share, 6);
      expect(plan.widths.reduce((a, b) => a + b, 0)).toBeCloseTo(1000, 6);
    }
  });

  it('sets a bar alone on a narrow line tighter, down to its least width, never below', () => {
    const plan = (line: number) =>
      planSystems({
        barWidths: [400, 300],
        minBarWidths: [320, 250],
        systemStartWidth: () => 40,
        lineWidth: () => line,
        maxBarsPerSystem: 4,
      });
    // A phone line: one bar a line; the wide one set to the line (below its natural 400).
    expect(plan(366).map((p) => p.widths)).toEqual([[366], [366]]);
    // Narrower than the first bar's least width: it keeps that width (the host scrolls or
    // scales); the second fits its line at 260, above its least width of 250.
    expect(plan(300).map((p) => p.widths)).toEqual([[360], [300]]);
  });

  it('justifies a last line holding at least half the bars of the fullest other line', () => {
    // Common practice: systems run the full width; only a nearly empty last line stays short.
    const sum = (widths: readonly number[]) => widths.reduce((a, b) => a + b, 0);
    const two = planSystems(input([200, 200]));
    expect(two).toHaveLength(1);
    expect(sum(two[0]!.widths)).toBeCloseTo(1000, 6);
    const five = planSystems(input([200, 200, 200, 200, 300]));
    expect(five.map((p) => p.bars.length)).toEqual([3, 2]);
    expect(sum(five[1]!.widths)).toBeCloseTo(1000, 6);
    // A lone bar keeps its natural width, stretched at most 1.5×.
    expect(planSystems(input([200]))[0]!.widths).toEqual([200 * 1.5 + 60]);
  });
});
