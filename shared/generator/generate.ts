import { canonicalCard } from './canonical';
import { assertNoObligationConflicts } from './conflicts';
import { type Drill, type DrillBar, type DrillHit } from './drill';
import { RuleCardError, RuleConflictError } from './errors';
import { createFillContext, type BarFill, type FillContext } from './fill';
import { beatsOf, createGrid, positionOf, type Grid } from './grid';
import { readKeptBars, withKeptBars, type GenerateOptions, type KeptBars } from './keep';
import { fitShares, keptShares, sharesConflict } from './kept-shares';
import { assignHandsRepairing, type WorkHit } from './hands';
import { createTensionGauge, type TensionGauge } from './tension-gauge';
import { assertTensionReachable, cardReach, giveUp } from './tension-reach';
import { collectObligations, type Obligations } from './obligations';
import { createRng, type Rng } from './random';
import { checkBarsAlone, checkDrillWith, type Violation } from './rules/checker';
import { embellishmentDynamics, embellishmentVoices, fillHolesOwners } from './rules/fill-holes';
import { rankOrderBreaks, tensionTargets } from './rules/tension';
import type { RuleCard } from './schema';
import { chooseFills, SEARCH_WORK_BUDGET, type SearchBudget } from './select';
import { ENGINE_VERSION } from './version';
import { drillDifficulty } from './difficulty';
import { listWords, voiceWord } from './words';

/**
 * Generates the drill for a card and a seed: obligations first (ostinato, backbeat,
 * avoidDownbeat, polyrhythm, euclid), then fill by seeded weighted choice, a bounded search for
 * the tension curve's rank order, hand assignment, and a final check against every rule.
 * Deterministic: the same card, seed, kept bars and ENGINE_VERSION give byte-identical JSON.
 * Throws a RuleConflictError naming the rules when they cannot all hold.
 *
 * `options.keep`: bars pinned as they are (see `GenerateOptions`); the others are generated
 * around them. A kept bar that does not fit the card is refused with a RuleCardError naming it.
 */
