import { isHandVoice, VOICE_IDS, type VoiceId } from './drill';
import { shiftedInstant, ticksOf, type Grid } from './grid';
import { limbsAllow, limbWindows, type LimbWindows } from './fill-limbs';
import { Gap, gapOf, HAND_LIMITS, paceOf, thresholdsOf } from './sticking/limits';
import type { Obligations } from './obligations';
import type { Rng } from './random';
import { embellishmentVoices, fillVoices } from './rules/fill-holes';
import { overlapBudget } from './rules/linear';
import { ostinatoPlaysAt } from './rules/ostinato';
import type { RuleCard } from './schema';
import { arrayOf } from './arrays';

/** What the fill of every bar shares: the card, its grid, the obligations and the limits. */
export interface FillContext {
  readonly card: RuleCard;
  readonly grid: Grid;
  readonly ob: Obligations;
  readonly budget: number;
  /** Per bar-local instant: the voices a fill may add there (before limb and linear limits). */
  readonly options: readonly (readonly VoiceId[])[][];
  /** Metrical strength of each bar-local instant (see `metricalStrength`). */
  readonly strength: readonly number[];
  /**
   * Per bar, its instants' pick weights by lean, worked out on first use: the search asks for
   * the same few leans (the bar's target, 0 and 1) thousands of times on big cards.
   */
  readonly weightsByLean: Map<number, readonly number[]>[];
  /** The limbs' rates round each instant (see `limbsAllow`). */
  readonly limbs: LimbWindows;
}

/** One bar's fill hits, with the counts the limits need; cheap to copy for variants. */
export interface BarFill {
  readonly bar: number;
  /** Bar-local instants and voices of the fill hits. */
  readonly fills: { i: number; voice: VoiceId }[];
  /** Hits (obligatory + fill) and hand voices per bar-local instant. */
  readonly size: number[];
  readonly hands: number[];
  /** Per bar-local instant: bit set of the fill voices there (bit = index in VOICE_IDS). */
  readonly mask: number[];
  overlaps: number;
}

/** `fixed`: bars (0-based) kept as given, which take no fill. */
export function createFillContext(
  card: RuleCard,
  grid: Grid,
  ob: Obligations,
  fixed: ReadonlySet<number> = new Set(),
): FillContext {
  const embellishing = embellishmentVoices(card);
  const voices = fillVoices(card);
  const busy = handsBusy(card, grid, ob);
  const keptFree = new Set<number>();
  for (const instants of ob.avoided.values())
    for (const instant of instants.keys()) keptFree.add(instant);
  const middle = shuffleMiddles(card, grid, ob);
  const left = movedBackbeatHomes(card, grid);
  const options: VoiceId[][][] = [];
  for (let bar = 0; bar < grid.bars; bar++) {
    const perInstant: VoiceId[][] = [];
    for (let i = 0; i < grid.slotsPerBar; i++) {
      const instant = bar * grid.slotsPerBar + i;
      const cell = ob.cells[instant] ?? [];
      // A slot another rule has taken is not free; the ostinato alone leaves it free.
      const free =
        !fixed.has(bar) &&
        cell.every((hit) => hit.source === 'ostinato') &&
        !ob.inFill[instant] &&
        !left.has(instant);
      if (!free) {
        perInstant.push(NO_VOICES as VoiceId[]);
        continue;
      }
      const here: VoiceId[] = [];
      perInstant.push(here);
      const hole = !ostinatoPlaysAt(card, grid, instant);
      for (const v of voices) {
        if (isHandVoice(v) && busy[instant]) continue;
        if (hasVoice(cell, v)) continue;
        if (!onFillStep(card, grid, v, instant)) continue;
        if (
          embellishing.has(v)
            ? hole && !keptFree.has(instant)
            : !ob.avoided.get(v)?.has(instant) && !middle.has(instant)
        )
          here.push(v);
      }
    }
    options.push(perInstant);
  }
  const strength = metricalStrength(grid, card.meter.grouping);
  const weightsByLean = arrayOf(grid.bars, () => new Map<number, number[]>());
  const limbs = limbWindows(card, grid, ob);
  return { card, grid, ob, budget: overlapBudget(card), options, strength, weightsByLean, limbs };
}

