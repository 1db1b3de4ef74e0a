/** The parts of a normalised rule card that a preset listing shows. */
export interface CardShape {
  readonly meter: { readonly beats: number; readonly unit: number };
  readonly subdivision: number | readonly number[];
}

/**
 * The trade's names for n slots per beat (common practice): 1 quarters, 2 eighths, 3 triplets,
 * 4 sixteenths, 5 quintuplets, 6 sextuplets, 7 septuplets, 8 thirty-seconds.
 */
const SUBDIVISION_WORDS: Readonly<Record<number, string>> = {
  1: 'quarters',
  2: 'eighths',
  3: 'triplets',
  4: 'sixteenths',
  5: 'quintuplets',
  6: 'sextuplets',
  7: 'septuplets',
  8: 'thirty-seconds',
};

/** The meter as written on a score, e.g. `"4/4"` or `"7/8"`. */
export function meterText(card: CardShape): string {
  return `${card.meter.beats}/${card.meter.unit}`;
}

/**
 * One word for the card's grid: the subdivision's name when every beat shares it, `"mixed"`
 * when the beats differ.
 */
export function subdivisionWord(card: CardShape): string {
  const perBeat = typeof card.subdivision === 'number' ? [card.subdivision] : card.subdivision;
  const distinct = [...new Set(perBeat)];
  if (distinct.length !== 1) return 'mixed';
  const slots = distinct[0]!;
  return SUBDIVISION_WORDS[slots] ?? `${slots} per beat`;
}
