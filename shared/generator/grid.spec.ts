import { describe, expect, it } from 'vitest';
import { createGrid, evenPoint, instantOf, positionOf, shiftedInstant, ticksOf } from './grid';

describe('grid', () => {
  const grid = createGrid(2, [4, 3, 5]);

  it('numbers instants bar by bar and maps them back', () => {
    expect(grid.slotsPerBar).toBe(12);
    expect(grid.ticksPerBeat).toBe(60);
    const instant = instantOf(grid, 2, 3, 4);
    expect(instant).toBe(23);
    expect(positionOf(grid, instant)).toEqual({ bar: 2, beat: 3, slot: 4 });
  });

  it('keeps time exact in ticks: (beat - 1) + slot / slots beats', () => {
    // bar 1, beat 2, slot 2 of 3 = 1 + 2/3 beats = 100 ticks of 60
    expect(ticksOf(grid, instantOf(grid, 1, 2, 2))).toBe(100);
    // bar 2 starts after 3 beats = 180 ticks
    expect(ticksOf(grid, instantOf(grid, 2, 1, 0))).toBe(180);
  });

  it('shifts across beats and wraps around the drill', () => {
    expect(positionOf(grid, shiftedInstant(grid, 0, -1))).toEqual({ bar: 2, beat: 3, slot: 4 });
    expect(positionOf(grid, shiftedInstant(grid, 2, 6))).toEqual({ bar: 2, beat: 1, slot: 1 });
  });

  it('lands evenly spaced points on slots or says what they need', () => {
    const even = createGrid(1, [4, 4, 4]);
    expect(evenPoint(even, 0, 1, 4, 3)).toEqual({ ok: true, instant: 3 });
    expect(evenPoint(even, 0, 1, 3, 2)).toEqual({ ok: false, beat: 1, needs: 3 });
    expect(evenPoint(even, 3, 0, 4, 3)).toBeNull();
  });
});
