import { giveUp } from './tension-reach';
import {
  emptyFill,
  fillCount,
  initialFill,
  LANDING_LEAN,
  variantOf,
  withOneMore,
  type BarFill,
  type FillContext,
} from './fill';
import type { TensionGauge } from './tension-gauge';
import type { Rng } from './random';
import { tensionLevels } from './rules/tension';
import { arrayOf } from './arrays';

/** Rounds of neighbour search after which the closest order found so far is kept. */
const MAX_ROUNDS = 64;

/** Rounds spent aiming closer to the targets once an order is found. */
const AIM_ROUNDS = 24;

/**
 * Work the tension search may spend on one drill, in slots of measured candidate bars (a
 * candidate costs about one unit per slot to build and measure). Rounds alone cost more on long
 * bars of fine grids; this keeps the worst refusal to tens of milliseconds. It is about 1.7
 * times the most any successful drill used in a sample of 1 900 random cards of up to 64 bars,
 * so it only ends searches that were failing. Counted in work, not clock time, so the result
 * stays deterministic.
 */
export const SEARCH_WORK_BUDGET = 262_144;

/** What is left of the search's work budget; shared by the attempts of one drill. */
export interface SearchBudget {
  left: number;
}

interface Candidate {
  readonly fill: BarFill;
  readonly units: number;
}

/**
 * The first fill of every bar: `density` of its free slots, by seeded weighted draws. Without a
 * tension curve, `landings` (0-based bars) are drawn as calm bars: a quarter of the notes,
 * leaning on the beat, so the groove lets go where it lands; a curve, when the card has one,
 * decides every bar instead.
 */
export function drawFills(
  ctx: FillContext,
  rng: Rng,
  targets: readonly number[] | null,
  landings: ReadonlySet<number> = new Set(),
): BarFill[] {
  return arrayOf(ctx.grid.bars, (bar) =>
    targets
      ? initialFill(ctx, bar, rng, targets[bar] ?? 0.5, targets[bar] ?? 0.5)
      : landings.has(bar)
        ? // A landing releases: few fill notes, on the strong positions (common practice).
          initialFill(ctx, bar, rng, LANDING_LEAN, 0, true)
        : initialFill(ctx, bar, rng, 0.5),
  );
}

/**
 * With a tension rule, searches neighbouring fills of `base` (moves, additions, removals) for
 * one fill per bar that keeps the curve's rank order and comes as close as it can to each bar's
 * goal (the target placed on the card's reachable range, in measure units); without one, the
 * base fills stand. Bounded by its work budget only; when the budget runs out before any order
 * was found it throws a SearchExhaustedError, which says the search gave up, never that the
 * card is wrong (impossible cards are refused earlier, by proof).
 */
