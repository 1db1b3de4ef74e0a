import { collectObligations } from '../obligations';
import type { Framed, Placed } from './stages';

/** Stage 2: the time layers and anchors, and every rule's placements, merged by precedence. */
export function place(framed: Framed): Placed {
  return { ...framed, ob: collectObligations(framed.card, framed.grid, framed.seed) };
}
