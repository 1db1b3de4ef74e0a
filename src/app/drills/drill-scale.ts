import type { Drill } from '../../../shared/generator/index';

/** The card's target tension for a bar (its `tension` curve repeats over the bars), if any. */
export function targetTension(drill: Drill, bar: number): number | null {
  const rule = drill.card.rules.find((r) => r.kind === 'tension');
  if (!rule || rule.kind !== 'tension' || rule.curve.length === 0) return null;
  return rule.curve[(bar - 1) % rule.curve.length] ?? null;
}

/**
 * A bar's tension on the card's own scale: 0 the calmest bar the card allows, 1 the tensest
 * (`drill.tensionReach`); the scale a tension target is read on. Null when the card allows only
 * one tension.
 */
export function onCardScale(drill: Drill, tension: number): number | null {
  const reach = drill.tensionReach;
  if (!reach || reach.most <= reach.least) return null;
  return Math.min(1, Math.max(0, (tension - reach.least) / (reach.most - reach.least)));
}
