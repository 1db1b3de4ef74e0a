import { canonicalCard } from '../canonical';
import { beatsOf, createGrid } from '../grid';
import type { RuleCard } from '../schema';
import { createTensionGauge } from '../tension-gauge';
import type { Framed } from './stages';

/** Stage 1: the card normalised, its grid (slots per beat, ticks) and its tension measure. */
export function frame(input: RuleCard, seed: string): Framed {
  const card = canonicalCard(input);
  const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  const gauge = createTensionGauge(grid.beats, card.measure, card.meter.grouping);
  return { card, seed, grid, gauge };
}
