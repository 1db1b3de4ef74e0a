import type { DrillHit } from '../drill';

/** A drill hit with its bar and drill-wide instant. */
export type Located = { hit: DrillHit; bar: number; instant: number };

/** Where a located hit is, for a violation. */
export const where = (l: Located): { bar: number; beat: number; slot: number } => ({
  bar: l.bar,
  beat: l.hit.beat,
  slot: l.hit.slot,
});