/**
 * Whether a fill of `voice` may sit on this instant's slot: a card's `fillStep` keeps a voice's
 * fills on every n-th slot of the beat (eighth-note kicks under a sixteenth grid).
 */
export function onFillStep(card: RuleCard, grid: Grid, voice: VoiceId, instant: number): boolean {
  const step = card.fillStep?.[voice];
  return step === undefined || (grid.slotOf[instant % grid.slotsPerBar] ?? 0) % step === 0;
}

/** The options of a slot that is not free (shared, never written to). */
const NO_VOICES: readonly VoiceId[] = [];

function hasVoice(cell: readonly { voice: VoiceId }[], voice: VoiceId): boolean {
  for (const hit of cell) if (hit.voice === voice) return true;
  return false;
}

/**
 * The beats a moved backbeat left (shift not 0): no fill note there, whatever the voice (common
 * practice: an early or late backbeat is heard by the hole where the backbeat used to be; a kick
 * on 2 right after an early snare fills it).
 */
export function movedBackbeatHomes(card: RuleCard, grid: Grid): Set<number> {
  const out = new Set<number>();
  for (const rule of card.rules) {
    if (rule.kind !== 'backbeat' || rule.shift === 0) continue;
    for (let bar = 1; bar <= grid.bars; bar++) {
      if (rule.bars && !rule.bars.includes(bar)) continue;
      for (const beat of rule.beats)
        out.add(shiftedInstant(grid, (bar - 1) * grid.beatsPerBar + (beat - 1), 0));
    }
  }
  return out;
}

/**
 * The silent middle notes of a shuffle: where the hands' time plays the first and the last note
 * of every triplet (the slots of a triplet beat, or the eighths of a compound meter's dotted
 * quarter) and never the middle one, the anchor (the kick) favours the beat and the last
 * triplet and leaves the middle one out (common practice). Empty for any other time.
 */
export function shuffleMiddles(card: RuleCard, grid: Grid, ob: Obligations): Set<number> {
  const grouping = card.meter.grouping;
  const compound =
    !!grouping?.length && grouping.every((g) => g === 3) && grid.beats.every((b) => b === 1);
  const starts: number[] = [];
  for (let i = 0; i < grid.instants; i++) {
    const b = grid.beatOf[i] ?? 0;
    if (compound ? i % 3 === 0 : grid.slotOf[i] === 0 && grid.beats[b] === 3) starts.push(i);
  }
  const time = (i: number): boolean =>
    (ob.cells[i] ?? []).some((h) => h.source === 'ostinato' && isHandVoice(h.voice));
  const shuffle =
    starts.length > 0 &&
    starts.every((i) => !time(i + 1) && (ob.inFill[i] || (time(i) && time(i + 2))));
  return new Set(shuffle ? starts.map((i) => i + 1) : []);
}

/**
 * Metrical strength of each bar-local instant, strongest 0: the downbeat 0; then, without a
 * grouping, each beat 1, half beats 2, the rest 3; with one (6/8 as 3+3, 7/8 as 2+2+3), the
 * first beat of each group 1, the other beats 2, the rest 3, so a compound or odd bar leans on
 * its group beats as it is felt.
 */
export function metricalStrength(grid: Grid, grouping?: readonly number[] | null): number[] {
  const groupStarts = new Set<number>();
  let at = 0;
  for (const beats of grouping ?? []) {
    groupStarts.add(at);
    at += beats;
  }
  return grid.beatOf.map((b, i) => {
    const slot = grid.slotOf[i] ?? 0;
    if (slot === 0 && b === 0) return 0;
    if (groupStarts.size > 0) return slot !== 0 ? 3 : groupStarts.has(b) ? 1 : 2;
    const slots = grid.beats[b] ?? 1;
    return slot === 0 ? 1 : slot * 2 === slots ? 2 : 3;
  });
}

