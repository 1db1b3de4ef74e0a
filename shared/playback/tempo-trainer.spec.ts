import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addFractions, fraction, isNearestDouble, type BigFraction } from './exact-double.testing';
import {
  bigFractionToNumber,
  clampTempo,
  trainerLoopStartSeconds,
  trainerStepForLoop,
  trainerSteps,
  type TempoTrainer,
} from './tempo-trainer';

const ladder: TempoTrainer = { startTempo: 96, stepBpm: 4, everyLoops: 2, targetTempo: 116 };

describe('tempo trainer steps', () => {
  it('steps up every K loops and holds the target', () => {
    expect(trainerSteps(ladder)).toBe(6);
    const tempos = Array.from({ length: 14 }, (_, loop) => trainerStepForLoop(ladder, loop).tempo);
    expect(tempos).toEqual([96, 96, 100, 100, 104, 104, 108, 108, 112, 112, 116, 116, 116, 116]);
    expect(trainerStepForLoop(ladder, 4)).toEqual({ step: 3, steps: 6, tempo: 104 });
    expect(trainerStepForLoop(ladder, 99)).toEqual({ step: 6, steps: 6, tempo: 116 });
  });

  it('reaches exactly the target when the step does not divide the distance', () => {
    const odd = { startTempo: 90, stepBpm: 3, everyLoops: 1, targetTempo: 100 };
    expect(Array.from({ length: 6 }, (_, n) => trainerStepForLoop(odd, n).tempo)).toEqual([
      90, 93, 96, 99, 100, 100,
    ]);
  });

  it('steps down when the target is slower, and clamps tempos to 20–320 BPM', () => {
    const down = { startTempo: 120, stepBpm: 10, everyLoops: 1, targetTempo: 95 };
    expect([0, 1, 2, 3, 4].map((n) => trainerStepForLoop(down, n).tempo)).toEqual([
      120, 110, 100, 95, 95,
    ]);
    const wild = { startTempo: 5, stepBpm: 100, everyLoops: 1, targetTempo: 900 };
    expect(trainerStepForLoop(wild, 0).tempo).toBe(20);
    expect(trainerStepForLoop(wild, 50).tempo).toBe(320);
    expect(clampTempo(Number.NaN)).toBe(20);
  });

  it('never overshoots and changes by at most one step per K loops (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 20, max: 320 }),
        fc.integer({ min: 20, max: 320 }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 1, max: 8 }),
        (startTempo, targetTempo, stepBpm, everyLoops) => {
          const t = { startTempo, targetTempo, stepBpm, everyLoops };
          const steps = trainerSteps(t);
          const lo = Math.min(startTempo, targetTempo);
          const hi = Math.max(startTempo, targetTempo);
          let previous = startTempo;
          for (let loop = 0; loop < steps * everyLoops + 3; loop += 1) {
            const { tempo, step } = trainerStepForLoop(t, loop);
            expect(tempo).toBeGreaterThanOrEqual(lo);
            expect(tempo).toBeLessThanOrEqual(hi);
            expect(Math.abs(tempo - previous)).toBeLessThanOrEqual(stepBpm);
            expect(step).toBe(Math.min(Math.floor(loop / everyLoops) + 1, steps));
            previous = tempo;
          }
          expect(previous).toBe(targetTempo);
        },
      ),
    );
  });

  it('refuses a step below 1 BPM or fewer than 1 loop per step', () => {
    expect(() => trainerSteps({ ...ladder, stepBpm: 0 })).toThrow(/at least 1 BPM/);
    expect(() => trainerSteps({ ...ladder, everyLoops: 0 })).toThrow(/at least 1 loop/);
  });
});

describe('tempo trainer loop starts', () => {
  /** Loop starts summed loop by loop as exact fractions (a different route from the code). */
  function exactStart(
    t: TempoTrainer,
    loopBeats: number,
    countIn: number,
    loop: number,
  ): BigFraction {
    let seconds = fraction(countIn * 60, t.startTempo);
    for (let n = 0; n < loop; n += 1) {
      seconds = addFractions(seconds, fraction(loopBeats * 60, trainerStepForLoop(t, n).tempo));
    }
    return seconds;
  }

  it('puts each loop start on the nearest double to the exact sum', () => {
    const t = { startTempo: 97, stepBpm: 7, everyLoops: 3, targetTempo: 311 };
    for (const loop of [0, 1, 2, 3, 10, 57, 96, 97, 150]) {
      const exact = exactStart(t, 11, 4, loop);
      expect(isNearestDouble(trainerLoopStartSeconds(t, 11, 4, loop), exact.num, exact.den)).toBe(
        true,
      );
    }
  });

  it('equals the single-tempo formula when start and target agree', () => {
    const flat = { startTempo: 60, stepBpm: 5, everyLoops: 1, targetTempo: 60 };
    expect(trainerLoopStartSeconds(flat, 4, 4, 3)).toBe(16);
  });

  it('rounds huge fractions correctly', () => {
    const big = 10n ** 40n;
    expect(bigFractionToNumber(big, 3n * big)).toBe(1 / 3);
    expect(bigFractionToNumber(7n * big + 1n, big)).toBe(7);
    fc.assert(
      fc.property(
        fc.bigInt({ min: 0n, max: 10n ** 60n }),
        fc.bigInt({ min: 1n, max: 10n ** 50n }),
        (n, d) => {
          expect(isNearestDouble(bigFractionToNumber(n, d), n, d)).toBe(true);
        },
      ),
    );
  });
});

describe('isNearestDouble (the exactness check itself)', () => {
  it('accepts the correctly rounded double and rejects its neighbours', () => {
    expect(isNearestDouble(0.1, 1n, 10n)).toBe(true);
    expect(isNearestDouble(0.1 + 0.2, 3n, 10n)).toBe(false);
    expect(isNearestDouble(0.3, 3n, 10n)).toBe(true);
    expect(isNearestDouble(1 - 2 ** -53, 1n, 1n)).toBe(false);
    expect(isNearestDouble(96 / 97, 96n, 97n)).toBe(true);
    expect(isNearestDouble(96 / 97 + 2 ** -52, 96n, 97n)).toBe(false);
  });
});
