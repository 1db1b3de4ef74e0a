import type { BeatResidual } from '../../../shared/formats/midi-import/index';

const X4_NAMES: Record<number, string> = {
  2: 'eighths',
  3: 'triplets',
  4: 'sixteenths',
  5: 'quintuplets',
  6: 'sextuplets',
  7: 'septuplets',
  8: 'thirty-seconds',
};

/** A beat's subdivision in a drummer's words (x/4 meters name the note; others count slots). */
export function subdivisionWords(slots: number, unit: number): string {
  return unit === 4 ? (X4_NAMES[slots] ?? `${slots} slots`) : `${slots} slots a beat`;
}

/** Below this a note is on its slot for any ear (well under the ~10 ms players notice). */
const ON_GRID_MS = 1;

/** One beat's residual as a sentence: "Bar 2, beat 3 (triplets): up to 12 ms (2.4% of a beat)". */
export function beatResidualWords(residual: BeatResidual, unit: number): string {
  const share = `${(residual.beats * 100).toFixed(1)}% of a beat`;
  return `Bar ${residual.bar}, beat ${residual.beat} (${subdivisionWords(residual.slots, unit)}): notes up to ${residual.ms} ms off the grid (${share}).`;
}

/** The summary line over every beat that holds notes. */
export function residualSummary(residuals: readonly BeatResidual[]): string {
  const played = residuals.filter((r) => r.notes > 0);
  if (played.length === 0) return 'No beat holds a note.';
  const off = played.filter((r) => r.ms >= ON_GRID_MS);
  if (off.length === 0) return 'Every note sat on its slot (within 1 ms).';
  const worst = off.reduce((a, b) => (b.ms > a.ms ? b : a));
  const mean = played.reduce((sum, r) => sum + r.ms, 0) / played.length;
  return `${off.length} of ${played.length} beats with notes were played off the grid by 1 ms or more; the worst by ${worst.ms} ms (bar ${worst.bar}, beat ${worst.beat}); ${mean.toFixed(1)} ms on average.`;
}

/** The beats most off the grid, worst first (at most `count`), for the list under the summary. */
export function worstBeats(residuals: readonly BeatResidual[], count = 8): BeatResidual[] {
  return residuals
    .filter((r) => r.notes > 0 && r.ms >= ON_GRID_MS)
    .sort((a, b) => b.ms - a.ms || a.bar - b.bar || a.beat - b.beat)
    .slice(0, count);
}
