/**
 * Runs the engine through its public API only (parseRuleCard, generateDrill, RuleConflictError)
 * and hands each drill to the oracle. Nothing is swallowed: a refusal is kept with the reasoner's
 * explanation (or its absence), any other error is kept as a crash, and each becomes a failing
 * test of its own.
 */
import { generateDrill, parseRuleCard, RuleConflictError } from '../../shared/generator/index';
import { readCard } from './card';
import { checkDrill, checkPreset, type CheckName, type DrillLike, type Violation } from './checks';
import { reasonAbout } from './feasibility';
import { planOf } from './plan';

export type Outcome =
  | {
      readonly kind: 'drill';
      readonly label?: string;
      readonly raw: unknown;
      readonly seed: string;
      readonly violations: readonly Violation[];
      /** Non-empty when the reasoner proves the card impossible (yet a drill came back). */
      readonly impossible: readonly string[];
    }
  | {
      readonly kind: 'refused';
      readonly label?: string;
      readonly raw: unknown;
      readonly seed: string;
      readonly message: string;
      readonly reasons: readonly string[];
    }
  | {
      readonly kind: 'invalid' | 'crashed';
      readonly label?: string;
      readonly raw: unknown;
      readonly seed: string;
      readonly message: string;
    };

/** `preset`: add the preset checks; `label`: how reports name the card (else its JSON). */
export interface RunOptions {
  readonly preset?: boolean;
  readonly label?: string;
}

export function runCard(raw: unknown, seed: string, options: RunOptions = {}): Outcome {
  let parsed: unknown;
  try {
    parsed = parseRuleCard(raw);
  } catch (error) {
    return {
      kind: 'invalid',
      label: options.label,
      raw,
      seed,
      message: String((error as Error).message ?? error),
    };
  }
  const plan = planOf(readCard(raw, parsed));
  let drill: DrillLike;
  try {
    drill = generateDrill(parsed as Parameters<typeof generateDrill>[0], seed) as DrillLike;
  } catch (error) {
    if (error instanceof RuleConflictError) {
      const { impossible, policy } = reasonAbout(plan);
      return {
        kind: 'refused',
        label: options.label,
        raw,
        seed,
        message: error.message,
        reasons: [...impossible, ...policy],
      };
    }
    return {
      kind: 'crashed',
      label: options.label,
      raw,
      seed,
      message: String((error as Error).stack ?? error),
    };
  }
  return checkStored(raw, drill, options);
}

/** Checks a drill already made (a golden file) against the card as written. */
export function checkStored(raw: unknown, drill: DrillLike, options: RunOptions = {}): Outcome {
  const plan = planOf(readCard(raw, drill.card));
  const violations = [
    ...checkDrill(plan, drill),
    ...(options.preset ? checkPreset(plan, drill) : []),
  ];
  const { impossible } = reasonAbout(plan);
  return { kind: 'drill', label: options.label, raw, seed: drill.seed, violations, impossible };
}

const cardText = (raw: unknown): string => JSON.stringify(raw);
const name = (o: Outcome): string => o.label ?? `card ${cardText(o.raw)}`;

/** A readable report of the outcomes that fail `check`: how many, and the smallest card. */
export function failuresOf(outcomes: readonly Outcome[], check: CheckName): string | null {
  const failing = outcomes.flatMap((o) =>
    o.kind === 'drill' && o.violations.some((v) => v.check === check)
      ? [{ o, messages: o.violations.filter((v) => v.check === check).map((v) => v.message) }]
      : [],
  );
  if (failing.length === 0) return null;
  failing.sort((a, b) => cardText(a.o.raw).length - cardText(b.o.raw).length);
  const { o, messages } = failing[0]!;
  return [
    `${check}: ${failing.length} of ${outcomes.filter((x) => x.kind === 'drill').length} drills fail.`,
    `Smallest example: seed ${JSON.stringify(o.seed)}, ${name(o)}`,
    ...messages.slice(0, 4).map((m) => `  - ${m}`),
    ...(messages.length > 4 ? [`  … and ${messages.length - 4} more in this drill`] : []),
  ].join('\n');
}

/** A readable report of the outcomes of one kind (refusals the reasoner cannot explain, …). */
export function report(outcomes: readonly Outcome[], title: string): string | null {
  if (outcomes.length === 0) return null;
  const sorted = [...outcomes].sort((a, b) => cardText(a.raw).length - cardText(b.raw).length);
  return [
    `${title}: ${outcomes.length}.`,
    ...sorted.slice(0, 3).map((o) => {
      const detail =
        o.kind === 'drill'
          ? `the reasoner says: ${o.impossible.join('; ')}`
          : `engine: ${o.message.split('\n').slice(0, 3).join(' ')}`;
      return `- seed ${JSON.stringify(o.seed)}, ${name(o)}\n  ${detail}`;
    }),
  ].join('\n');
}