/**
 * Per instant: true where no hand can add a stroke, because two obligatory hand strokes too
 * close to each other for one hand (so one on each hand) both lie within a hand's rest time of
 * it (the drill looping round). A sound test, not a complete one: it keeps fills, and the
 * tension search, off slots no sticking could play.
 */
function handsBusy(card: RuleCard, grid: Grid, ob: Obligations): boolean[] {
  const busy = new Array<boolean>(grid.instants).fill(false);
  const loop = grid.bars * grid.beatsPerBar * grid.ticksPerBeat;
  const ticks: number[] = [];
  ob.cells.forEach((cell, instant) => {
    for (const hit of cell) if (isHandVoice(hit.voice)) ticks.push(ticksOf(grid, instant));
  });
  if (ticks.length < 2) return busy;
  // Three laps, so the window of an instant near either end sees the strokes round the loop.
  const laps = [...ticks.map((t) => t - loop), ...ticks, ...ticks.map((t) => t + loop)];
  // The fastest a hand may go: doubles where the card allows them.
  const hand = thresholdsOf(paceOf(grid, card.tempo), HAND_LIMITS);
  const fastest = card.sticking.doubles ? Gap.Double : Gap.Single;
  const tooClose = (d: number): boolean => gapOf(hand, d) > fastest;
  let from = 0;
  for (let instant = 0; instant < grid.instants; instant++) {
    const now = ticksOf(grid, instant);
    while (from < laps.length && !tooClose(now - (laps[from] ?? 0)) && (laps[from] ?? 0) < now)
      from++;
    for (let k = from; k + 1 < laps.length; k++) {
      const a = laps[k] ?? 0;
      const b = laps[k + 1] ?? 0;
      if (a > now && !tooClose(a - now)) break;
      if (b > now && !tooClose(b - now)) break;
      if (tooClose(b - a)) {
        busy[instant] = true;
        break;
      }
    }
  }
  return busy;
}

/** An empty fill for a bar: only its obligations counted. */
export function emptyFill(ctx: FillContext, bar: number): BarFill {
  const size: number[] = [];
  const hands: number[] = [];
  let overlaps = 0;
  for (let i = 0; i < ctx.grid.slotsPerBar; i++) {
    const cell = ctx.ob.cells[bar * ctx.grid.slotsPerBar + i] ?? [];
    let handVoices = 0;
    for (const hit of cell) if (isHandVoice(hit.voice)) handVoices++;
    size.push(cell.length);
    hands.push(handVoices);
    if (cell.length >= 2) overlaps++;
  }
  return { bar, fills: [], size, hands, mask: new Array<number>(size.length).fill(0), overlaps };
}

export function copyFill(f: BarFill): BarFill {
  return {
    bar: f.bar,
    fills: f.fills.slice(),
    size: f.size.slice(),
    hands: f.hands.slice(),
    mask: f.mask.slice(),
    overlaps: f.overlaps,
  };
}

/**
 * True when `voice` may be added at bar-local instant `i`: one fill hit per free slot (density
 * counts slots), within the limbs and linear limits.
 */
function canAdd(ctx: FillContext, f: BarFill, i: number, voice: VoiceId): boolean {
  if ((f.mask[i] ?? 0) !== 0) return false;
  if (isHandVoice(voice) && (f.hands[i] ?? 0) >= 2) return false;
  if ((f.size[i] ?? 0) === 1 && f.overlaps >= ctx.budget) return false;
  return limbsAllow(ctx.limbs, f, i, voice);
}

const bit = (voice: VoiceId): number => 1 << VOICE_IDS.indexOf(voice);

function add(f: BarFill, i: number, voice: VoiceId): void {
  f.fills.push({ i, voice });
  f.mask[i] = (f.mask[i] ?? 0) | bit(voice);
  const before = f.size[i] ?? 0;
  f.size[i] = before + 1;
  if (before === 1) f.overlaps++;
  if (isHandVoice(voice)) f.hands[i] = (f.hands[i] ?? 0) + 1;
}

