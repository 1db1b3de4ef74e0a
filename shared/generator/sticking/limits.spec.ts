import { describe, expect, it } from 'vitest';
import { createGrid } from '../grid';
import {
  FOOT_LIMITS,
  Gap,
  gapOf,
  HAND_LIMITS,
  instantTicks,
  paceOf,
  runTicks,
  thresholdsOf,
} from './limits';

/** The gap between two neighbouring sixteenths at `tempo` for these limits. */
const sixteenths = (tempo: number, limits = HAND_LIMITS): Gap => {
  const grid = createGrid(1, [4, 4, 4, 4]);
  const pace = paceOf(grid, tempo);
  return gapOf(thresholdsOf(pace, limits), grid.ticksPerBeat / 4);
};

describe('stroke limits', () => {
  // Fujii, Kudo, Ohtsuki and Oda, "Tapping performance and underlying wrist muscle activity of
  // non-drummers, drummers, and the world's fastest drummer", Neuroscience Letters 459 (2009),
  // abstract: 5–7 Hz is the usual limit of rhythmic movement of one hand; the world's fastest
  // drummer tapped at 10 Hz. Single strokes stop just above it: fewer than 8 a second.
  it('lets one hand repeat single sixteenths below 120 BPM, not at 120 (8 a second)', () => {
    expect(HAND_LIMITS.singlesPerSecond).toBe(8);
    expect(sixteenths(119)).toBe(Gap.Single);
    expect(sixteenths(120)).not.toBe(Gap.Single);
  });

  // from memory: a wrist stroke and its rebound reach about 12 a second (sixteenths at 180).
  it('allows a double up to 12 a second: sixteenths at 180 BPM, not at 181', () => {
    expect(HAND_LIMITS.doublesPerSecond).toBe(12);
    expect(sixteenths(180)).toBe(Gap.Double);
    expect(sixteenths(181)).toBe(Gap.TooFast);
  });

  // common practice, from memory: a pedal stroke from the ankle is slower than a wrist stroke;
  // "1 e" on the kick (a double) is everyday groove vocabulary.
  it('gives a foot singles below 6 a second and doubles up to 10', () => {
    expect(FOOT_LIMITS).toEqual({ singlesPerSecond: 6, doublesPerSecond: 10 });
    expect(sixteenths(89, FOOT_LIMITS)).toBe(Gap.Single);
    expect(sixteenths(90, FOOT_LIMITS)).toBe(Gap.Double);
    expect(sixteenths(150, FOOT_LIMITS)).toBe(Gap.Double);
    expect(sixteenths(151, FOOT_LIMITS)).toBe(Gap.TooFast);
  });

  it('decides on whole ticks, on mixed grids too (quintuplets against sixteenths)', () => {
    const grid = createGrid(1, [5, 4]);
    expect(grid.ticksPerBeat).toBe(20);
    const pace = paceOf(grid, 96);
    // 60 000 ms / 96 BPM / 5 = 125 ms: exactly 8 a second is not a single stroke.
    expect(gapOf(thresholdsOf(pace, HAND_LIMITS), 4)).toBe(Gap.Double);
    expect(gapOf(thresholdsOf(pace, HAND_LIMITS), 5)).toBe(Gap.Single);
  });

  it('counts grid notes at least 4 a second apart as a run: sixteenths from 60 BPM', () => {
    const grid = createGrid(1, [4]);
    expect(runTicks(paceOf(grid, 60))).toBe(grid.ticksPerBeat / 4);
    expect(runTicks(paceOf(grid, 59))).toBeLessThan(grid.ticksPerBeat / 4);
  });

  it('puts every instant on the tick scale, the loop at the end', () => {
    const grid = createGrid(2, [3, 2]);
    expect([...instantTicks(grid)]).toEqual([0, 2, 4, 6, 9, 12, 14, 16, 18, 21, 24]);
  });

  it('gives each grid its own ticks, whichever grid was asked for last', () => {
    const triplets = createGrid(1, [3]);
    const eighths = createGrid(1, [2]);
    const thirds = (t: number): number[] => [0, t / 3, (2 * t) / 3, t];
    const halves = (t: number): number[] => [0, t / 2, t];
    expect([...instantTicks(triplets)]).toEqual(thirds(triplets.ticksPerBeat));
    expect([...instantTicks(eighths)]).toEqual(halves(eighths.ticksPerBeat));
    expect(instantTicks(eighths)).toBe(instantTicks(eighths));
    expect([...instantTicks(triplets)]).toEqual(thirds(triplets.ticksPerBeat));
  });
});
