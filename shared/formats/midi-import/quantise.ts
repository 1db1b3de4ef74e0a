/** Slots per beat the importer chooses from (2 = eighths … 8 = thirty-seconds). */
export const SUBDIVISIONS = [2, 3, 4, 5, 6, 7, 8] as const;

/**
 * Two subdivisions whose worst errors differ by at most this share of a beat count as a tie, and
 * the smaller wins: sixteenths played a little loose stay sixteenths rather than becoming
 * thirty-seconds. It stays below 1/56, the closest two slots of different subdivisions 2–8 come
 * (1/8 and 1/7 of a beat), so notes written on exact slots always come back on their own grid
 * (1/64 of a beat is about 8 ms at 120 BPM; our own choice).
 */
export const TIE_TOLERANCE = 1 / 64;

/** Notes this share of a beat early belong to the next beat's first slot (our own choice). */
export const EARLY_MARGIN = 1 / 16;

export interface BeatFit {
  /** Slots per beat chosen. */
  readonly slots: number;
  /** Slot of each onset, in the order given. */
  readonly slotOf: readonly number[];
  /** Greatest distance of an onset from its slot, as a share of the beat (0 when empty). */
  readonly error: number;
}

/** Where an onset (in beats from the beat's start, −EARLY_MARGIN ≤ x < 1 − EARLY_MARGIN) lands. */
function slotFor(x: number, slots: number): number {
  return Math.min(slots - 1, Math.max(0, Math.round(x * slots)));
}

/**
 * Quantises one beat: for every subdivision 2–8, each onset goes to its nearest slot; the
 * subdivision with the least worst error wins, the smaller one on a tie within
 * {@link TIE_TOLERANCE}. An empty beat is eighths (the smallest).
 */
export function fitBeat(onsets: readonly number[]): BeatFit {
  const fits = SUBDIVISIONS.map((slots) => {
    const slotOf = onsets.map((x) => slotFor(x, slots));
    const error = onsets.reduce(
      (worst, x, i) => Math.max(worst, Math.abs(x - slotOf[i]! / slots)),
      0,
    );
    return { slots, slotOf, error };
  });
  const least = fits.reduce((min, fit) => Math.min(min, fit.error), Infinity);
  return fits.find((fit) => fit.error <= least + TIE_TOLERANCE)!;
}
