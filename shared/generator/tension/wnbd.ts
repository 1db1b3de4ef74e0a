import { type BarGrid, metricalGrid } from './metrical-grid';

/**
 * Weighted note-to-beat distance of one bar: F. Gómez, A. Melvin, D. Rappaport, G. T. Toussaint,
 * "Mathematical measures of syncopation", Proc. BRIDGES 2005 (Banff).
 *
 * The beats e_i are the meter's beats (slot 0 of each beat). A note lasts until the next onset;
 * the last note is held to the next bar's downbeat (the bar's end), the convention under which the
 * paper's values for its 16-pulse timelines are reproduced. For a note x, T(x) is the distance to
 * the nearest beat in units of the beat it lies in; D(x) = 0 on a beat, 1/T(x) when x ends at or
 * before the next beat e_{i+1}, 2/T(x) when it ends after e_{i+1} and at or before e_{i+2}, and
 * 1/T(x) when it ends later. WNBD = ΣD(x) / number of notes (0 for an empty bar). Beats after the
 * bar's end are taken to have the first beat's length.
 */
export function weightedNoteToBeatDistance(beats: BarGrid, onsets: readonly boolean[]): number {
  const { pulses, beatStarts } = metricalGrid(beats);
  const notes: number[] = [];
  for (let p = 0; p < pulses; p++) if (onsets[p] === true) notes.push(p);
  if (notes.length === 0) return 0;
  const beatAt = (i: number): number =>
    i <= beats.length ? (beatStarts[i] ?? pulses) : pulses + (i - beats.length) * (beats[0] ?? 1);
  let total = 0;
  let beat = 0;
  notes.forEach((start, n) => {
    while ((beatStarts[beat + 1] ?? pulses) <= start) beat++;
    const slots = beats[beat] ?? 1;
    const slot = start - (beatStarts[beat] ?? 0);
    if (slot === 0) return;
    const distance = Math.min(slot, slots - slot) / slots;
    const end = notes[n + 1] ?? pulses;
    const across = end > beatAt(beat + 1) && end <= beatAt(beat + 2);
    total += (across ? 2 : 1) / distance;
  });
  return total / notes.length;
}
