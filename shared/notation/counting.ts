/**
 * Counting syllables written under the notes.
 *
 * Beats that stand alone (x/4 meters; x/8 bars of one to three beats) are counted by their
 * number and the syllables drummers speak after it (common practice): "1 &" for eighths,
 * "1 e & a" for sixteenths, "1 & a" for eighth-note triplets. Thirty-seconds insert "ta" between
 * the sixteenth syllables (from memory).
 *
 * Sextuplets (a beat in six) are heard as two triplets, as the metrical tree hears them, and
 * counted "1 a da & a da", the drummer and teacher T. Bishop's count for "sixtuplets / 16th note
 * triplets" ("Counting system overhaul - 02", Cruise Ship Drummer!, cruiseshipdrummer.com,
 * March 2023): the half-beat is the "&" it always is and each triplet's inner notes are "a da",
 * built from the syllables drummers already speak. The Eastman "la li" (McHose & Tibbs, 1945),
 * used here before, is a singers' count; the same author judges it out of place for drummers
 * ("Counting system overhaul - 01", November 2022).
 *
 * Quintuplets and septuplets have no count in drummers' common use, so they take the
 * beat-oriented syllables of R. Hoffman, W. Pelto and J. W. White, "Takadimi: A Beat-Oriented
 * System of Rhythm Pedagogy", Journal of Music Theory Pedagogy 10 (1996): quintuplet
 * ta-ka-di-mi-ti, septuplet ta-va-ki-di-da-mi-ti (read in a secondary source that reproduces the
 * system's syllable chart), the beat number standing for "ta".
 *
 * Grouped eighth meters (`meter.grouping`, unit 8 or 16) count by group:
 * - Compound meters (every group three eighths: 6/8, 9/8, 12/8, 15/8) count the dotted-quarter
 *   beats by number and the eighths between as "& a": "1 & a 2 & a". With sixteenths,
 *   "1 e & a & a". Both as taught by the drummer T. Bishop, "Gaps in our counting system",
 *   Cruise Ship Drummer! (cruiseshipdrummer.com), 16 November 2021 ("&-a for triplets and
 *   compound 8th notes"), and his follow-up post on counting 16th notes in compound meters
 *   ("in any compound meter … when 16th notes are involved, count 1e&a&a").
 * - Other groupings (5/8 as 3+2, 7/8 as 2+2+3, 11/8 …) count the eighths of each group from 1,
 *   so the group's start is always "1", printed bold: "1 2 1 2 1 2 3" for 7/8. As J. Falk,
 *   "Learning 7/8 Odd Time", drumlessons.com ("split this odd meter into smaller groupings of
 *   8th notes like 2-2-3 … 1 2-1 2-1 2 3"). A sixteenth between two counted eighths is "&",
 *   as for any counted beat; finer divisions take the syllables above.
 */

const AFTER_THE_BEAT: Readonly<Record<number, readonly string[]>> = {
  1: [],
  2: ['&'],
  3: ['&', 'a'],
  4: ['e', '&', 'a'],
  5: ['ka', 'di', 'mi', 'ti'],
  6: ['a', 'da', '&', 'a', 'da'],
  7: ['va', 'ki', 'di', 'da', 'mi', 'ti'],
  8: ['ta', 'e', 'ta', '&', 'ta', 'a', 'ta'],
};

/** The syllable for `slot` (0-based) of beat `beat` (from 1) in a beat of `subdivision` slots. */
export function countSyllable(beat: number, slot: number, subdivision: number): string {
  if (slot === 0) return String(beat);
  return afterTheBeat(slot, subdivision);
}

function afterTheBeat(slot: number, subdivision: number): string {
  const syllable = AFTER_THE_BEAT[subdivision]?.[slot - 1];
  if (syllable === undefined) {
    throw new RangeError(`No count for slot ${slot} of a beat in ${subdivision}`);
  }
  return syllable;
}

/** The spoken count of one whole beat, e.g. `1 e & a`. */
export function countBeat(beat: number, subdivision: number): string {
  return Array.from({ length: subdivision }, (_, slot) =>
    countSyllable(beat, slot, subdivision),
  ).join(' ');
}

/** What counting reads of the meter. */
export interface CountedMeter {
  /** The beat unit (bottom number): grouping changes the count of eighth and sixteenth meters. */
  readonly unit: number;
  /** Beats per group (the card's `meter.grouping`); null or absent where the beats stand alone. */
  readonly grouping?: readonly number[] | null;
}

export interface Syllable {
  readonly text: string;
  /** Printed bold: a counted beat's number, or a group's "1" where the meter groups its beats. */
  readonly strong: boolean;
}

/**
 * The syllables of every slot of every beat of one bar (outer index: beat, inner: slot), in the
 * systems described at the top of this file. `beats` gives the slots of each beat.
 */
export function countBar(beats: readonly number[], meter: CountedMeter): Syllable[][] {
  const grouping = meter.unit >= 8 ? (meter.grouping ?? null) : null;
  if (!grouping || grouping.reduce((a, b) => a + b, 0) !== beats.length) {
    return beats.map((slots, i) =>
      Array.from({ length: slots }, (_, slot) => ({
        text: countSyllable(i + 1, slot, slots),
        strong: slot === 0,
      })),
    );
  }
  const compound = grouping.every((size) => size === 3);
  const out: Syllable[][] = [];
  grouping.forEach((size, g) => {
    const first = out.length;
    const groupBeats = beats.slice(first, first + size);
    const divided = groupBeats.some((slots) => slots > 1);
    groupBeats.forEach((slots, i) => {
      out.push(
        Array.from({ length: slots }, (_, slot) =>
          compound
            ? compoundSyllable(g + 1, i, slot, slots, divided)
            : { text: slot === 0 ? String(i + 1) : afterTheBeat(slot, slots), strong: false },
        ),
      );
    });
    const start = out[first]?.[0];
    if (start && !compound) out[first]![0] = { ...start, strong: true };
  });
  return out;
}

/**
 * Eighth `eighth` (0-2) of dotted-quarter beat `group`, slot `slot` of its `slots`: "1 & a";
 * with sixteenths (any eighth of the group divided) "1 e & a & a" (T. Bishop, see above);
 * thirty-seconds put "ta" between those; other divisions of an eighth (rare in compound meters)
 * follow the eighth's syllable with the division's own.
 */
function compoundSyllable(
  group: number,
  eighth: number,
  slot: number,
  slots: number,
  divided: boolean,
): Syllable {
  const head = eighth === 0 ? String(group) : divided ? '&' : eighth === 1 ? '&' : 'a';
  if (slot === 0) return { text: head, strong: eighth === 0 };
  const second = eighth === 0 ? 'e' : 'a';
  if (slots === 2) return { text: second, strong: false };
  if (slots === 4) return { text: ['ta', second, 'ta'][slot - 1]!, strong: false };
  return { text: afterTheBeat(slot, slots), strong: false };
}
