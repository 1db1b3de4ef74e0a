import { RuleCardListItem } from '../ui/rule-card-list';
import { meterLabel, subdivisionLabel } from './card-labels';
import { BuiltInCard } from './rule-cards-api';
import { freshSeedWord } from './seed-word';

/** Built-in cards as list items, each linking to `/drills/:id?seed=<fresh seed word>`. */
export function builtInCardItems(
  cards: readonly BuiltInCard[],
  seedWord: () => string = freshSeedWord,
): readonly RuleCardListItem[] {
  return cards.map((card) => ({
    id: card.id,
    title: card.title,
    summary: card.summary,
    meter: meterLabel(card.meter),
    subdivision: subdivisionLabel(card.subdivision, card.meter),
    link: { path: ['/drills', card.id], queryParams: { seed: seedWord() } },
  }));
}