export function shapeTension(
  ctx: FillContext,
  base: BarFill[],
  rng: Rng,
  targets: readonly number[] | null,
  gauge: TensionGauge,
  budget: SearchBudget,
  goals: readonly number[] | null,
): BarFill[] {
  const lean = (bar: number): number => (targets ? (targets[bar] ?? 0.5) : 0.5);
  if (!targets || !goals) return base;
  const levels = tensionLevels(targets);
  const meter = candidateMeter(ctx, gauge);
  const measure = (fill: BarFill): Candidate => {
    budget.left -= ctx.grid.slotsPerBar;
    return meter(fill);
  };
  // Of fills alike in tension, each bar keeps the one nearest its share of notes.
  const want = targets.map((target, bar) => fillCount(ctx, bar, target));
  const keep = (bar: number, c: Candidate): void =>
    keepNew(candidates[bar] ?? [], c, want[bar] ?? 0);
  // The bare bar (obligations only) is always playable: every search starts with a way down.
  const candidates: Candidate[][] = base.map((fill) => [measure(fill)]);
  candidates.forEach((_, bar) => keep(bar, measure(emptyFill(ctx, bar))));
  let best: { picks: number[]; miss: number } | null = null;
  let found = -1;
  for (let round = 0; ; round++) {
    const picks = pickInOrder(levels, candidates, goals);
    if (picks) {
      const miss = missOf(picks, candidates, goals);
      if (!best || miss < best.miss) best = { picks, miss };
      if (found < 0) found = round;
      const aimed = round - found >= AIM_ROUNDS;
      if (miss <= goalTolerance(goals.length) || aimed || round >= MAX_ROUNDS) break;
    } else if (round >= MAX_ROUNDS && best) {
      break;
    }
    if (budget.left <= 0) break;
    const moves = picks ? aims(picks, candidates, goals) : blockers(levels, candidates);
    if (moves.size === 0) break;
    for (const [bar, direction] of moves) {
      const cands = candidates[bar];
      if (!cands) continue;
      const from = picks ? (cands[picks[bar] ?? 0] as Candidate).fill : extreme(cands, direction);
      keep(bar, measure(variantOf(ctx, from, rng, direction > 0 ? 1 : 0)));
      const any = cands[rng.int(cands.length)] ?? (cands[0] as Candidate);
      keep(bar, measure(variantOf(ctx, any.fill, rng, lean(bar))));
    }
  }
  if (!best) giveUp(ctx, targets, gauge);
  const picks = best.picks.slice();
  busierPeaks(ctx, levels, candidates, picks, goals, (bar, from) => {
    if (budget.left <= 0) return null;
    const c = measure(withOneMore(ctx, from, rng, lean(bar)));
    keep(bar, c);
    return c.fill.fills.length > from.fills.length ? c.fill : null;
  });
  return picks.map((k, bar) => (candidates[bar]?.[k] as Candidate).fill);
}

/** Variants tried per peak bar for one busier than the calmest bars. */
const BUSIER_TRIES = 8;

/**
 * The curve is heard as notes too (common practice): on the Longuet-Higgins & Lee measure the
 * tensest bars are often the sparsest, so a peak bar may end up with no more notes than the
 * release. Each bar of the top level that plays no more notes (besides the time) than the
 * busiest bar of the bottom level, or fewer than the busiest bar of any level below it (the
 * build), takes instead the candidate nearest its goal, above the level below it, that does; when none is known, notes are added to its pick one at a time
 * (up to 8, within the work budget) and each fill so far is weighed.
 * The rank order stays as it was.
 */
function busierPeaks(
  ctx: FillContext,
  levels: readonly number[][],
  candidates: readonly Candidate[][],
  picks: number[],
  goals: readonly number[],
  vary: (bar: number, from: BarFill) => BarFill | null,
): void {
  if (levels.length < 2) return;
  const { grid, ob } = ctx;
  const fixed = arrayOf(grid.bars, (bar) => {
    let n = 0;
    for (let i = 0; i < grid.slotsPerBar; i++)
      for (const hit of ob.cells[bar * grid.slotsPerBar + i] ?? [])
        if (hit.source !== 'ostinato') n++;
    return n;
  });
  const notes = (bar: number, c: Candidate): number => (fixed[bar] ?? 0) + c.fill.fills.length;
  const picked = (bar: number): Candidate => candidates[bar]?.[picks[bar] ?? 0] as Candidate;
  const calmest = Math.max(...(levels[0] ?? []).map((bar) => notes(bar, picked(bar))));
  // The peak does not thin out after the build: as many notes as the busiest bar below it.
  const busiest = Math.max(
    ...levels.slice(0, -1).flatMap((level) => level.map((bar) => notes(bar, picked(bar)))),
  );
  const enough = (bar: number, c: Candidate): boolean =>
    notes(bar, c) > calmest && notes(bar, c) >= busiest;
  const floor = Math.max(...(levels[levels.length - 2] ?? []).map((bar) => picked(bar).units));
  for (const bar of levels[levels.length - 1] ?? []) {
    const cands = candidates[bar] ?? [];
    const choose = (): number => {
      let pick = -1;
      cands.forEach((c, k) => {
        if (c.units <= floor || !enough(bar, c)) return;
        const off = Math.abs(c.units - (goals[bar] ?? 0));
        if (pick < 0 || off < Math.abs((cands[pick] as Candidate).units - (goals[bar] ?? 0)))
          pick = k;
      });
      return pick;
    };
    if (enough(bar, picked(bar))) continue;
    let pick = choose();
    // Notes added one at a time to the pick, until one of the fills so far will do.
    let from: BarFill | null = (cands[picks[bar] ?? 0] as Candidate).fill;
    for (let t = 0; pick < 0 && from && t < BUSIER_TRIES; t++) {
      from = vary(bar, from);
      pick = choose();
    }
    if (pick >= 0) picks[bar] = pick;
  }
}

