import {
  generateDrill,
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
  type Drill,
  type GenerateOptions,
  type RuleCard,
} from '../../shared/generator/index';
import { HttpError } from '../http-error';

/**
 * Turns a parsed card, a seed and pinned bars into a drill; the engine's by default, injectable
 * for tests.
 */
export type DrillGenerator = (card: RuleCard, seed: string, options?: GenerateOptions) => Drill;

export const engineGenerator: DrillGenerator = (card, seed, options) =>
  generateDrill(card, seed, options);

/**
 * Runs the generator, turning the engine's refusals into 400s a teacher can act on: a pinned
 * bar that does not fit names the bar (`body.keep[0].bar`); a conflict names the rules; an
 * exhausted search suggests another seed.
 */
export function generateOrRefuse(
  generate: DrillGenerator,
  card: RuleCard,
  seed: string,
  options: GenerateOptions = {},
): Drill {
  try {
    return generate(card, seed, options);
  } catch (error) {
    if (error instanceof RuleCardError && error.code === 'invalid_keep') {
      const details = error.issues.map((issue) => ({
        path: `body.${issue.path || 'keep'}`,
        message: issue.message,
      }));
      throw new HttpError(400, 'invalid_keep', error.message, details);
    }
    if (error instanceof RuleConflictError) {
      const path = error.rules.includes('keep') ? 'body.keep' : 'body.card.rules';
      throw new HttpError(400, 'rule_conflict', error.message, [{ path, message: error.message }]);
    }
    if (error instanceof SearchExhaustedError) {
      throw new HttpError(400, 'search_exhausted', error.message, [
        { path: 'body.seed', message: error.message },
      ]);
    }
    throw error;
  }
}
