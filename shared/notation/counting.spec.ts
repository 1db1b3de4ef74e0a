import { describe, expect, it } from 'vitest';
import { countBar, countBeat, countSyllable, type CountedMeter } from './counting';

/** The count of a bar as one spoken line, e.g. `1 & a 2 & a`. */
function spoken(beats: readonly number[], meter: CountedMeter): string {
  return countBar(beats, meter)
    .flatMap((beat) => beat.map((s) => s.text))
    .join(' ');
}

/** The syllables printed bold. */
function strong(beats: readonly number[], meter: CountedMeter): string {
  return countBar(beats, meter)
    .flatMap((beat) => beat.filter((s) => s.strong).map((s) => s.text))
    .join(' ');
}

const same = (n: number, slots: number): number[] => Array.from({ length: n }, () => slots);

describe('counting syllables', () => {
  it('binary and triplet counts as drummers speak them (common practice)', () => {
    expect(countBeat(1, 1)).toBe('1');
    expect(countBeat(2, 2)).toBe('2 &');
    expect(countBeat(3, 3)).toBe('3 & a');
    expect(countBeat(4, 4)).toBe('4 e & a');
  });

  it('sextuplets as two triplets, "1 a da & a da"', () => {
    // T. Bishop, "Counting system overhaul - 02", Cruise Ship Drummer! (cruiseshipdrummer.com),
    // March 2023: "Sixtuplets / 16th note triplets: 1ada-&ada".
    expect(countBeat(1, 6)).toBe('1 a da & a da');
    expect(countBeat(3, 6)).toBe('3 a da & a da');
  });

  it('quintuplets and septuplets in Takadimi syllables (Hoffman, Pelto & White, JMTP 10, 1996)', () => {
    // Quintuplet and septuplet syllables read in a secondary reproduction of the Takadimi chart.
    expect(countBeat(1, 5)).toBe('1 ka di mi ti');
    expect(countBeat(1, 7)).toBe('1 va ki di da mi ti');
  });

  it('refuses a slot outside the beat', () => {
    expect(() => countSyllable(1, 4, 4)).toThrow(RangeError);
  });

  it('counts meters without grouping beat by beat, each number bold', () => {
    expect(spoken(same(4, 4), { unit: 4 })).toBe('1 e & a 2 e & a 3 e & a 4 e & a');
    expect(strong(same(4, 4), { unit: 4 })).toBe('1 2 3 4');
    // A card's grouping of quarter beats (5/4 as 3+2) does not change the count of quarters.
    expect(spoken(same(5, 1), { unit: 4, grouping: [3, 2] })).toBe('1 2 3 4 5');
    // Bars of one to three eighths have no grouping: each eighth counts (common practice).
    expect(spoken(same(3, 2), { unit: 8, grouping: null })).toBe('1 & 2 & 3 &');
  });

  describe('compound meters: dotted-quarter beats "1 & a 2 & a"', () => {
    // Source: T. Bishop, "Gaps in our counting system", Cruise Ship Drummer!, 16 Nov 2021:
    // drummers count "&-a for triplets and compound 8th notes".
    it('6/8, 9/8, 12/8 and 15/8 in eighths', () => {
      expect(spoken(same(6, 1), { unit: 8, grouping: [3, 3] })).toBe('1 & a 2 & a');
      expect(spoken(same(9, 1), { unit: 8, grouping: [3, 3, 3] })).toBe('1 & a 2 & a 3 & a');
      expect(spoken(same(12, 1), { unit: 8, grouping: [3, 3, 3, 3] })).toBe(
        '1 & a 2 & a 3 & a 4 & a',
      );
      expect(spoken(same(15, 1), { unit: 8, grouping: [3, 3, 3, 3, 3] })).toBe(
        '1 & a 2 & a 3 & a 4 & a 5 & a',
      );
      // Only the dotted-quarter numbers are bold.
      expect(strong(same(6, 1), { unit: 8, grouping: [3, 3] })).toBe('1 2');
    });

    // Source: T. Bishop, Cruise Ship Drummer! (cruiseshipdrummer.com/?p=609): "in any compound
    // meter — 6/8, 12/8, 3/8, 9/8, 15/8 — when 16th notes are involved, count 1e&a&a".
    it('with sixteenths, "1 e & a & a"', () => {
      expect(spoken(same(6, 2), { unit: 8, grouping: [3, 3] })).toBe('1 e & a & a 2 e & a & a');
      expect(
        spoken(same(6, 4), { unit: 8, grouping: [3, 3] })
          .split(' ')
          .slice(0, 12),
      ).toEqual(
        // Thirty-seconds put "ta" between (from memory, as in simple meters).
        ['1', 'ta', 'e', 'ta', '&', 'ta', 'a', 'ta', '&', 'ta', 'a', 'ta'],
      );
    });
  });

  describe('odd groupings: each group counted from 1, its "1" bold', () => {
    // Source: J. Falk, "Learning 7/8 Odd Time", drumlessons.com: "split this odd meter into
    // smaller groupings of 8th notes like 2-2-3 … count patterns in 7/8 like so: 1 2-1 2-1 2 3".
    it('7/8 as 2+2+3 and its rotations, 5/8 both ways, 11/8', () => {
      expect(spoken(same(7, 1), { unit: 8, grouping: [2, 2, 3] })).toBe('1 2 1 2 1 2 3');
      expect(strong(same(7, 1), { unit: 8, grouping: [2, 2, 3] })).toBe('1 1 1');
      expect(spoken(same(7, 1), { unit: 8, grouping: [3, 2, 2] })).toBe('1 2 3 1 2 1 2');
      expect(spoken(same(5, 1), { unit: 8, grouping: [3, 2] })).toBe('1 2 3 1 2');
      expect(spoken(same(5, 1), { unit: 8, grouping: [2, 3] })).toBe('1 2 1 2 3');
      expect(spoken(same(11, 1), { unit: 8, grouping: [3, 3, 3, 2] })).toBe(
        '1 2 3 1 2 3 1 2 3 1 2',
      );
    });

    // A sixteenth halfway between counted eighths is their "&" (common practice; as S. Goold,
    // "Counting" posts, stevegoold.wordpress.com: "in 6/8 time, when the beat is now an 8th
    // note … the 16th note is the new halfway marker and that would be counted as 'and'").
    it('7/8 in sixteenths', () => {
      expect(spoken(same(7, 2), { unit: 8, grouping: [2, 2, 3] })).toBe(
        '1 & 2 & 1 & 2 & 1 & 2 & 3 &',
      );
    });
  });
});
