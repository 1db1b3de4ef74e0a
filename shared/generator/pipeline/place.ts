import type { DrillBar } from '../drill';
import { collectObligations } from '../obligations';
import { givenFillOf } from '../rules/phrase';
import type { Framed, Placed } from './stages';

/** Stage 2: the time layers and anchors, and every rule's placements, merged by precedence. */
export function place(framed: Framed, keep: readonly DrillBar[] = []): Placed {
  const { card, grid, seed } = framed;
  const given = keep.length > 0 ? givenFillOf(grid, keep) : undefined;
  return { ...framed, ob: collectObligations(card, grid, seed, given) };
}
