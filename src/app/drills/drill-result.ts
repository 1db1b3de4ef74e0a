import {
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
  generateDrill,
  parseRuleCard,
  type Drill,
} from '../../../shared/generator/index';

/** A generated drill, or what stopped the engine in words a teacher can act on. */
export type DrillResult =
  | { readonly status: 'ready'; readonly drill: Drill }
  | { readonly status: 'error'; readonly heading: string; readonly message: string };

/** Validate the card and generate its drill for `seed`, in the browser. */
export function generateFromCard(card: unknown, seed: string): DrillResult {
  try {
    return { status: 'ready', drill: generateDrill(parseRuleCard(card), seed) };
  } catch (error) {
    if (error instanceof RuleCardError) {
      return { status: 'error', heading: 'This rule card needs a change', message: error.message };
    }
    if (error instanceof RuleConflictError) {
      return {
        status: 'error',
        heading: 'These rules cannot all hold at once',
        message: `${error.message} Relax one of them on the rule card.`,
      };
    }
    if (error instanceof SearchExhaustedError) {
      return { status: 'error', heading: 'Try another seed', message: error.message };
    }
    return {
      status: 'error',
      heading: 'The drill could not be generated',
      message: error instanceof Error ? error.message : 'Please try another seed.',
    };
  }
}

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
