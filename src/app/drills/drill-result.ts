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

// Kept here for existing callers; the score imports them from drill-scale.ts, which needs no engine.
export { onCardScale, targetTension } from './drill-scale';
