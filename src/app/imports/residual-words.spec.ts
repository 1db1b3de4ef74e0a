import { describe, expect, it } from 'vitest';
import { beatResidualWords, residualSummary, subdivisionWords, worstBeats } from './residual-words';

const beat = (bar: number, b: number, ms: number, notes = 2, slots = 4) => ({
  bar,
  beat: b,
  slots,
  notes,
  beats: ms / 500,
  ms,
});

describe('residual words', () => {
  it('names subdivisions as drummers do in x/4, and counts slots otherwise', () => {
    expect(subdivisionWords(5, 4)).toBe('quintuplets');
    expect(subdivisionWords(8, 4)).toBe('thirty-seconds');
    expect(subdivisionWords(3, 8)).toBe('3 slots a beat');
  });

  it('says when every note sat on its slot', () => {
    expect(residualSummary([beat(1, 1, 0), beat(1, 2, 0.4), beat(1, 3, 30, 0)])).toBe(
      'Every note sat on its slot (within 1 ms).',
    );
  });

  it('counts the beats off the grid, the worst and the mean', () => {
    const rs = [beat(1, 1, 0), beat(1, 2, 12), beat(2, 1, 4), beat(2, 2, 0, 0)];
    expect(residualSummary(rs)).toBe(
      '2 of 3 beats with notes were played off the grid by 1 ms or more; the worst by 12 ms (bar 1, beat 2); 5.3 ms on average.',
    );
    expect(worstBeats(rs).map((r) => [r.bar, r.beat])).toEqual([
      [1, 2],
      [2, 1],
    ]);
    expect(beatResidualWords(rs[1]!, 4)).toBe(
      'Bar 1, beat 2 (sixteenths): notes up to 12 ms off the grid (2.4% of a beat).',
    );
  });
});
