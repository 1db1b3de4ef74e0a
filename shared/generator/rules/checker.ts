import {
  compareHits,
  HIT_SOURCES,
  type Drill,
  type DrillBar,
  type DrillHit,
  type VoiceId,
} from '../drill';
import { beatsOf, createGrid, instantOf, type Grid } from '../grid';
import { checkHands } from './check-hands';
import { checkBusyFeet } from './check-feet';
import { where, type Located } from './located';
import { measureTension } from '../tension';
import { createTensionGauge } from '../tension-gauge';
import { collectObligations, type Obligations } from '../obligations';
import { givenFillOf } from './phrase';
import type { RuleCard } from '../schema';
import { fromUnits, tensionUnits } from '../tension/scale';
import { ENGINE_VERSION } from '../version';
import { drillDifficulty, type Difficulty } from '../difficulty';
import { voiceWord } from '../words';
import { describePart } from './describe';
import { embellishmentVoices, fillHolesOwners, fillVoices, shareCounts } from './fill-holes';
import { countOverlaps, overlapBudget } from './linear';
import { ostinatoPlaysAt } from './ostinato';
import { rankOrderBreaks, tensionTargets } from './tension';
import { movedBackbeatHomes, onFillStep, shuffleMiddles } from '../fill';

/** One broken rule or invariant in a drill, with where it happened when that applies. */
export interface Violation {
  /** What was broken: a rule kind, `ostinato`, `grid`, `order`, `hands`, `feet`, `tension`, `drill`. */
  readonly code: string;
  readonly message: string;
  readonly bar?: number;
  readonly beat?: number;
  readonly slot?: number;
}

/**
 * Verifies a drill against its card: shape, grid bounds, order and uniqueness of hits, every
 * rule, honest sources, playability (limbs, hands, single-hand rate) and the tension curve's
 * rank order. Returns every violation found (empty = the drill is valid).
 */
export function checkDrill(card: RuleCard, drill: Drill): Violation[] {
  // Bars on another grid are reported by the shape check before any tension is measured; the
  // rest share the card's grid, so its metrical tree and maximum are built once, not per bar.
  const beats = beatsOf(card.subdivision, card.meter.beats);
  const gauge = createTensionGauge(beats, card.measure, card.meter.grouping);
  const measure = (bar: DrillBar): number =>
    bar.beats.join() === beats.join()
      ? gauge.ofBar(bar)
      : measureTension(bar, card.meter.grouping, card.measure);
  return checkDrillWith(card, drill, measure);
}

/**
 * `checkDrill` with the tension measure given (the generator passes its per-grid gauge), and
 * what the caller already worked out for this card and drill (its grid, obligations, and the
 * difficulty of the drill's bars).
 */
export function checkDrillWith(
  card: RuleCard,
  drill: Drill,
  measure: (bar: DrillBar) => number,
  known?: { grid: Grid; ob: Obligations; difficulty?: Difficulty },
): Violation[] {
  const out: Violation[] = [];
  const grid = known?.grid ?? createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  if (drill.engine !== ENGINE_VERSION)
    out.push({ code: 'drill', message: `Engine ${drill.engine} is not ${ENGINE_VERSION}.` });
  if (drill.bars.length !== card.bars)
    out.push({
      code: 'drill',
      message: `The drill has ${drill.bars.length} bars, the card ${card.bars}.`,
    });
  const cells = checkShape(grid, card, drill.bars, out);
  if (out.length > 0) return out;
  const ob = known?.ob ?? collectObligations(card, grid, drill.seed, givenFillOf(grid, drill.bars));
  checkObligations(card, grid, ob, cells, out);
  checkFill(card, grid, ob, cells, out);
  checkLinear(card, grid, cells, out);
  checkHands(card, grid, cells, out);
  checkBusyFeet(card, grid, cells, out);
  checkTension(card, drill, measure, out);
  const difficulty = known?.difficulty ?? drillDifficulty(drill);
  if (
    drill.difficulty !== difficulty &&
    JSON.stringify(drill.difficulty) !== JSON.stringify(difficulty)
  )
    out.push({ code: 'drill', message: 'The difficulty does not match the drill.' });
  return out;
}

/**
 * The rules each bar keeps on its own (shape, obligations, the fill's limits, the linear
 * budget) on a drill's worth of bars, reported for the bars (0-based) in `only`. The sticking,
 * the tension order and a fillHoles rule's shares span the drill: `checkDrill` sees to them.
 */
export function checkBarsAlone(
  card: RuleCard,
  grid: Grid,
  ob: Obligations,
  bars: readonly DrillBar[],
  only: ReadonlySet<number>,
): Violation[] {
  const out: Violation[] = [];
  const cells = checkShape(grid, card, bars, out);
  checkObligations(card, grid, ob, cells, out);
  checkFill(card, grid, ob, cells, out);
  checkLinear(card, grid, cells, out);
  return out.filter((v) => v.bar !== undefined && only.has(v.bar - 1));
}

