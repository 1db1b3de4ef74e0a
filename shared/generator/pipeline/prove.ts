import { assertNoObligationConflicts } from '../conflicts';
import type { DrillBar } from '../drill';
import { RuleCardError, RuleConflictError } from '../errors';
import { createFillContext, type FillContext } from '../fill';
import { readKeptBars, withKeptBars, type KeptBars } from '../keep';
import { checkBarsAlone, type Violation } from '../rules/checker';
import { tensionTargets } from '../rules/tension';
import { assertTensionReachable, barReaches, cardReach, type BarReach } from '../tension-reach';
import { listWords } from '../words';
import { barOf } from './bars';
import type { Placed, Proven } from './stages';
import { phraseVaries } from '../rules/phrase';

/**
 * Stage 3: refuses, by proof, cards whose rules cannot all hold (colliding obligations, too
 * many hands, a linear budget, a tension curve out of reach) and kept bars that do not fit;
 * works out the room the fill has, the card's tension reach and each bar's goal on it.
 */
export function prove(placed: Placed, keep: readonly DrillBar[]): Proven {
  const { card, grid, ob, gauge } = placed;
  assertNoObligationConflicts(card, grid, ob);
  const kept = readKeptBars(card, grid, keep);
  if (kept.size > 0) assertKeptBarsFit(placed, kept);
  const room = createFillContext(card, grid, ob);
  const reaches = barReaches(room, gauge);
  const reach = cardReach(reaches);
  const free =
    kept.size === 0
      ? room
      : createFillContext(card, grid, withKeptBars(ob, grid, kept), new Set(kept.keys()));
  const targets = tensionTargets(card, grid.bars);
  // The LHL proof reads the same unlisted reaches when no bar is kept: worked out once.
  const known = free === room && gauge.measure === 'lhl' ? reaches : null;
  if (targets) assertTensionReachableKeeping(placed, free, targets, kept, known);
  // A target reads on what this card can reach: 0 its calmest bar, 1 its tensest.
  const goals =
    targets?.map((t) => gauge.unitsOfRaw(reach.least + t * (reach.most - reach.least))) ?? null;
  const variety = allowsOneDrill(room) ? 'single' : 'many';
  return { ...placed, kept, room, free, reach, targets, goals, variety };
}

/**
 * Refuses kept bars that break, on their own, a rule of the card (a missing backbeat, a fill in
 * a time voice…) with a RuleCardError naming the bar. A kept bar that breaks the cycle of a rule
 * that runs across bars (a phrase's fill and landing, an avoidDownbeat's resolution) makes that
 * rule impossible across the drill: a RuleConflictError naming the rule.
 */
function assertKeptBarsFit(placed: Placed, kept: KeptBars): void {
  const { card, grid, ob } = placed;
  // The other bars hold just what the card obliges: only the kept bars' own faults show.
  const bars = Array.from(
    { length: grid.bars },
    (_, b) => kept.get(b) ?? barOf(grid, b, ob.cells, 0),
  );
  const faults = checkBarsAlone(card, grid, ob, bars, new Set(kept.keys()));
  const words = (f: Violation): string => `Pinned bar ${f.bar}: ${lowerFirst(f.message)}`;
  // One line per fault: a note missing at several instants is said once.
  const once = (list: readonly Violation[]): Violation[] =>
    list.filter((f, k) => list.findIndex((g) => words(g) === words(f)) === k);
  const own = once(faults.filter((f) => !ACROSS_BARS.has(f.code)));
  if (own.length > 0) {
    const order = [...kept.keys()];
    throw new RuleCardError(
      'invalid_keep',
      own.map((f) => ({ path: `keep[${order.indexOf((f.bar ?? 1) - 1)}]`, message: words(f) })),
    );
  }
  if (faults.length > 0)
    throw new RuleConflictError(once(faults).map(words).join(' '), [
      ...new Set(faults.map((f) => f.code)),
      'keep',
    ]);
}

/** Rules whose cycle runs across bars: a kept bar can make them impossible for the drill. */
const ACROSS_BARS: ReadonlySet<string> = new Set(['phrase', 'avoidDownbeat']);

export const lowerFirst = (text: string): string => text.charAt(0).toLowerCase() + text.slice(1);

/**
 * `assertTensionReachable` on the drill with its kept bars fixed: when the card alone could
 * keep the curve but not around the kept bars' tensions, the refusal names the kept bars.
 */
function assertTensionReachableKeeping(
  placed: Placed,
  free: FillContext,
  targets: readonly number[],
  kept: KeptBars,
  known: readonly BarReach[] | null,
): void {
  try {
    assertTensionReachable(free, targets, placed.gauge, placed.gauge.measure !== 'lhl', known);
  } catch (error) {
    if (!(error instanceof RuleConflictError) || kept.size === 0) throw error;
    const bars = [...kept.keys()].sort((a, b) => a - b).map((b) => b + 1);
    throw new RuleConflictError(
      `With bar${bars.length === 1 ? '' : 's'} ${listWords(bars)} pinned as ${bars.length === 1 ? 'it is' : 'they are'}, the tension rule cannot hold: ${lowerFirst(error.message)} Unpin a bar, or pin bars whose tensions follow the curve.`,
      ['keep', ...error.rules],
    );
  }
}

/**
 * True when every seed gives the same drill: no bar has a fill to choose (the density rounds to
 * nothing, or to every free slot with one voice each) and nothing else is drawn (no tension
 * search, no ghost/accent shares to arrange, no phrase fill to vary).
 */
function allowsOneDrill(ctx: FillContext): boolean {
  const { card, grid } = ctx;
  if (card.rules.some((r) => r.kind === 'tension')) return false;
  if (phraseVaries(card, grid)) return false;
  if (card.rules.some((r) => r.kind === 'fillHoles' && r.ghost > 0 && r.ghost + r.accent < 1))
    return false;
  for (let bar = 0; bar < grid.bars; bar++) {
    const options = (ctx.options[bar] ?? []).filter((voices) => voices.length > 0);
    const count = Math.round(card.density * options.length);
    if (count === 0) continue;
    if (count < options.length || options.some((voices) => voices.length > 1)) return false;
  }
  return true;
}
