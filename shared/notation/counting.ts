/**
 * Counting syllables written under the notes.
 *
 * Binary and triplet grids use the counts drummers speak (common practice): "1 & " for eighths,
 * "1 e & a" for sixteenths, "1 & a" for eighth-note triplets. Quintuplets, sextuplets and
 * septuplets have no such common count, so they use the beat-oriented syllables of R. Hoffman,
 * W. Pelto and J. W. White, "Takadimi: A Beat-Oriented System of Rhythm Pedagogy", Journal of
 * Music Theory Pedagogy 10 (1996): quintuplet ta-ka-di-mi-ti, septuplet ta-va-ki-di-da-mi-ti
 * (both read in a secondary source that reproduces the system's syllable chart, not in the article
 * itself), and the six-part division ta-va-ki-di-da-ma, which Takadimi gives for a beat divided in
 * six. The beat number replaces "ta", as drummers count the beat by its number. Thirty-seconds
 * insert "ta" between the sixteenth syllables (from memory).
 */

const AFTER_THE_BEAT: Readonly<Record<number, readonly string[]>> = {
  1: [],
  2: ['&'],
  3: ['&', 'a'],
  4: ['e', '&', 'a'],
  5: ['ka', 'di', 'mi', 'ti'],
  6: ['va', 'ki', 'di', 'da', 'ma'],
  7: ['va', 'ki', 'di', 'da', 'mi', 'ti'],
  8: ['ta', 'e', 'ta', '&', 'ta', 'a', 'ta'],
};

/** The syllable for `slot` (0-based) of beat `beat` (from 1) in a beat of `subdivision` slots. */
export function countSyllable(beat: number, slot: number, subdivision: number): string {
  if (slot === 0) return String(beat);
  const syllables = AFTER_THE_BEAT[subdivision];
  const syllable = syllables?.[slot - 1];
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
