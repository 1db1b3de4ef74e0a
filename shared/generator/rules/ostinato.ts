import type { Grid } from '../grid';
import type { RuleCard } from '../schema';
import type { Placement } from './placement';

/** The ostinato's hits: its voice on the same slots of every beat of every bar. */
export function placeOstinato(card: RuleCard, grid: Grid): Placement[] {
  const ostinato = card.ostinato;
  if (!ostinato) return [];
  const out: Placement[] = [];
  for (let instant = 0; instant < grid.instants; instant++) {
    if (ostinatoPlaysAt(card, grid, instant)) {
      out.push({
        instant,
        voice: ostinato.voice,
        source: 'ostinato',
        dynamic: ostinato.dynamic,
        rule: -1,
      });
    }
  }
  return out;
}

/** True where the ostinato plays; everywhere else is a hole. */
export function ostinatoPlaysAt(card: RuleCard, grid: Grid, instant: number): boolean {
  if (!card.ostinato) return false;
  const slot = grid.slotOf[instant % grid.slotsPerBar] ?? 0;
  return card.ostinato.slots.includes(slot);
}
