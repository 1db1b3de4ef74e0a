import type { RuleCard } from '../schema';

/**
 * The tension target of each bar (the curve repeated cyclically), or null when the card has no
 * tension rule. Several tension rules: the first one counts (parseRuleCard refuses a second).
 */
export function tensionTargets(card: RuleCard, bars: number): number[] | null {
  const rule = card.rules.find((r) => r.kind === 'tension');
  if (!rule || rule.kind !== 'tension') return null;
  const targets: number[] = [];
  for (let i = 0; i < bars; i++) targets.push(rule.curve[i % rule.curve.length] ?? 0);
  return targets;
}

/** Bars (0-based) grouped by equal target, from the lowest target to the highest. */
export function tensionLevels(targets: readonly number[]): number[][] {
  const values: number[] = [];
  for (const t of targets) if (!values.includes(t)) values.push(t);
  values.sort((a, b) => a - b);
  const levels: number[][] = values.map(() => []);
  targets.forEach((t, bar) => levels[values.indexOf(t)]?.push(bar));
  return levels;
}

/**
 * Pairs of bars (0-based, lower target first) whose measured tensions break the curve's rank
 * order: a bar with a lower target must measure strictly less tense. Equal targets are free.
 */
export function rankOrderBreaks(
  targets: readonly number[],
  measured: readonly number[],
): [number, number][] {
  const breaks: [number, number][] = [];
  const levels = tensionLevels(targets);
  for (let k = 0; k + 1 < levels.length; k++) {
    const lower = levels[k] ?? [];
    const upper = levels[k + 1] ?? [];
    for (const a of lower) {
      for (const b of upper) if ((measured[a] ?? 0) >= (measured[b] ?? 0)) breaks.push([a, b]);
    }
  }
  return breaks;
}
