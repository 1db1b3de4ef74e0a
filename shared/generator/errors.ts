/**
 * The engine's error vocabulary. Messages are written for a teacher reading them in the app, so
 * they use the trade's words (bar, beat, backbeat) and never the code's (slot index, array).
 */

/** One problem found on a rule card: where it is and what to do about it. */
export interface RuleCardIssue {
  /** Field path in the card, e.g. `rules[1].shift` (empty for the whole card). */
  readonly path: string;
  readonly message: string;
}

/** A rule card that is malformed or out of range: thrown by `parseRuleCard`. */
export class RuleCardError extends Error {
  override readonly name = 'RuleCardError';
  /** Stable machine-readable code, e.g. `invalid_card`. */
  readonly code: string;
  /** Path of the first problem (see `issues` for all of them). */
  readonly path: string;
  readonly issues: readonly RuleCardIssue[];

  constructor(code: string, issues: readonly RuleCardIssue[]) {
    super(issues.map((issue) => issue.message).join(' ') || 'The rule card is not valid.');
    this.code = code;
    this.issues = issues;
    this.path = issues[0]?.path ?? '';
  }
}

/**
 * A card whose rules cannot all hold at once. The message names the rules in plain words, so a
 * teacher knows which one to relax.
 */
export class RuleConflictError extends Error {
  override readonly name = 'RuleConflictError';
  readonly code = 'rule_conflict';
  /** Rule kinds (or `ostinato`, `density`, `voices`, `hands`) involved in the conflict. */
  readonly rules: readonly string[];

  constructor(message: string, rules: readonly string[]) {
    super(message);
    this.rules = rules;
  }
}

/**
 * The generator's search spent its work budget before it found a drill for this seed. Not a
 * verdict on the card (impossible cards are refused with a RuleConflictError, by proof): another
 * seed may well succeed.
 */
export class SearchExhaustedError extends Error {
  override readonly name = 'SearchExhaustedError';
  readonly code = 'search_exhausted';

  constructor() {
    super(
      'The generator gave up on this seed before it found a drill: its search has a fixed budget of work. The card itself may well be fine: try another seed.',
    );
  }
}
