import { shapeTension } from '../select';
import type { Attempt, Drawn, Shaped } from './stages';

/**
 * Stage 5: tension shaping. With a tension rule, a bounded search moves fill notes until the
 * bars keep the curve's rank order and sit close to their goals; without one the fills stand.
 */
export function shape(drawn: Drawn, attempt: Attempt): Shaped {
  const { drawn: base, ...proven } = drawn;
  const fills = shapeTension(
    proven.free,
    base.slice(),
    attempt.rng,
    proven.targets,
    proven.gauge,
    attempt.budget,
    proven.goals,
  );
  return { ...proven, fills };
}
