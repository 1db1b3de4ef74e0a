import { parseRuleCard, RuleCardError, type RuleCard } from '../../shared/generator/index';
import { HttpError } from '../http-error';
import { meterText, subdivisionWord } from '../presets/preset-summary';

/** What lists show and filter by, copied out of a card when it is stored. */
export interface CardFacts {
  readonly meter: string;
  readonly subdivision: string;
  /** Slots per beat when every beat shares one grid, else null. */
  readonly slots: number | null;
  readonly bars: number;
  readonly tempo: number;
}

/**
 * Validates a rule card with the engine; an invalid card becomes 400 `invalid_rule_card` with the
 * engine's own sentences, each under the request path of its field (`body.card.rules[1].shift`).
 */
export function checkCard(card: unknown, at = 'body.card'): RuleCard {
  try {
    return parseRuleCard(card);
  } catch (error) {
    if (!(error instanceof RuleCardError)) throw error;
    const details = error.issues.map((issue) => ({
      path: issue.path ? `${at}${issue.path.startsWith('[') ? '' : '.'}${issue.path}` : at,
      message: issue.message,
    }));
    throw new HttpError(400, 'invalid_rule_card', error.message, details);
  }
}

/** The listed facts of a parsed card. */
export function cardFacts(card: RuleCard): CardFacts {
  const perBeat = typeof card.subdivision === 'number' ? [card.subdivision] : card.subdivision;
  const distinct = [...new Set(perBeat)];
  return {
    meter: meterText(card),
    subdivision: subdivisionWord(card),
    slots: distinct.length === 1 ? distinct[0]! : null,
    bars: card.bars,
    tempo: card.tempo,
  };
}
