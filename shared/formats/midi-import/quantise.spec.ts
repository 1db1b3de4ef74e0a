import { describe, expect, it } from 'vitest';
import { fitBeat, TIE_TOLERANCE } from './quantise';

describe('fitBeat', () => {
  it('finds the subdivision each tuplet is written in', () => {
    for (let n = 2; n <= 8; n++) {
      const onsets = Array.from({ length: n }, (_, k) => k / n);
      const fit = fitBeat(onsets);
      expect(fit.slots).toBe(n);
      expect(fit.slotOf).toEqual(onsets.map((_, k) => k));
      expect(fit.error).toBeCloseTo(0, 12);
    }
  });

  it('keeps notes on exact slots on their own grid, thirty-seconds against septuplets too', () => {
    // 1/8 and 1/7 are the closest slots of two subdivisions (1/56 apart): still told apart.
    expect(fitBeat([0, 1 / 8]).slots).toBe(8);
    expect(fitBeat([0, 1 / 7]).slots).toBe(7);
    expect(TIE_TOLERANCE).toBeLessThan(1 / 56);
  });

  it('prefers the smaller subdivision on a tie: eighths stay eighths, loose sixteenths stay sixteenths', () => {
    expect(fitBeat([0, 0.5]).slots).toBe(2);
    expect(fitBeat([]).slots).toBe(2);
    const loose = fitBeat([0.012, 0.262, 0.49, 0.738]);
    expect(loose.slots).toBe(4);
    expect(loose.slotOf).toEqual([0, 1, 2, 3]);
    expect(loose.error).toBeCloseTo(0.012, 12);
  });

  it('reports the worst distance of a note from its slot', () => {
    const fit = fitBeat([0, 0.36, 0.68]);
    expect(fit.slots).toBe(3);
    expect(fit.error).toBeCloseTo(Math.abs(0.36 - 1 / 3), 12);
  });

  it('puts a note played just before the beat on its first slot', () => {
    const fit = fitBeat([-0.03, 0.5]);
    expect(fit.slotOf).toEqual([0, 1]);
    expect(fit.error).toBeCloseTo(0.03, 12);
  });
});
