import { drillDifficulty } from '../difficulty';
import type { Drill, DrillBar } from '../drill';
import { rankOrderBreaks } from '../rules/tension';
import { checkDrillWith } from '../rules/checker';
import { ENGINE_VERSION } from '../version';
import { barOf } from './bars';
import type { Stuck } from './stages';
import { arrayOf } from '../arrays';

/** The drill's bars, each with its measured tension. */
export function barsOf(stuck: Stuck): DrillBar[] {
  const { grid, cells, gauge } = stuck;
  return arrayOf(grid.bars, (b) => {
    // Measured as made, in place: `tension` keeps its place among the bar's keys.
    const bar: { -readonly [K in keyof DrillBar]: DrillBar[K] } = barOf(grid, b, cells, 0);
    bar.tension = gauge.ofBar(bar);
    return bar;
  });
}

/** True when the bars keep the tension curve's rank order (or the card has no curve). */
export function keepsOrder(stuck: Stuck, bars: readonly DrillBar[]): boolean {
  return (
    !stuck.targets ||
    rankOrderBreaks(
      stuck.targets,
      bars.map((b) => b.tension),
    ).length === 0
  );
}

/**
 * Stage 7: the drill, with its reach, variety and difficulty, checked against every rule of the
 * card. A broken rule here is an engine bug, never the card's fault: it says so plainly.
 */
export function checked(stuck: Stuck, bars: readonly DrillBar[]): Drill {
  const { card, seed, gauge, reach, variety, grid, ob } = stuck;
  const tensionReach = { least: gauge.scale(reach.least), most: gauge.scale(reach.most) };
  const sketch = { engine: ENGINE_VERSION, seed, card, tensionReach, variety, bars };
  const difficulty = drillDifficulty(sketch);
  const drill: Drill = { ...sketch, difficulty };
  // `barsOf` measured each bar with this gauge, and the difficulty was just worked out from
  // these very bars: the check reads both instead of working them out again.
  const measured = (bar: DrillBar): number => bar.tension;
  const violations = checkDrillWith(card, drill, measured, { grid, ob, difficulty });
  if (violations.length > 0)
    throw new Error(`Engine self-check failed: ${violations.map((v) => v.message).join(' ')}`);
  return drill;
}
