import { describe, expect, it } from 'vitest';
import { countBeat, countSyllable } from './counting';

describe('counting syllables', () => {
  it('binary and triplet counts as drummers speak them (common practice)', () => {
    expect(countBeat(1, 1)).toBe('1');
    expect(countBeat(2, 2)).toBe('2 &');
    expect(countBeat(3, 3)).toBe('3 & a');
    expect(countBeat(4, 4)).toBe('4 e & a');
  });

  it('tuplets in Takadimi syllables (Hoffman, Pelto & White, J. Music Theory Pedagogy 10, 1996)', () => {
    // Quintuplet and septuplet syllables read in a secondary reproduction of the Takadimi chart.
    expect(countBeat(1, 5)).toBe('1 ka di mi ti');
    expect(countBeat(1, 6)).toBe('1 va ki di da ma');
    expect(countBeat(1, 7)).toBe('1 va ki di da mi ti');
  });

  it('refuses a slot outside the beat', () => {
    expect(() => countSyllable(1, 4, 4)).toThrow(RangeError);
  });
});