function removeAt(f: BarFill, k: number): void {
  const [hit] = f.fills.splice(k, 1);
  if (!hit) return;
  f.mask[hit.i] = (f.mask[hit.i] ?? 0) & ~bit(hit.voice);
  const after = (f.size[hit.i] ?? 1) - 1;
  f.size[hit.i] = after;
  if (after === 1) f.overlaps--;
  if (isHandVoice(hit.voice)) f.hands[hit.i] = (f.hands[hit.i] ?? 1) - 1;
}

/**
 * Pick weight of an instant by metrical strength, leaning on-beat for a calm bar (`lean` 0) and
 * off-beat for a tense one (`lean` 1). Integer tables keep the arithmetic exact.
 */
const CALM = [8, 6, 3, 1] as const;
const TENSE = [1, 2, 5, 8] as const;
/**
 * The lean of a landing bar: its fill notes go only on the downbeat and the beats (group starts
 * in a grouped meter), where they cannot start a syncopation the beat after would not already
 * hold, so the bar lets go (common practice: the groove releases where it lands).
 */
export const LANDING_LEAN = -1;
const LANDING = [8, 6, 0, 0] as const;
function weightOf(strength: number, lean: number): number {
  if (lean === LANDING_LEAN) return LANDING[strength] ?? 0;
  return (CALM[strength] ?? 1) * (1 - lean) + (TENSE[strength] ?? 1) * lean;
}

/** Free instants of a bar (those where some fill voice is allowed). */
export function freeCount(ctx: FillContext, bar: number): number {
  return (ctx.options[bar] ?? []).filter((voices) => voices.length > 0).length;
}

/**
 * Pick weights of a bar's instants at one lean, 0 where no fill voice is allowed: worked out
 * once per bar and lean rather than once per added hit. Shared: never write to the result.
 */
function instantWeights(ctx: FillContext, bar: number, lean: number): readonly number[] {
  const cache = ctx.weightsByLean[bar];
  const known = cache?.get(lean);
  if (known) return known;
  const weights = (ctx.options[bar] ?? []).map((voices, i) =>
    voices.length === 0 ? 0 : weightOf(ctx.strength[i] ?? 3, lean),
  );
  cache?.set(lean, weights);
  return weights;
}

/** True when one of `voices` may be added at bar-local instant `i` of an unoccupied slot. */
function anyAddable(ctx: FillContext, f: BarFill, i: number, voices: readonly VoiceId[]): boolean {
  if ((f.size[i] ?? 0) === 1 && f.overlaps >= ctx.budget) return false;
  return voices.some(
    (v) => (!isHandVoice(v) || (f.hands[i] ?? 0) < 2) && limbsAllow(ctx.limbs, f, i, v),
  );
}

/** The weights of the instants where a fill hit may go now (0 elsewhere). */
function liveWeights(ctx: FillContext, f: BarFill, weightsAt: readonly number[]): number[] {
  const options = ctx.options[f.bar] ?? [];
  const weights = new Array<number>(options.length).fill(0);
  for (let i = 0; i < options.length; i++) {
    const w = weightsAt[i] ?? 0;
    if (w === 0 || (f.mask[i] ?? 0) !== 0) continue;
    if (anyAddable(ctx, f, i, options[i] ?? [])) weights[i] = w;
  }
  return weights;
}

/**
 * Adds one seeded fill hit at an instant drawn by `weights`: its instant; -1 when nothing can
 * be drawn; -2 - the instant when the one drawn holds no voice the limbs can play now.
 */
function addDrawn(ctx: FillContext, f: BarFill, rng: Rng, weights: readonly number[]): number {
  const i = rng.weighted(weights);
  if (i < 0) return -1;
  // The k-th allowed voice, counted in place (no list per draw); the draw is made even when
  // none is allowed, as the stream of draws must not depend on how the choice is computed.
  const options = ctx.options[f.bar]?.[i] ?? [];
  let allowed = 0;
  for (const v of options) if (canAdd(ctx, f, i, v)) allowed++;
  let k = rng.int(allowed);
  for (const v of options) {
    if (!canAdd(ctx, f, i, v) || k-- > 0) continue;
    add(f, i, v);
    return i;
  }
  return -2 - i;
}

