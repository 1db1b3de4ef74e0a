import type { Meter } from './schema';

/**
 * How the beats of a bar group, when the card does not say (common practice):
 * - compound meters (6/8, 9/8, 12/8, 15/8): groups of three eighths, each a dotted-quarter beat;
 * - odd eighth meters: 5/8 as 3+2, 7/8 as 2+2+3, 11/8 as 3+3+3+2, 13/8 as 3+3+3+2+2;
 * - even eighth meters that are not multiples of three (4/8, 8/8, 10/8, 14/8): twos;
 * - quarter and half-note meters, and bars of one to three beats: no grouping (each beat counts).
 * Sixteenth meters group the same way. Returns null where the beats stand alone.
 */
export function defaultGrouping(meter: {
  readonly beats: number;
  readonly unit: number;
}): number[] | null {
  const { beats, unit } = meter;
  if (unit < 8 || beats <= 3) return null;
  if (beats % 3 === 0) return Array.from({ length: beats / 3 }, () => 3);
  const odd: Record<number, number[]> = {
    5: [3, 2],
    7: [2, 2, 3],
    11: [3, 3, 3, 2],
    13: [3, 3, 3, 2, 2],
  };
  return odd[beats]?.slice() ?? Array.from({ length: beats / 2 }, () => 2);
}

/** True for 6/8, 9/8, 12/8 and the like: every group is three beats of an eighth or shorter. */
export function isCompound(
  meter: Pick<Meter, 'unit'> & { grouping?: readonly number[] | undefined },
): boolean {
  return meter.unit >= 8 && !!meter.grouping && meter.grouping.every((g) => g === 3);
}
