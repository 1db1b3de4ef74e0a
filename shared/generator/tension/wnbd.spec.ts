import { describe, expect, it } from 'vitest';
import { weightedNoteToBeatDistance } from './wnbd';

const onsets = (pattern: string): boolean[] => [...pattern].map((c) => c === 'x' || c === '1');

// Source: F. Gómez, A. Melvin, D. Rappaport, G. T. Toussaint, "Mathematical measures of
// syncopation", Proc. BRIDGES 2005 (Banff), the WNBD table for the six 16-pulse timelines
// (CONFIRMED-2ND: the paper's values as recorded in the AMADS test suite, music-computing/amads
// tests/test_meter_profiles.py). Convention pinned here: beats every 4 pulses, the last note is
// held to the next bar's downbeat.
describe('weightedNoteToBeatDistance, 16-pulse timelines', () => {
  it.each([
    ['shiko', 'x...x.x...x.x...', 1.2],
    ['son', 'x..x..x...x.x...', 2.8],
    ['rumba', 'x..x...x..x.x...', 3.6],
    ['gahu', 'x..x..x...x...x.', 3.6],
    ['bossa-nova', 'x..x..x...x..x..', 4.0],
  ])('%s = %f as printed in the paper', (_name, pattern, expected) => {
    expect(weightedNoteToBeatDistance([4, 4, 4, 4], onsets(pattern))).toBeCloseTo(expected, 10);
  });

  // The paper prints 3.6 for soukous, but its own definition gives (0 + 8 + 4 + 2 + 8) / 5 = 4.4
  // under the convention that reproduces the other five values: the note at pulse 11 is a quarter
  // beat before beat 4 and, held to the bar's end, ends after beat 4 and at the next downbeat, so
  // D = 2 / (1/4) = 8. We assert the definition's value (DERIVED by hand and with SynPy3, Song,
  // Pearce & Harte, "SynPy: a Python toolkit for syncopation modelling", SMC 2015).
  it('soukous = 4.4 under the definition (the paper prints 3.6)', () => {
    expect(weightedNoteToBeatDistance([4, 4, 4, 4], onsets('x..x..x...xx....'))).toBeCloseTo(
      4.4,
      10,
    );
  });
});

// Source: Gómez, Melvin, Rappaport & Toussaint, "Mathematical measures of syncopation", BRIDGES
// 2005, 12-pulse ternary timelines with beats every 3 pulses (CONFIRMED-2ND via the AMADS test
// suite; the paper truncates 15/7 to 2.142). Ashanti is left out: the paper prints 2, while the
// definition under our end-of-bar convention gives 3 (its last note, a third of a beat before the
// downbeat, is held across beat 4 to the bar's end), so the paper used another handling there.
describe('weightedNoteToBeatDistance, 12-pulse timelines', () => {
  it.each([
    ['soli', '101010101101', 15 / 7],
    ['tambú', '101010110101', 15 / 7],
    ['bembé', '101011010101', 3],
    ['bembé-2', '110101101010', 15 / 7],
    ['yoruba', '101011010110', 3],
    ['tonada', '101101101010', 15 / 7],
    ['asaadua', '101010110110', 15 / 7],
    ['sorsonet', '111010101010', 3],
    ['bemba', '101101010110', 15 / 7],
  ])('%s matches the paper', (_name, pattern, expected) => {
    expect(weightedNoteToBeatDistance([3, 3, 3, 3], onsets(pattern))).toBeCloseTo(expected, 10);
  });
});

describe('weightedNoteToBeatDistance, definition', () => {
  it('is 0 for an empty bar and for notes only on beats', () => {
    expect(weightedNoteToBeatDistance([4, 4], onsets('........'))).toBe(0);
    expect(weightedNoteToBeatDistance([4, 4], onsets('x...x...'))).toBe(0);
  });

  it('measures distance in units of the beat the note lies in (tuplet grids)', () => {
    // One note on the 2nd quintuplet of beat 1, held to the bar's end (past beat 2, at the
    // downbeat after it): T = 1/5, D = 2 / T = 10, one note.
    expect(weightedNoteToBeatDistance([5, 5], onsets('.x........'))).toBeCloseTo(10, 10);
    // The same note followed by a note on beat 2: it ends on the next beat, D = 1 / T = 5.
    expect(weightedNoteToBeatDistance([5, 5], onsets('.x...x....'))).toBeCloseTo(5 / 2, 10);
  });
});
