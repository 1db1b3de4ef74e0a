import type { z } from 'zod';
import { canonicalCard } from './canonical';
import { checkCardConsistency } from './card-checks';
import { RuleCardError, type RuleCardIssue } from './errors';
import { RawRuleCardSchema, type RuleCard } from './schema';
import { knownFields, unknownFieldMessage } from './unknown-fields';

/**
 * Validates a rule card (zod), fills its defaults and checks the fields that depend on each
 * other. Throws a RuleCardError whose message names each bad field and its allowed range.
 */
export function parseRuleCard(input: unknown): RuleCard {
  const parsed = RawRuleCardSchema.safeParse(input);
  if (!parsed.success) {
    throw new RuleCardError(
      'invalid_card',
      parsed.error.issues.flatMap((issue) => toIssues(issue, input)),
    );
  }
  const card = canonicalCard(parsed.data);
  const issues = checkCardConsistency(card);
  if (issues.length > 0) throw new RuleCardError('inconsistent_card', issues);
  return card;
}

/** Field path as a teacher might read it in a JSON editor: `rules[1].shift`. */
export function formatPath(path: readonly PropertyKey[]): string {
  return path
    .map((key, i) =>
      typeof key === 'number' ? `[${key}]` : i === 0 ? String(key) : `.${String(key)}`,
    )
    .join('');
}

function toIssues(issue: z.core.$ZodIssue, input: unknown): RuleCardIssue[] {
  if (issue.code !== 'unrecognized_keys') return [toIssue(issue.path, issue.message, input)];
  const [top, index] = issue.path;
  const kind = top === 'rules' && typeof index === 'number' ? ruleKindAt(input, index) : null;
  const known = knownFields(issue.path, kind);
  return issue.keys.map((key) =>
    toIssue([...issue.path, key], unknownFieldMessage(key, known), input),
  );
}

function toIssue(at: readonly PropertyKey[], message: string, input: unknown): RuleCardIssue {
  const path = formatPath(at);
  const [top, index] = at;
  if (top === 'rules' && typeof index === 'number') {
    const kind = ruleKindAt(input, index);
    return { path, message: `Rule ${index + 1}${kind ? ` (${kind})` : ''}: ${message}` };
  }
  return { path, message };
}

function ruleKindAt(input: unknown, index: number): string | null {
  if (typeof input !== 'object' || input === null) return null;
  const rules = (input as { rules?: unknown }).rules;
  if (!Array.isArray(rules)) return null;
  const rule: unknown = rules[index];
  if (typeof rule !== 'object' || rule === null) return null;
  const kind = (rule as { kind?: unknown }).kind;
  return typeof kind === 'string' ? kind : null;
}
