import type { VoiceId } from './drill';
import type { Grid } from './grid';
import type { WorkHit } from './hands';
import { planAvoidDownbeat } from './rules/avoid-downbeat';
import { placeBackbeat } from './rules/backbeat';
import { placeEuclid } from './rules/euclid';
import { placeOstinato } from './rules/ostinato';
import { SOURCE_RANK, type Placement } from './rules/placement';
import { placePolyrhythm } from './rules/polyrhythm';
import type { RuleCard } from './schema';

/** Everything the card's rules demand before any fill is chosen. */
export interface Obligations {
  /** Every requested hit, in precedence order (ostinato first, then by rule kind and index). */
  readonly placements: readonly Placement[];
  /** Per instant: the merged obligatory hits (one per voice, the first part in precedence wins). */
  readonly cells: WorkHit[][];
  /** Per voice: instants where an avoidDownbeat rule keeps it silent, with that rule's index. */
  readonly avoided: ReadonlyMap<VoiceId, ReadonlyMap<number, number>>;
}

/** Places every obligatory hit of the card and merges them by the contract's precedence. */
export function collectObligations(card: RuleCard, grid: Grid): Obligations {
  const placements: Placement[] = placeOstinato(card, grid);
  const avoided = new Map<VoiceId, Map<number, number>>();
  card.rules.forEach((rule, index) => {
    switch (rule.kind) {
      case 'backbeat':
        placements.push(...placeBackbeat(rule, index, grid));
        break;
      case 'avoidDownbeat': {
        const plan = planAvoidDownbeat(rule, index, grid);
        placements.push(...plan.placements);
        const forVoice = avoided.get(rule.voice) ?? new Map<number, number>();
        for (const instant of plan.avoided)
          if (!forVoice.has(instant)) forVoice.set(instant, index);
        avoided.set(rule.voice, forVoice);
        break;
      }
      case 'polyrhythm':
        placements.push(...placePolyrhythm(rule, index, grid));
        break;
      case 'euclid':
        placements.push(...placeEuclid(rule, index, grid));
        break;
      default:
        break;
    }
  });
  // Stable sort: precedence by source, then the card's rule order.
  placements.sort((a, b) => SOURCE_RANK[a.source] - SOURCE_RANK[b.source] || a.rule - b.rule);
  const cells: WorkHit[][] = Array.from({ length: grid.instants }, () => []);
  for (const p of placements) {
    const cell = cells[p.instant];
    if (!cell || cell.some((hit) => hit.voice === p.voice)) continue;
    cell.push({ voice: p.voice, source: p.source, dynamic: p.dynamic, rule: p.rule, hand: null });
  }
  return { placements, cells, avoided };
}
