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

/** Counts the overlaps (instants with two or more hits) given hits-per-instant of one bar. */
export function countOverlaps(hitsPerInstant: readonly number[]): number {
  let overlaps = 0;
  for (const count of hitsPerInstant) if (count >= 2) overlaps++;
  return overlaps;
}
