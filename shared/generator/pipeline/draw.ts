import { drawFills } from '../select';
import { landingBars } from '../rules/landing';
import type { Attempt, Drawn, Proven } from './stages';

/**
 * Stage 4: the fills. Each bar takes `density` of its free slots by seeded weighted draws,
 * leaning on strong positions for calm targets and off them for tense ones; without a tension
 * curve, landing bars (resolutions, a phrase's first bar) are drawn calm so that they release.
 */
export function draw(proven: Proven, attempt: Attempt): Drawn {
  return {
    ...proven,
    drawn: drawFills(
      proven.free,
      attempt.rng,
      proven.targets,
      landingBars(proven.card, proven.grid.bars),
    ),
  };
}
