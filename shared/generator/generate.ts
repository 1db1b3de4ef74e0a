import type { Drill } from './drill';
import type { GenerateOptions } from './keep';
import { createRng } from './random';
import type { RuleCard } from './schema';
import { SEARCH_WORK_BUDGET } from './select';
import { giveUp } from './tension-reach';
import { barsOf, checked, keepsOrder } from './pipeline/check';
import { draw } from './pipeline/draw';
import { provenFor } from './pipeline/memo';
import { shape } from './pipeline/shape';
import { stick } from './pipeline/stick';
import type { Attempt } from './pipeline/stages';

/**
 * Generates the drill for a card and a seed, one stage after the other (`pipeline/`): the card
 * framed on its grid, the obligations placed, conflicts proven absent, fills drawn, tension
 * shaped, the sticking, and a final check against every rule. Deterministic: the same card,
 * seed, kept bars and ENGINE_VERSION give byte-identical JSON. Throws a RuleConflictError
 * naming the rules when they cannot all hold.
 *
 * `options.keep`: bars pinned as they are (see `GenerateOptions`); the others are generated
 * around them. A kept bar that does not fit the card is refused with a RuleCardError naming it.
 */
export function generateDrill(input: RuleCard, seed: string, options: GenerateOptions = {}): Drill {
  // The proof depends on the card and the kept bars alone: the last few are remembered.
  const proven = provenFor(input, seed, options.keep);
  const attempt: Attempt = { rng: createRng(seed), budget: { left: SEARCH_WORK_BUDGET } };
  // Fresh fills are tried, while the work budget lasts, when the strokes the limbs cannot play
  // were removed and that broke the tension order.
  for (;;) {
    const stuck = stick(shape(draw(proven, attempt), attempt), attempt);
    const bars = barsOf(stuck);
    if (keepsOrder(stuck, bars)) return checked(stuck, bars);
    // A spent search budget would only repeat the failed attempt's luck at full cost.
    if (attempt.budget.left <= 0) break;
  }
  // Impossible only if the exact proof says so; otherwise the search says it gave up.
  return giveUp(proven.free, proven.targets, proven.gauge);
}
