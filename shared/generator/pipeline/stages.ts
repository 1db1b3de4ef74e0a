import type { BarFill, FillContext } from '../fill';
import type { Grid } from '../grid';
import type { WorkHit } from '../hands';
import type { KeptBars } from '../keep';
import type { Obligations } from '../obligations';
import type { Rng } from '../random';
import type { RuleCard } from '../schema';
import type { SearchBudget } from '../select';
import type { TensionGauge } from '../tension-gauge';

/**
 * The plain data that passes from one stage of `generateDrill` to the next. Each stage reads
 * only what the stage before produced and adds its own part:
 *
 *   card → framed (grid, grouping, measure) → placed (time layers, anchors, rule placements)
 *   → proven (conflicts ruled out, kept bars read, the fill's room, the tension goals)
 *   → drawn (fills) → shaped (tension) → stuck (sticking, dynamics) → the checked drill.
 */

/** The normalised card on its grid, with its grouping's tension measure built once. */
export interface Framed {
  readonly card: RuleCard;
  readonly seed: string;
  readonly grid: Grid;
  readonly gauge: TensionGauge;
}

/** Every hit the card obliges: time layers, rule placements, phrase fills, anchors. */
export interface Placed extends Framed {
  readonly ob: Obligations;
}

/** No conflict among the card's rules (proved), the kept bars, and what is left to choose. */
export interface Proven extends Placed {
  readonly kept: KeptBars;
  /** The fill's room on the card alone: its reach and variety are the card's. */
  readonly room: FillContext;
  /** The fill's room around the kept bars (the same as `room` when none are kept). */
  readonly free: FillContext;
  /** The least and greatest raw tension any bar of the card can reach. */
  readonly reach: { readonly least: number; readonly most: number };
  readonly targets: readonly number[] | null;
  /** Each bar's target on the card's reach, in measure units (null without a tension rule). */
  readonly goals: readonly number[] | null;
  readonly variety: 'single' | 'many';
}

/** One attempt's seeded draws and work budget, shared by the drawing, shaping and sticking. */
export interface Attempt {
  readonly rng: Rng;
  readonly budget: SearchBudget;
}

/** The first fill of every bar. */
export interface Drawn extends Proven {
  readonly drawn: readonly BarFill[];
}

/** One fill per bar whose tensions follow the curve. */
export interface Shaped extends Proven {
  readonly fills: readonly BarFill[];
}

/** Every hit of the drill, per instant, with its hand and dynamic. */
export interface Stuck extends Proven {
  readonly cells: readonly (readonly WorkHit[])[];
}