/**
 * Sum of the picked bars' distances from their goals, in measure units; the search stops once
 * the bars are on average within a few hundredths of their goals.
 */
function missOf(
  picks: readonly number[],
  candidates: readonly Candidate[][],
  goals: readonly number[],
): number {
  let miss = 0;
  picks.forEach((k, bar) => {
    miss += Math.abs((candidates[bar]?.[k]?.units ?? 0) - (goals[bar] ?? 0));
  });
  return miss;
}

const goalTolerance = (bars: number): number => bars * GOAL_UNITS;

/** How far a bar may sit from its goal, in ten-thousandths (0.04), before the search aims it. */
const GOAL_UNITS = 400;

/** Bars whose pick is off its goal by more than the tolerance, and the way they should move. */
function aims(
  picks: readonly number[],
  candidates: readonly Candidate[][],
  goals: readonly number[],
): Map<number, 1 | -1> {
  const moves = new Map<number, 1 | -1>();
  picks.forEach((k, bar) => {
    const off = (candidates[bar]?.[k]?.units ?? 0) - (goals[bar] ?? 0);
    if (Math.abs(off) > GOAL_UNITS) moves.set(bar, off < 0 ? 1 : -1);
  });
  return moves;
}

/** Measures a candidate fill: its bar's obligations plus the fill, on the card's measure. */
function candidateMeter(ctx: FillContext, gauge: TensionGauge): (fill: BarFill) => Candidate {
  const { grid, ob } = ctx;
  if (gauge.measure !== 'lhl') {
    const fixed = arrayOf(grid.bars, (bar) =>
      arrayOf(grid.slotsPerBar, (i) =>
        (ob.cells[bar * grid.slotsPerBar + i] ?? []).map((hit) => ({
          voice: hit.voice,
          time: hit.source === 'ostinato',
        })),
      ),
    );
    return (fill) => {
      const voices = (fixed[fill.bar] ?? []).map((at) => at.slice());
      for (const hit of fill.fills) voices[hit.i]?.push({ voice: hit.voice, time: false });
      return { fill, units: gauge.unitsOfVoices(voices) };
    };
  }
  const fixed = arrayOf(grid.bars, (bar) =>
    arrayOf(grid.slotsPerBar, (i) =>
      (ob.cells[bar * grid.slotsPerBar + i] ?? []).some((hit) => hit.source !== 'ostinato'),
    ),
  );
  // Thousands of candidates on big cards: mark the fill on the bar's own onsets, measure, and
  // put the obligatory onsets back, rather than copy the bar per candidate.
  const scratch = fixed.map((onsets) => onsets.slice());
  return (fill) => {
    const base = fixed[fill.bar] ?? [];
    const onsets = scratch[fill.bar] ?? [];
    for (const hit of fill.fills) onsets[hit.i] = true;
    const units = gauge.unitsOfRaw(gauge.rawOfOnsets(onsets));
    for (const hit of fill.fills) onsets[hit.i] = base[hit.i] === true;
    return { fill, units };
  };
}

/**
 * One fill per tension value is enough for the order; of two alike, the one whose number of
 * notes is nearer `want` stays (the first on ties).
 */
