import {
  generateDrill,
  RuleConflictError,
  SearchExhaustedError,
  type Drill,
  type RuleCard,
} from '../../shared/generator/index';
import { HttpError } from '../http-error';

/** Turns a parsed card and a seed into a drill; the engine's by default, injectable for tests. */
export type DrillGenerator = (card: RuleCard, seed: string) => Drill;

export const engineGenerator: DrillGenerator = (card, seed) => generateDrill(card, seed);

/**
 * Runs the generator, turning the engine's refusals into 400s a teacher can act on: a conflict
 * names the rules; an exhausted search suggests another seed.
 */
export function generateOrRefuse(generate: DrillGenerator, card: RuleCard, seed: string): Drill {
  try {
    return generate(card, seed);
  } catch (error) {
    if (error instanceof RuleConflictError) {
      throw new HttpError(400, 'rule_conflict', error.message, [
        { path: 'body.card.rules', message: error.message },
      ]);
    }
    if (error instanceof SearchExhaustedError) {
      throw new HttpError(400, 'search_exhausted', error.message, [
        { path: 'body.seed', message: error.message },
      ]);
    }
    throw error;
  }
}
