import { describe, expect, it } from 'vitest';
import { lhlSyncopation } from './lhl';
import { metricalGrid } from './metrical-grid';

const onsets = (pattern: string): boolean[] => [...pattern].map((c) => c === 'x' || c === '1');
const SIXTEENTHS = [4, 4, 4, 4];

describe('metrical weights', () => {
  // Source: H. C. Longuet-Higgins, C. S. Lee, "The rhythmic interpretation of monophonic music",
  // Music Perception 1(4), 1984; weights for a 4/4 bar in sixteenths as encoded by SynPy
  // (C. Song, M. Pearce, C. Harte, "SynPy: a Python toolkit for syncopation modelling", SMC 2015):
  // levels 0, -1, -2, -3, -4.
  it('gives the 4/4 sixteenth weights of the reference implementation', () => {
    // The weight of a pulse is minus its level.
    expect(metricalGrid(SIXTEENTHS).level).toEqual([
      0, 4, 3, 4, 2, 4, 3, 4, 1, 4, 3, 4, 2, 4, 3, 4,
    ]);
  });

  // Our convention (documented in metrical-grid.ts): a sextuplet beat is two triplets (2 × 3),
  // a quintuplet beat one level, three beats one level.
  it('splits composite subdivisions by their primes, smallest first', () => {
    expect(metricalGrid([6]).level).toEqual([0, 2, 2, 1, 2, 2]);
    expect(metricalGrid([5]).level).toEqual([0, 1, 1, 1, 1]);
    expect(metricalGrid([1, 1, 1]).level).toEqual([0, 1, 1]);
    expect(metricalGrid([4, 4, 5, 5]).level).toEqual([
      0, 4, 3, 4, 2, 4, 3, 4, 1, 3, 3, 3, 3, 2, 3, 3, 3, 3,
    ]);
  });

  it('refuses an empty or fractional grid', () => {
    expect(() => metricalGrid([])).toThrow(RangeError);
    expect(() => metricalGrid([4, 0])).toThrow(RangeError);
    expect(() => metricalGrid([2.5])).toThrow(RangeError);
  });
});

describe('lhlSyncopation', () => {
  // Source: worked example in the docstring of SynPy's LHL.py (Song, Pearce & Harte, SMC 2015):
  // [1,0,0,1,0,1,1,0] in 2/4 (two beats of sixteenths) has syncopation 2. CONFIRMED in SynPy.
  it('reproduces the reference implementation worked example in 2/4', () => {
    expect(lhlSyncopation([4, 4], onsets('10010110'))).toBe(2);
  });

  // Timelines: onset sets from F. Gómez, A. Melvin, D. Rappaport, G. T. Toussaint, "Mathematical
  // measures of syncopation", Proc. BRIDGES 2005, and G. T. Toussaint, The Geometry of Musical
  // Rhythm, ch. 7. Values DERIVED by running SynPy3 (the Python 3 port of Song, Pearce & Harte,
  // "SynPy: a Python toolkit for syncopation modelling", SMC 2015) on a single bar, no previous bar.
  it.each([
    ['shiko', 'x...x.x...x.x...', 2],
    ['son', 'x..x..x...x.x...', 4],
    ['soukous', 'x..x..x...xx....', 6],
    ['rumba', 'x..x...x..x.x...', 6],
    ['bossa-nova', 'x..x..x...x..x..', 6],
    ['gahu', 'x..x..x...x...x.', 5],
  ])('%s timeline scores %i (single bar)', (_name, pattern, expected) => {
    expect(lhlSyncopation(SIXTEENTHS, onsets(pattern))).toBe(expected);
  });

  // Definition checks (Longuet-Higgins & Lee 1984): a rest on a strong position after a note on a
  // weaker one syncopates by the weight difference; nothing else does.
  it('scores 0 for a bar of steady notes, an empty bar and notes only on beats', () => {
    expect(lhlSyncopation(SIXTEENTHS, onsets('x'.repeat(16)))).toBe(0);
    expect(lhlSyncopation(SIXTEENTHS, onsets('.'.repeat(16)))).toBe(0);
    expect(lhlSyncopation(SIXTEENTHS, onsets('x...x...x...x...'))).toBe(0);
  });

  it('scores a note on the last sixteenth of beat 2 held over the silent second half as 3', () => {
    // "x......x........": the silent second half is one rest of weight -1; it pairs with the note
    // at pulse 7 (weight -4): -1 - (-4) = 3. The rests inside beat 2 (weights -2, -3) come before
    // that note and after the downbeat's note (weight 0, stronger), so they pair with nothing.
    expect(lhlSyncopation(SIXTEENTHS, onsets('x......x........'))).toBe(3);
  });
});
