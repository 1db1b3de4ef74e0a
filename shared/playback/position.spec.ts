import { describe, expect, it } from 'vitest';
import type { DrillBar } from '../generator/drill';
import {
  beatAtTime,
  changeTempo,
  cursorAt,
  segmentForBeat,
  timeOfBeat,
  TEMPO_CHANGE_GRID,
} from './position';
import { rational } from './rational';
import { loopShape } from './schedule';

const bar = (n: number, beats: number[]): DrillBar => ({ bar: n, beats, tension: 0, hits: [] });
const drill = { bars: [bar(1, [4, 4, 4, 4]), bar(2, [3, 3, 3]), bar(3, [5, 5, 5, 5, 5])] };

describe('cursor position', () => {
  const shape = loopShape(drill, null, true);

  it('shows count-in beats, then bars and beats counted from 1', () => {
    expect(cursorAt(shape, -0.1)).toBeNull();
    expect(cursorAt(shape, 0)).toEqual({ phase: 'countIn', beat: 1 });
    expect(cursorAt(shape, 3.99)).toEqual({ phase: 'countIn', beat: 4 });
    expect(cursorAt(shape, 4)).toEqual({ phase: 'drill', loop: 0, bar: 1, beat: 1 });
    expect(cursorAt(shape, 4 + 4 + 2.5)).toEqual({ phase: 'drill', loop: 0, bar: 2, beat: 3 });
    expect(cursorAt(shape, 4 + 7 + 4.2)).toEqual({ phase: 'drill', loop: 0, bar: 3, beat: 5 });
    expect(cursorAt(shape, 4 + 12)).toEqual({ phase: 'drill', loop: 1, bar: 1, beat: 1 });
  });

  it('maps audio time to the cursor through the tempo (3 beats at 90 BPM = 2 s)', () => {
    const segment = { originTime: 10, originBeat: rational(0), tempo: 90 };
    expect(cursorAt(shape, beatAtTime(segment, 10 + (4 + 4 + 2) * (60 / 90)))).toEqual({
      phase: 'drill',
      loop: 0,
      bar: 2,
      beat: 3,
    });
  });

  it('counts bars of a looped range by their written numbers', () => {
    const range = loopShape(drill, { from: 2, to: 3 }, false);
    expect(cursorAt(range, 0)).toEqual({ phase: 'drill', loop: 0, bar: 2, beat: 1 });
    expect(cursorAt(range, 8 + 3)).toEqual({ phase: 'drill', loop: 1, bar: 3, beat: 1 });
  });
});

describe('tempo change while playing', () => {
  const start = { originTime: 2, originBeat: rational(0), tempo: 100 };

  it('keeps the bar position and continues at the new tempo', () => {
    const changed = changeTempo(start, 3.21, 150);
    const before = beatAtTime(start, 3.21);
    const at = changed.originBeat.num / changed.originBeat.den;
    // The change lands on the first grid point at or after the current position.
    expect(at).toBeGreaterThanOrEqual(before);
    expect(at - before).toBeLessThan(1 / TEMPO_CHANGE_GRID);
    expect(changed.originTime).toBeCloseTo(timeOfBeat(start, changed.originBeat), 12);
    // One beat later at 150 BPM is 0.4 s later, and the position there is one beat on.
    const next = rational(changed.originBeat.num + changed.originBeat.den, changed.originBeat.den);
    expect(timeOfBeat(changed, next) - changed.originTime).toBeCloseTo(0.4, 12);
    expect(beatAtTime(changed, changed.originTime + 0.4)).toBeCloseTo(at + 1, 9);
  });

  it('uses the old tempo before the change and the new one after', () => {
    const changed = changeTempo(start, 3.2, 50);
    const segments = [start, changed];
    expect(segmentForBeat(segments, rational(1))).toBe(start);
    expect(segmentForBeat(segments, rational(3))).toBe(changed);
    // Beat 2 sounds 1.2 s after start at 100 BPM; beat 3 is then 1.2 s later at 50 BPM.
    expect(timeOfBeat(start, rational(2))).toBeCloseTo(3.2, 12);
    expect(timeOfBeat(changed, rational(3))).toBeCloseTo(4.4, 12);
  });
});
