import type { RuleCard } from '../schema';
import { isResolutionBar } from './avoid-downbeat';
import { phraseOf } from './phrase';

/**
 * 0-based bars where the groove lands and lets go: the resolution bars of every avoidDownbeat
 * rule that resolves (a cycle of at least two bars) and the first bar of every phrase (its
 * landing on one). Empty when every bar would be one: there is nothing to release from then.
 */
export function landingBars(card: RuleCard, bars: number): Set<number> {
  const out = new Set<number>();
  for (const rule of card.rules)
    if (rule.kind === 'avoidDownbeat' && rule.resolveEvery >= 2)
      for (let bar = 1; bar <= bars; bar++) if (isResolutionBar(rule, bar)) out.add(bar - 1);
  const phrase = phraseOf(card);
  if (phrase && phrase.rule.every >= 2)
    for (let bar = 0; bar < bars; bar += phrase.rule.every) out.add(bar);
  return out.size >= bars ? new Set() : out;
}