/** Where a hit lies, for a violation's message (made only when one is found). */
const at = (b: number, hit: DrillHit): { bar: number; beat: number; slot: number } => ({
  bar: b + 1,
  beat: hit.beat,
  slot: hit.slot,
});

const DYNAMICS: ReadonlySet<string> = new Set(['ghost', 'normal', 'accent']);

/** The cell of an instant no hit sounds at (never written to). */
const NO_HITS: readonly Located[] = [];

function checkShape(
  grid: Grid,
  card: RuleCard,
  bars: readonly DrillBar[],
  out: Violation[],
): Located[][] {
  // A cell's array is made with its first hit; the empty ones share one at the end.
  const cells: Located[][] = new Array<Located[]>(grid.instants);
  const voices = new Set<string>(card.voices);
  const beats = grid.beats.join();
  bars.forEach((bar, b) => {
    if (bar.bar !== b + 1)
      out.push({ code: 'drill', message: `Bar ${b + 1} is numbered ${bar.bar}.` });
    if (bar.beats.join() !== beats)
      out.push({ code: 'grid', message: `Bar ${b + 1} has the wrong beats.`, bar: b + 1 });
    let previous: DrillHit | null = null;
    for (const hit of bar.hits) {
      const slots = grid.beats[hit.beat - 1];
      if (
        !Number.isInteger(hit.beat) ||
        slots === undefined ||
        !Number.isInteger(hit.slot) ||
        hit.slot < 0 ||
        hit.slot >= slots
      ) {
        out.push({
          code: 'grid',
          message: `A ${hit.voice} hit lies outside the grid.`,
          ...at(b, hit),
        });
        continue;
      }
      if (!voices.has(hit.voice))
        out.push({
          code: 'voices',
          message: `The ${voiceWord(hit.voice)} is not a card voice.`,
          ...at(b, hit),
        });
      if (!HIT_SOURCES.includes(hit.source))
        out.push({ code: 'drill', message: `Unknown source ${hit.source}.`, ...at(b, hit) });
      if (!DYNAMICS.has(hit.dynamic))
        out.push({ code: 'drill', message: `Unknown dynamic ${hit.dynamic}.`, ...at(b, hit) });
      if (previous && compareHits(previous, hit) >= 0)
        out.push({
          code: 'order',
          message: 'Hits are not sorted by beat, slot and voice, or repeat a voice at one instant.',
          ...at(b, hit),
        });
      previous = hit;
      const instant = instantOf(grid, b + 1, hit.beat, hit.slot);
      if (instant < 0 || instant >= grid.instants) continue;
      const located = { hit, bar: b + 1, instant };
      const cell = cells[instant];
      if (cell) cell.push(located);
      else cells[instant] = [located];
    }
  });
  for (let i = 0; i < grid.instants; i++) cells[i] ??= NO_HITS as Located[];
  return cells;
}

function checkObligations(
  card: RuleCard,
  grid: Grid,
  ob: Obligations,
  cells: readonly Located[][],
  out: Violation[],
): void {
  ob.cells.forEach((wanted, instant) => {
    const present = cells[instant] ?? [];
    for (const w of wanted) {
      const hit = present.find((l) => l.hit.voice === w.voice);
      const bar = Math.floor(instant / grid.slotsPerBar) + 1;
      if (!hit) {
        out.push({
          code: w.source,
          message: `${describePart(card, w.rule)} is missing its ${voiceWord(w.voice)} hit in bar ${bar}.`,
          bar,
        });
      } else if (hit.hit.source !== w.source) {
        out.push({
          code: w.source,
          message: `A ${voiceWord(w.voice)} hit is credited to ${hit.hit.source}, but ${w.source} comes first.`,
          ...where(hit),
        });
      }
    }
    for (const l of present) {
      if (l.hit.source === 'fill') continue;
      if (!wanted.some((w) => w.voice === l.hit.voice && w.source === l.hit.source)) {
        out.push({
          code: l.hit.source,
          message: `A ${voiceWord(l.hit.voice)} hit claims to come from ${l.hit.source}, which does not place it there.`,
          ...where(l),
        });
      }
    }
  });
  for (const [voice, instants] of ob.avoided) {
    for (const [instant, rule] of instants) {
      const l = (cells[instant] ?? []).find((x) => x.hit.voice === voice);
      if (l)
        out.push({
          code: 'avoidDownbeat',
          message: `${describePart(card, rule)} is broken: the ${voiceWord(voice)} plays beat 1.`,
          ...where(l),
        });
    }
  }
}

