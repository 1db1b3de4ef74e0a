import { canonicalCard } from './canonical';
import { assertNoObligationConflicts } from './conflicts';
import { type Drill, type DrillBar, type DrillHit } from './drill';
import { RuleConflictError } from './errors';
import { createFillContext, type BarFill, type FillContext } from './fill';
import { beatsOf, createGrid, type Grid } from './grid';
import { assignHandsRepairing, type WorkHit } from './hands';
import { createTensionGauge, type TensionGauge } from './tension-gauge';
import { assertTensionReachable, cardReach, giveUp } from './tension-reach';
import { collectObligations, type Obligations } from './obligations';
import { createRng, type Rng } from './random';
import { checkDrillWith } from './rules/checker';
import { embellishmentDynamics, embellishmentVoices, fillHolesOwners } from './rules/fill-holes';
import { rankOrderBreaks, tensionTargets } from './rules/tension';
import type { RuleCard } from './schema';
import { chooseFills, SEARCH_WORK_BUDGET, type SearchBudget } from './select';
import { ENGINE_VERSION } from './version';
import { drillDifficulty } from './difficulty';

/**
 * Generates the drill for a card and a seed: obligations first (ostinato, backbeat,
 * avoidDownbeat, polyrhythm, euclid), then fill by seeded weighted choice, a bounded search for
 * the tension curve's rank order, hand assignment, and a final check against every rule.
 * Deterministic: the same card, seed and ENGINE_VERSION give byte-identical JSON. Throws a
 * RuleConflictError naming the rules when they cannot all hold.
 */
export function generateDrill(input: RuleCard, seed: string): Drill {
  const card = canonicalCard(input);
  const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  const ob = collectObligations(card, grid);
  assertNoObligationConflicts(card, grid, ob);
  const rng = createRng(seed);
  const gauge = createTensionGauge(grid.beats, card.measure, card.meter.grouping);
  const ctx = createFillContext(card, grid, ob);
  const reach = cardReach(ctx, gauge);
  const bars = fillAndStick(ctx, rng, gauge, reach);
  const tensionReach = { least: gauge.scale(reach.least), most: gauge.scale(reach.most) };
  const variety: Drill['variety'] = allowsOneDrill(ctx) ? 'single' : 'many';
  const sketch = { engine: ENGINE_VERSION, seed, card, tensionReach, variety, bars };
  const drill: Drill = { ...sketch, difficulty: drillDifficulty(sketch) };
  const violations = checkDrillWith(card, drill, gauge.ofBar, { grid, ob });
  if (violations.length > 0) {
    // Reaching this is an engine bug, not a card problem: say so plainly.
    throw new Error(`Engine self-check failed: ${violations.map((v) => v.message).join(' ')}`);
  }
  return drill;
}

/**
 * True when every seed gives the same drill: no bar has a fill to choose (the density rounds to
 * nothing, or to every free slot with one voice each) and nothing else is drawn (no tension
 * search, no ghost/accent shares to arrange).
 */
function allowsOneDrill(ctx: FillContext): boolean {
  const { card, grid } = ctx;
  if (card.rules.some((r) => r.kind === 'tension')) return false;
  if (card.rules.some((r) => r.kind === 'fillHoles' && r.ghost > 0 && r.ghost + r.accent < 1))
    return false;
  for (let bar = 0; bar < grid.bars; bar++) {
    const options = (ctx.options[bar] ?? []).filter((voices) => voices.length > 0);
    const count = Math.round(card.density * options.length);
    if (count === 0) continue;
    if (count < options.length || options.some((voices) => voices.length > 1)) return false;
  }
  return true;
}

