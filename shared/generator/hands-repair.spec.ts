import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { VoiceId } from './drill';
import { createGrid } from './grid';
import { assignHands, assignHandsRepairing, type WorkHit } from './hands';

const VOICES: readonly VoiceId[] = ['ride', 'snare', 'tomFloor', 'kick'];

const cellsArb = fc.record({
  bars: fc.integer({ min: 1, max: 3 }),
  slots: fc.integer({ min: 2, max: 8 }),
  tempo: fc.integer({ min: 60, max: 300 }),
  seed: fc.array(fc.subarray([...VOICES]), { minLength: 64, maxLength: 64 }),
});

function build(bars: number, slots: number, seed: readonly VoiceId[][]): WorkHit[][] {
  return Array.from({ length: bars * slots * 4 }, (_, i) =>
    (seed[i % seed.length] ?? []).map((voice) => ({
      voice,
      source: 'fill' as const,
      dynamic: 'normal' as const,
      rule: 0,
      hand: null,
    })),
  );
}

/** Drops the latest fill hand stroke at or before the trouble, wrapping round the drill. */
const dropper = (cells: WorkHit[][]) => (trouble: number) => {
  for (let back = 0; back < cells.length; back++) {
    const at = (trouble - back + cells.length) % cells.length;
    const k = (cells[at] ?? []).findIndex((h) => h.voice !== 'kick');
    if (k >= 0) {
      cells[at]?.splice(k, 1);
      return at;
    }
  }
  return null;
};

describe('assignHandsRepairing', () => {
  it('ends exactly where re-running assignHands after every drop ends, hands included', () => {
    fc.assert(
      fc.property(cellsArb, ({ bars, slots, tempo, seed }) => {
        const grid = createGrid(bars, [slots, slots, slots, slots]);
        const slow = build(bars, slots, seed);
        const dropSlow = dropper(slow);
        let slowFailure = assignHands(grid, tempo, 'ride', slow);
        while (slowFailure && dropSlow(slowFailure.instant) !== null)
          slowFailure = assignHands(grid, tempo, 'ride', slow);
        const fast = build(bars, slots, seed);
        const fastFailure = assignHandsRepairing(grid, tempo, 'ride', fast, dropper(fast));
        expect(fastFailure).toEqual(slowFailure);
        expect(fast).toEqual(slow);
      }),
      { numRuns: 200 },
    );
  });
});
