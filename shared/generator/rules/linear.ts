import type { RuleCard } from '../schema';

/**
 * How many instants per bar may have two or more limbs striking together (ostinato included).
 * Several linear rules: the strictest holds. No linear rule: no limit.
 */
export function overlapBudget(card: RuleCard): number {
  let budget = Number.POSITIVE_INFINITY;
  for (const rule of card.rules)
    if (rule.kind === 'linear') budget = Math.min(budget, rule.maxOverlaps);
  return budget;
}

/**
 * The overlaps (instants where two or more hits sound) among instants `from` to `to` (not
 * included), given how many hits sound at an instant.
 */
export function countOverlaps(
  from: number,
  to: number,
  hitsAt: (instant: number) => number,
): number {
  let overlaps = 0;
  for (let i = from; i < to; i++) if (hitsAt(i) >= 2) overlaps++;
  return overlaps;
}