function keepNew(cands: Candidate[], c: Candidate, want: number): void {
  const k = cands.findIndex((other) => other.units === c.units);
  if (k < 0) cands.push(c);
  else {
    const had = cands[k] as Candidate;
    if (Math.abs(c.fill.fills.length - want) < Math.abs(had.fill.fills.length - want)) cands[k] = c;
  }
}

/**
 * Bars that stop the rank order, with the way they should move. Levels are scanned from the
 * calmest, every bar taking its least tense candidate above the level below (the pick that
 * leaves most room above, so the scan fails exactly when no order exists). A bar with nothing
 * above that floor should rise (+1); the bars that set the floors under it should fall (-1).
 */
function blockers(
  levels: readonly number[][],
  candidates: readonly Candidate[][],
): Map<number, 1 | -1> {
  const moves = new Map<number, 1 | -1>();
  let floor = Number.NEGATIVE_INFINITY;
  const chain: number[] = []; // the bar that set the floor, level by level
  for (const level of levels) {
    let top = floor;
    let topBar = -1;
    for (const bar of level) {
      let pick = Number.POSITIVE_INFINITY;
      let most = Number.NEGATIVE_INFINITY;
      for (const c of candidates[bar] ?? []) {
        if (c.units > floor && c.units < pick) pick = c.units;
        if (c.units > most) most = c.units;
      }
      if (!Number.isFinite(pick)) {
        moves.set(bar, 1);
        for (const below of chain) if (!moves.has(below)) moves.set(below, -1);
        pick = Math.max(floor + 1, most);
      }
      if (topBar < 0 || pick > top) {
        top = pick;
        topBar = bar;
      }
    }
    floor = top;
    chain.push(topBar);
  }
  return moves;
}

/** The least (-1) or most (+1) tense candidate. */
function extreme(cands: readonly Candidate[], sign: 1 | -1): BarFill {
  let best = cands[0] as Candidate;
  for (const c of cands) if (sign * (c.units - best.units) > 0) best = c;
  return best.fill;
}

/**
 * One candidate per bar such that every bar of a lower level measures strictly below every bar
 * of the next level, each as close to its target as that allows; null if none exists. Exact for
 * the given candidates: a backward pass finds how high each level may go and still leave room
 * above it, the forward pass then picks within those caps.
 */
function pickInOrder(
  levels: readonly number[][],
  candidates: readonly Candidate[][],
  goals: readonly number[],
): number[] | null {
  const caps: number[] = new Array<number>(levels.length).fill(Number.POSITIVE_INFINITY);
  for (let k = levels.length - 2; k >= 0; k--) {
    let room = Number.POSITIVE_INFINITY;
    for (const bar of levels[k + 1] ?? []) {
      let best = Number.NEGATIVE_INFINITY;
      for (const c of candidates[bar] ?? [])
        if (c.units <= (caps[k + 1] ?? 0) && c.units > best) best = c.units;
      room = Math.min(room, best);
    }
    if (!Number.isFinite(room)) return null;
    caps[k] = room - 1;
  }
  const picks: number[] = new Array<number>(goals.length).fill(0);
  let floor = Number.NEGATIVE_INFINITY;
  for (let k = 0; k < levels.length; k++) {
    let top = Number.NEGATIVE_INFINITY;
    for (const bar of levels[k] ?? []) {
      const goal = goals[bar] ?? 0;
      let pick = -1;
      let pickDistance = Number.POSITIVE_INFINITY;
      (candidates[bar] ?? []).forEach((c, index) => {
        if (c.units <= floor || c.units > (caps[k] ?? 0)) return;
        const distance = Math.abs(c.units - goal);
        if (distance < pickDistance) {
          pick = index;
          pickDistance = distance;
        }
      });
      if (pick < 0) return null;
      picks[bar] = pick;
      top = Math.max(top, candidates[bar]?.[pick]?.units ?? 0);
    }
    floor = top;
  }
  return picks;
}