function checkFill(
  card: RuleCard,
  grid: Grid,
  ob: Obligations,
  cells: readonly Located[][],
  out: Violation[],
): void {
  const owners = fillHolesOwners(card);
  const allowed = new Set<VoiceId>(fillVoices(card));
  const embellishing = embellishmentVoices(card);
  const keptFree = new Set<number>();
  for (const instants of ob.avoided.values()) for (const i of instants.keys()) keptFree.add(i);
  const perRule = new Map<number, DrillHit[]>();
  // The fill's quiet places (engine 2.5 and 2.6): a moved backbeat's own beat, and a shuffle's
  // silent middle triplet for voices no fillHoles rule lists.
  const homes = movedBackbeatHomes(card, grid);
  const middles = shuffleMiddles(card, grid, ob);
  cells.forEach((present, instant) => {
    for (const l of present) {
      if (l.hit.source !== 'fill') continue;
      if (homes.has(instant))
        out.push({
          code: 'fill',
          message: `The fill plays the ${voiceWord(l.hit.voice)} on the beat a moved backbeat left, which stays empty.`,
          ...where(l),
        });
      if (middles.has(instant) && !embellishing.has(l.hit.voice))
        out.push({
          code: 'fill',
          message: `The fill plays the ${voiceWord(l.hit.voice)} on the shuffle's silent middle triplet.`,
          ...where(l),
        });
      if (!onFillStep(card, grid, l.hit.voice, instant))
        out.push({
          code: 'fill',
          message: `The fill plays the ${voiceWord(l.hit.voice)} between its fill steps (every ${card.fillStep?.[l.hit.voice] ?? 1} slots of the beat).`,
          ...where(l),
        });
      const owner = owners.get(l.hit.voice);
      if (!allowed.has(l.hit.voice))
        out.push({
          code: 'fill',
          message: `The fill plays the ${voiceWord(l.hit.voice)}, whose part is ${card.roles[l.hit.voice] === 'time' ? 'to keep time' : card.roles[l.hit.voice] === 'colour' ? 'colour on a phrase start' : 'a fixed line'}.`,
          ...where(l),
        });
      if ((ob.cells[instant] ?? []).some((w) => w.source !== 'ostinato') || ob.inFill[instant]) {
        out.push({
          code: 'fill',
          message: 'The fill takes a slot that a rule already holds.',
          ...where(l),
        });
      }
      if (embellishing.has(l.hit.voice)) checkEmbellishment(card, grid, l, keptFree, owners, out);
      if (owner === undefined) continue;
      const mine = perRule.get(owner) ?? [];
      mine.push(l.hit);
      perRule.set(owner, mine);
    }
  });
  card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles') return;
    const hits = perRule.get(index) ?? [];
    const want = shareCounts(rule, hits.length);
    const ghost = hits.filter((h) => h.dynamic === 'ghost').length;
    const accent = hits.filter((h) => h.dynamic === 'accent').length;
    if (ghost !== want.ghost || accent !== want.accent) {
      out.push({
        code: 'fillHoles',
        message: `${describePart(card, index)} should mark ${want.ghost} ghost notes and ${want.accent} accents, not ${ghost} and ${accent}.`,
      });
    }
  });
}

/** An embellishment sits in a hole, off the downbeats kept free, ghosted unless a rule says. */
function checkEmbellishment(
  card: RuleCard,
  grid: Grid,
  l: Located,
  keptFree: ReadonlySet<number>,
  owners: ReadonlyMap<VoiceId, number>,
  out: Violation[],
): void {
  const voice = voiceWord(l.hit.voice);
  if (ostinatoPlaysAt(card, grid, l.instant))
    out.push({
      code: 'fillHoles',
      message: `A ${voice} embellishment lands where the ostinato plays.`,
      ...where(l),
    });
  if (keptFree.has(l.instant))
    out.push({
      code: 'fill',
      message: `A ${voice} embellishment lands on a downbeat the card keeps free.`,
      ...where(l),
    });
  if (!owners.has(l.hit.voice) && l.hit.dynamic !== 'ghost')
    out.push({
      code: 'fill',
      message: `A ${voice} embellishment is not a ghost note.`,
      ...where(l),
    });
}

function checkLinear(
  card: RuleCard,
  grid: Grid,
  cells: readonly Located[][],
  out: Violation[],
): void {
  const budget = overlapBudget(card);
  if (!Number.isFinite(budget)) return;
  for (let bar = 0; bar < grid.bars; bar++) {
    const from = bar * grid.slotsPerBar;
    const overlaps = countOverlaps(from, from + grid.slotsPerBar, (i) => cells[i]?.length ?? 0);
    if (overlaps > budget)
      out.push({
        code: 'linear',
        message: `Bar ${bar + 1} has ${overlaps} overlaps; the linear rule allows ${budget}.`,
        bar: bar + 1,
      });
  }
}

function checkTension(
  card: RuleCard,
  drill: Drill,
  measure: (bar: DrillBar) => number,
  out: Violation[],
): void {
  for (const bar of drill.bars) {
    const measured = fromUnits(tensionUnits(measure(bar)));
    if (measured !== bar.tension) {
      out.push({
        code: 'tension',
        message: `Bar ${bar.bar} records tension ${bar.tension} but measures ${measured}.`,
        bar: bar.bar,
      });
    }
  }
  const targets = tensionTargets(card, drill.bars.length);
  if (!targets) return;
  for (const [a, b] of rankOrderBreaks(
    targets,
    drill.bars.map((bar) => bar.tension),
  )) {
    out.push({
      code: 'tension',
      message: `Bar ${a + 1} (target ${targets[a]}) should be less tense than bar ${b + 1} (target ${targets[b]}).`,
      bar: b + 1,
    });
  }
}