/** Adds one seeded, weighted fill hit; false when nothing more fits. */
function addOne(ctx: FillContext, f: BarFill, rng: Rng, weightsAt: readonly number[]): boolean {
  return addDrawn(ctx, f, rng, liveWeights(ctx, f, weightsAt)) >= 0;
}

/** Removes one seeded fill hit, preferring those that work against `lean`. */
function removeOne(ctx: FillContext, f: BarFill, rng: Rng, lean: number): boolean {
  if (f.fills.length === 0) return false;
  // One weight per strength, looked up per hit (the same values as weighing each hit afresh).
  const against = 1 - lean;
  const byStrength = [0, 1, 2, 3].map((strength) => weightOf(strength, against));
  const weights = new Float64Array(f.fills.length);
  f.fills.forEach((hit, k) => {
    weights[k] = byStrength[ctx.strength[hit.i] ?? 3] as number;
  });
  const k = rng.weighted(weights);
  if (k < 0) return false;
  removeAt(f, k);
  return true;
}

/**
 * How many fill notes a bar asks for: `density` of its free slots; under a tension curve
 * (`target` not null) fewer in calm bars and more in tense ones (a quarter of that at target 0,
 * one and three quarters at 1), so the curve is heard as notes too: a build adds notes toward
 * its peak and the release thins out (common practice).
 */
export function fillCount(ctx: FillContext, bar: number, target: number | null): number {
  const free = freeCount(ctx, bar);
  const share = target === null ? 1 : 0.25 + 1.5 * target;
  return Math.min(free, Math.round(ctx.card.density * free * share));
}

/**
 * The bar's first fill: `fillCount` of its free slots, chosen by seeded weighted draws leaning
 * as `lean` asks (the bar's target, or 0.5 without a curve).
 */
export function initialFill(
  ctx: FillContext,
  bar: number,
  rng: Rng,
  lean: number,
  target: number | null = null,
  landing = false,
): BarFill {
  const f = emptyFill(ctx, bar);
  // A landing keeps at least one note on the beat when the groove's bars have one (a kick on 3
  // under a sparse groove), so it does not hang on the backbeat's syncopation.
  const count = Math.max(
    landing ? Math.min(1, fillCount(ctx, bar, null)) : 0,
    fillCount(ctx, bar, target),
  );
  // Additions only close instants: the one just taken, and every lone hit once the linear
  // budget is spent. So the live weights are kept up to date instead of rebuilt per hit.
  const weights = liveWeights(ctx, f, instantWeights(ctx, bar, lean));
  for (let n = 0; n < count;) {
    const overlaps = f.overlaps;
    const i = addDrawn(ctx, f, rng, weights);
    if (i === -1) break;
    // A fill hit just added can close its neighbours to a limb: skip those when drawn.
    if (i < -1) {
      weights[-2 - i] = 0;
      continue;
    }
    n++;
    weights[i] = 0;
    if (f.overlaps !== overlaps && f.overlaps >= ctx.budget)
      for (let j = 0; j < weights.length; j++) if ((f.size[j] ?? 0) === 1) weights[j] = 0;
  }
  return f;
}

/** The fill with one more seeded note, leaning as asked (the same fill when none fits). */
export function withOneMore(ctx: FillContext, from: BarFill, rng: Rng, lean: number): BarFill {
  const f = copyFill(from);
  addOne(ctx, f, rng, instantWeights(ctx, f.bar, lean));
  return f;
}

/** A neighbour of a fill: one move (remove + add), addition or removal, leaning as asked. */
export function variantOf(ctx: FillContext, from: BarFill, rng: Rng, lean: number): BarFill {
  const f = copyFill(from);
  const weightsAt = instantWeights(ctx, f.bar, lean);
  const steps = 1 + rng.int(2);
  for (let s = 0; s < steps; s++) {
    const move = rng.int(3);
    if (move === 0) {
      if (removeOne(ctx, f, rng, lean)) addOne(ctx, f, rng, weightsAt);
    } else if (move === 1) {
      addOne(ctx, f, rng, weightsAt);
    } else {
      removeOne(ctx, f, rng, lean);
    }
  }
  return f;
}
