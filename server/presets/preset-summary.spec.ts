import { describe, expect, it } from 'vitest';
import { meterText, subdivisionWord } from './preset-summary';

// Names of subdivisions: common practice (eighths, triplets, sixteenths, quintuplets, …).
describe('preset summary', () => {
  it('writes the meter as beats over unit', () => {
    expect(meterText({ meter: { beats: 7, unit: 8 }, subdivision: 2 })).toBe('7/8');
    expect(meterText({ meter: { beats: 4, unit: 4 }, subdivision: 4 })).toBe('4/4');
  });

  it.each([
    [1, 'quarters'],
    [2, 'eighths'],
    [3, 'triplets'],
    [4, 'sixteenths'],
    [5, 'quintuplets'],
    [6, 'sextuplets'],
    [7, 'septuplets'],
    [8, 'thirty-seconds'],
  ])('names %i slots per beat %s', (slots, word) => {
    expect(subdivisionWord({ meter: { beats: 4, unit: 4 }, subdivision: slots })).toBe(word);
  });

  it('names a per-beat list by its one value when all beats agree', () => {
    expect(subdivisionWord({ meter: { beats: 3, unit: 4 }, subdivision: [5, 5, 5] })).toBe(
      'quintuplets',
    );
  });

  it('calls beats with different grids mixed', () => {
    expect(subdivisionWord({ meter: { beats: 4, unit: 4 }, subdivision: [4, 4, 5, 6] })).toBe(
      'mixed',
    );
  });
});