export function generateDrill(input: RuleCard, seed: string, options: GenerateOptions = {}): Drill {
  const card = canonicalCard(input);
  const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  const ob = collectObligations(card, grid);
  assertNoObligationConflicts(card, grid, ob);
  const kept = readKeptBars(card, grid, options.keep ?? []);
  if (kept.size > 0) assertKeptBarsFit(card, grid, ob, kept);
  const rng = createRng(seed);
  const gauge = createTensionGauge(grid.beats, card.measure, card.meter.grouping);
  const ctx = createFillContext(card, grid, ob);
  const reach = cardReach(ctx, gauge);
  const pinned =
    kept.size === 0
      ? ctx
      : createFillContext(card, grid, withKeptBars(ob, grid, kept), new Set(kept.keys()));
  const bars = fillAndStick(pinned, rng, gauge, reach, kept);
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
 * Refuses kept bars that break, on their own, a rule of the card (a missing backbeat, a fill in
 * a time voice…) with a RuleCardError naming the bar. A kept bar that breaks the cycle of a rule
 * that runs across bars (a phrase's fill and landing, an avoidDownbeat's resolution) makes that
 * rule impossible across the drill: a RuleConflictError naming the rule.
 */
function assertKeptBarsFit(card: RuleCard, grid: Grid, ob: Obligations, kept: KeptBars): void {
  // The other bars hold just what the card obliges: only the kept bars' own faults show.
  const bars = Array.from({ length: grid.bars }, (_, b) => kept.get(b) ?? obligedBar(grid, ob, b));
  const faults = checkBarsAlone(card, grid, ob, bars, new Set(kept.keys()));
  const words = (f: Violation): string => `Pinned bar ${f.bar}: ${lowerFirst(f.message)}`;
  // One line per fault: a note missing at several instants is said once.
  const once = (list: readonly Violation[]): Violation[] =>
    list.filter((f, k) => list.findIndex((g) => words(g) === words(f)) === k);
  const own = once(faults.filter((f) => !ACROSS_BARS.has(f.code)));
  if (own.length > 0) {
    const order = [...kept.keys()];
    throw new RuleCardError(
      'invalid_keep',
      own.map((f) => ({ path: `keep[${order.indexOf((f.bar ?? 1) - 1)}]`, message: words(f) })),
    );
  }
  if (faults.length > 0)
    throw new RuleConflictError(once(faults).map(words).join(' '), [
      ...new Set(faults.map((f) => f.code)),
      'keep',
    ]);
}

/** Rules whose cycle runs across bars: a kept bar can make them impossible for the drill. */
const ACROSS_BARS: ReadonlySet<string> = new Set(['phrase', 'avoidDownbeat']);

function obligedBar(grid: Grid, ob: Obligations, bar: number): DrillBar {
  const cells = ob.cells.slice(bar * grid.slotsPerBar, (bar + 1) * grid.slotsPerBar);
  return barOf(grid, bar, cells, 0);
}

const lowerFirst = (text: string): string => text.charAt(0).toLowerCase() + text.slice(1);

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
  kept: KeptBars,
): DrillBar[] {
  const { card, grid, ob } = ctx;
  const targets = tensionTargets(card, grid.bars);
  if (targets) assertTensionReachableKeeping(ctx, targets, gauge, kept);
  // A target reads on what this card can reach: 0 its calmest bar, 1 its tensest.
  const goals =
    targets?.map((t) => gauge.unitsOfRaw(reach.least + t * (reach.most - reach.least))) ?? null;
  const budget: SearchBudget = { left: SEARCH_WORK_BUDGET };
  // Fresh fills are tried, while the work budget lasts, when removing strokes the hands cannot
  // play breaks the tension order.
  for (;;) {
    const cells = mergeCells(grid, ob, chooseFills(ctx, rng, targets, gauge, budget, goals));
    repairHands(card, grid, cells, kept);
    // Around kept notes, a fillHoles rule's shares may need fewer (or more) free notes.
    for (let k = 0; k < 2 && fitShares(ctx, cells, kept, rng); k++)
      repairHands(card, grid, cells, kept);
    markEmbellishments(ctx, cells, rng, kept);
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
 * `assignHandsRepairing`). Obligations alone are known to be playable, so without kept bars
 * this ends; what still fails with them is the kept bars' doing (only their notes and the
 * card's obligations are left where it fails).
 */
function repairHands(card: RuleCard, grid: Grid, cells: WorkHit[][], kept: KeptBars): void {
  const failure = assignHandsRepairing(card, grid, cells);
  if (!failure) return;
  if (kept.size === 0)
    throw new RuleConflictError('Two hands cannot play these rules at this tempo: slow it down.', [
      'hands',
    ]);
  const at = positionOf(grid, failure.instant);
  const limbs =
    failure.reason === 'feet' ? `the ${voiceWord(failure.voice ?? 'kick')}` : 'the hands';
  throw new RuleConflictError(
    `The pinned bars cannot be kept as they are: around bar ${at.bar}, beat ${at.beat}, ${limbs} cannot play their notes together with what the card asks of the bars around them (${failure.reason === 'tooFast' || failure.reason === 'feet' ? 'too fast for one limb' : 'no sticking a teacher would write'}). Unpin a bar next to it, or change its sticking.`,
    ['keep', failure.reason === 'feet' ? 'feet' : 'hands'],
  );
}

/**
 * Marks each fillHoles rule's share of its embellishments ghost or accent, in time order; other
 * embellishment voices play ghost notes, anchors at normal strength. Kept notes keep their
 * dynamics: the free ones make up the rule's shares over the whole drill.
 */
function markEmbellishments(ctx: FillContext, cells: WorkHit[][], rng: Rng, kept: KeptBars): void {
  const { card } = ctx;
  const owners = fillHolesOwners(card);
  const embellishing = embellishmentVoices(card);
  for (const cell of cells)
    for (const hit of cell)
      if (
        hit.source === 'fill' &&
        !hit.pinned &&
        embellishing.has(hit.voice) &&
        !owners.has(hit.voice)
      )
        hit.dynamic = 'ghost';
  card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles') return;
    const mine = cells.flatMap((cell) =>
      cell.filter((hit) => hit.source === 'fill' && owners.get(hit.voice) === index),
    );
    const free = mine.filter((hit) => !hit.pinned);
    const shares = keptShares(mine);
    const dynamics = embellishmentDynamics(rule, mine.length, free.length, shares, rng);
    if (!dynamics)
      throw sharesConflict(ctx, index, kept, { ...shares, total: mine.length - free.length });
    free.forEach((hit, k) => {
      hit.dynamic = dynamics[k] ?? 'normal';
    });
  });
}

const byVoice = (a: WorkHit, b: WorkHit): number =>
  a.voice < b.voice ? -1 : a.voice > b.voice ? 1 : 0;

function buildBars(grid: Grid, cells: readonly WorkHit[][], gauge: TensionGauge): DrillBar[] {
  const bars: DrillBar[] = [];
  for (let bar = 0; bar < grid.bars; bar++) {
    const sketch = barOf(grid, bar, cells.slice(bar * grid.slotsPerBar), 0);
    bars.push({ ...sketch, tension: gauge.ofBar(sketch) });
  }
  return bars;
}

/** Bar `bar` (0-based) of a drill from its cells (the bar's first cell first). */
function barOf(grid: Grid, bar: number, cells: readonly WorkHit[][], tension: number): DrillBar {
  const hits: DrillHit[] = [];
  for (let i = 0; i < grid.slotsPerBar; i++) {
    const cell = cells[i] ?? [];
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
  return { bar: bar + 1, beats: grid.beats.slice(), tension, hits };
}

/**
 * `assertTensionReachable` on the drill with its kept bars fixed: when the card alone could
 * keep the curve but not around the kept bars' tensions, the refusal names the kept bars.
 */
function assertTensionReachableKeeping(
  ctx: FillContext,
  targets: readonly number[],
  gauge: TensionGauge,
  kept: KeptBars,
): void {
  try {
    assertTensionReachable(ctx, targets, gauge);
  } catch (error) {
    if (!(error instanceof RuleConflictError) || kept.size === 0) throw error;
    const bars = [...kept.keys()].sort((a, b) => a - b).map((b) => b + 1);
    throw new RuleConflictError(
      `With bar${bars.length === 1 ? '' : 's'} ${listWords(bars)} pinned as ${bars.length === 1 ? 'it is' : 'they are'}, the tension rule cannot hold: ${lowerFirst(error.message)} Unpin a bar, or pin bars whose tensions follow the curve.`,
      ['keep', ...error.rules],
    );
  }
}