function fillAndStick(
  ctx: FillContext,
  rng: Rng,
  gauge: TensionGauge,
  reach: { least: number; most: number },
): DrillBar[] {
  const { card, grid, ob } = ctx;
  const targets = tensionTargets(card, grid.bars);
  if (targets) assertTensionReachable(ctx, targets, gauge);
  // A target reads on what this card can reach: 0 its calmest bar, 1 its tensest.
  const goals =
    targets?.map((t) => gauge.unitsOfRaw(reach.least + t * (reach.most - reach.least))) ?? null;
  const budget: SearchBudget = { left: SEARCH_WORK_BUDGET };
  // Fresh fills are tried, while the work budget lasts, when removing strokes the hands cannot
  // play breaks the tension order.
  for (;;) {
    const cells = mergeCells(grid, ob, chooseFills(ctx, rng, targets, gauge, budget, goals));
    repairHands(card, grid, cells);
    markEmbellishments(card, cells, rng);
    const bars = buildBars(grid, cells, gauge);
    const tensions = bars.map((b) => b.tension);
    if (!targets || rankOrderBreaks(targets, tensions).length === 0) return bars;
    // A spent search budget would only repeat the failed attempt's luck at full cost.
    if (budget.left <= 0) break;
  }
  // The hands dropped strokes the search had counted on: impossible only if the exact proof says so.
  return giveUp(ctx, targets, gauge);
}

function mergeCells(grid: Grid, ob: Obligations, fills: readonly BarFill[]): WorkHit[][] {
  const cells = ob.cells.map((cell) => cell.map((hit) => ({ ...hit })));
  for (const f of fills) {
    for (const hit of f.fills) {
      cells[f.bar * grid.slotsPerBar + hit.i]?.push({
        voice: hit.voice,
        source: 'fill',
        dynamic: 'normal',
        rule: -2,
        hand: null,
      });
    }
  }
  return cells;
}

/**
 * Assigns hands; where the limbs cannot keep up, the sticking stage removes fill strokes (see
 * `assignHandsRepairing`). Obligations alone are known to be playable, so this ends.
 */
function repairHands(card: RuleCard, grid: Grid, cells: WorkHit[][]): void {
  if (assignHandsRepairing(card, grid, cells)) {
    throw new RuleConflictError('Two hands cannot play these rules at this tempo: slow it down.', [
      'hands',
    ]);
  }
}

/**
 * Marks each fillHoles rule's share of its embellishments ghost or accent, in time order; other
 * embellishment voices play ghost notes, anchors at normal strength.
 */
function markEmbellishments(card: RuleCard, cells: WorkHit[][], rng: Rng): void {
  const owners = fillHolesOwners(card);
  const embellishing = embellishmentVoices(card);
  for (const cell of cells)
    for (const hit of cell)
      if (hit.source === 'fill' && embellishing.has(hit.voice) && !owners.has(hit.voice))
        hit.dynamic = 'ghost';
  card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles') return;
    const mine = cells.flatMap((cell) =>
      cell.filter((hit) => hit.source === 'fill' && owners.get(hit.voice) === index),
    );
    const dynamics = embellishmentDynamics(rule, mine.length, rng);
    mine.forEach((hit, k) => {
      hit.dynamic = dynamics[k] ?? 'normal';
    });
  });
}

const byVoice = (a: WorkHit, b: WorkHit): number =>
  a.voice < b.voice ? -1 : a.voice > b.voice ? 1 : 0;

function buildBars(grid: Grid, cells: readonly WorkHit[][], gauge: TensionGauge): DrillBar[] {
  const bars: DrillBar[] = [];
  for (let bar = 0; bar < grid.bars; bar++) {
    const hits: DrillHit[] = [];
    for (let i = 0; i < grid.slotsPerBar; i++) {
      const cell = cells[bar * grid.slotsPerBar + i] ?? [];
      const beat = (grid.beatOf[i] ?? 0) + 1;
      const slot = grid.slotOf[i] ?? 0;
      for (const hit of cell.length > 1 ? cell.slice().sort(byVoice) : cell) {
        hits.push({
          beat,
          slot,
          voice: hit.voice,
          dynamic: hit.dynamic,
          hand: hit.hand,
          source: hit.source,
        });
      }
    }
    const sketch: DrillBar = { bar: bar + 1, beats: grid.beats.slice(), tension: 0, hits };
    const tension = gauge.ofBar(sketch);
    bars.push({ bar: sketch.bar, beats: sketch.beats, tension, hits });
  }
  return bars;
}
