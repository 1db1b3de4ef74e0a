import {
  RuleCardError,
  RuleConflictError,
  SearchExhaustedError,
  generateDrill,
  parseRuleCard,
  type Drill,
  type DrillBar,
  type RuleCardIssue,
} from '../../../shared/generator/index';
import type { CardDraft } from './card-draft';

/** What the engine made of the card being edited. */
export type PreviewOutcome =
  | { readonly status: 'ready'; readonly drill: Drill }
  | { readonly status: 'invalid'; readonly issues: readonly RuleCardIssue[] }
  | {
      readonly status: 'conflict';
      readonly message: string;
      /** Rule kinds (or `ostinato`, `density`, `voices`, `hands`) the engine named. */
      readonly parts: readonly string[];
    }
  | { readonly status: 'failed'; readonly message: string };

/**
 * Validate and generate in one go (pinned bars kept as they are), turning the engine's refusals
 * into data the form can place.
 */
export function previewOutcome(
  card: CardDraft,
  seed: string,
  keep: readonly DrillBar[] = [],
): PreviewOutcome {
  try {
    return { status: 'ready', drill: generateDrill(parseRuleCard(card), seed, { keep }) };
  } catch (error) {
    if (error instanceof RuleCardError) return { status: 'invalid', issues: error.issues };
    if (error instanceof RuleConflictError) {
      return { status: 'conflict', message: error.message, parts: error.rules };
    }
    if (error instanceof SearchExhaustedError) return { status: 'failed', message: error.message };
    // Anything else is a bug in the engine; say so in words rather than leave a blank preview.
    return {
      status: 'failed',
      message: `The preview could not be generated: ${error instanceof Error ? error.message : String(error)}`,
    };
  }
}

/**
 * The messages that belong to one field: issues at `path` itself or inside it
 * (`rules[1]` collects `rules[1].beats[0]`). An empty path collects nothing.
 */
export function issuesAt(outcome: PreviewOutcome | null, path: string): string[] {
  if (outcome?.status !== 'invalid' || path === '') return [];
  return outcome.issues
    .filter(
      (issue) =>
        issue.path === path ||
        issue.path.startsWith(`${path}.`) ||
        issue.path.startsWith(`${path}[`),
    )
    .map((issue) => issue.message);
}

/** The messages about `path` itself, not about the fields inside it. */
export function issuesExactlyAt(outcome: PreviewOutcome | null, path: string): string[] {
  if (outcome?.status !== 'invalid') return [];
  return outcome.issues.filter((issue) => issue.path === path).map((issue) => issue.message);
}

/** The conflict message when the engine named this rule's kind (or part) among the culprits. */
export function conflictFor(outcome: PreviewOutcome | null, part: string): string | null {
  return outcome?.status === 'conflict' && outcome.parts.includes(part) ? outcome.message : null;
}

/** Issues whose path names none of the fields the form shows beside an input. */
export function unplacedIssues(
  outcome: PreviewOutcome | null,
  placed: readonly string[],
): string[] {
  if (outcome?.status !== 'invalid') return [];
  return outcome.issues
    .filter(
      (issue) =>
        !placed.some(
          (path) =>
            issue.path === path ||
            issue.path.startsWith(`${path}.`) ||
            issue.path.startsWith(`${path}[`),
        ),
    )
    .map((issue) => issue.message);
}
