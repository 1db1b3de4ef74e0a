import { isHandVoice, type VoiceId } from './drill';
import { WITEK_CLASS_OF_VOICE } from './tension/witek';
import { RuleConflictError, SearchExhaustedError } from './errors';
import { emptyFill, type FillContext } from './fill';
import { describePart, partKind } from './rules/describe';
import { tensionLevels } from './rules/tension';
import { listWords } from './words';
import type { TensionGauge } from './tension-gauge';

/** The raw syncopation range the fills of one bar can reach. */
export interface BarReach {
  readonly least: number;
  readonly most: number;
  /** Every raw value the bar's fills can reach, ascending, when few enough to list. */
  readonly values?: readonly number[];
}

/**
 * Proves, without searching, that no fill keeps a tension curve's rank order, and throws a
 * RuleConflictError saying why; returns quietly when an order may exist (the search decides).
 *
 * Every drill the generator can make sounds each bar's obligatory hits (ostinato aside) and
 * fills only slots where some fill voice is allowed, within the limbs and the linear budget the
 * obligations already use up; so each bar's tension lies between the least and the greatest
 * syncopation over those patterns (exact, `lhlRangeOnGrid`). If even those ranges cannot be
 * stacked in the curve's order (each level strictly above the one below), no fill can. Both
 * sides are whole numbers of the measure's units, so strictly above means one more.
 * `reach`: the bars' reaches when already worked out (`barReaches` with the same `listed`).
 */
export function assertTensionReachable(
  ctx: FillContext,
  targets: readonly number[],
  gauge: TensionGauge,
  listed = gauge.measure !== 'lhl',
  reach: readonly BarReach[] | null = null,
): void {
  const levels = tensionLevels(targets);
  if (levels.length <= 1) return;
  reach ??= barReaches(ctx, gauge, listed);
  let floor = Number.NEGATIVE_INFINITY;
  let floorBar = -1;
  for (let k = 0; k < levels.length; k++) {
    let top = Number.NEGATIVE_INFINITY;
    let topBar = -1;
    for (const bar of levels[k] ?? []) {
      const r = reach[bar] as BarReach;
      const pick = r.values
        ? (r.values.find((v) => v > floor) ?? Number.POSITIVE_INFINITY)
        : Math.max(r.least, floor + 1);
      if (pick > r.most)
        throw unreachable(ctx, gauge, targets, reach, levels, {
          level: k,
          bar,
          below: floorBar,
          floor,
        });
      if (pick > top) {
        top = pick;
        topBar = bar;
      }
    }
    floor = top;
    floorBar = topBar;
  }
}

/**
 * What a search that spent its work budget ends with. The ranges proved up front can miss gaps
 * between the values a bar can reach, so the slower exact proof (every reachable value listed)
 * decides first: a RuleConflictError when the curve truly cannot be kept, else a
 * SearchExhaustedError, which blames no rule.
 */
export function giveUp(
  ctx: FillContext,
  targets: readonly number[] | null,
  gauge: TensionGauge,
): never {
  if (targets) assertTensionReachable(ctx, targets, gauge, true);
  throw new SearchExhaustedError();
}

/**
 * The least and greatest raw syncopation any bar of this card can measure: the scale a tension
 * target is read on (0 = the calmest bar the card allows, 1 = the tensest), from each bar's
 * reach (`barReaches`).
 */
export function cardReach(reach: readonly BarReach[]): BarReach {
  return {
    least: Math.min(...reach.map((r) => r.least)),
    most: Math.max(...reach.map((r) => r.most)),
  };
}

/**
 * Per bar, the syncopation range its fills can reach; bars alike in slots are worked out once.
 * `listed`: each bar's reachable values are also listed where it has few enough fill patterns.
 */
export function barReaches(ctx: FillContext, gauge: TensionGauge, listed = false): BarReach[] {
  const { grid, ob } = ctx;
  const known = new Map<number | string, BarReach>();
  // A bar's slots as a number in base 3 while it fits (no string built a bar), else as text.
  const numeric = grid.slotsPerBar <= 30;
  const out: BarReach[] = [];
  for (let bar = 0; bar < grid.bars; bar++) {
    const empty = emptyFill(ctx, bar);
    // Adding to a lone hit makes an overlap; the obligations may have spent the budget already.
    const overlapsLeft = empty.overlaps < ctx.budget;
    const forced: boolean[] = [];
    const allowed: boolean[] = [];
    let key: number | string = numeric ? 0 : '';
    for (let i = 0; i < grid.slotsPerBar; i++) {
      const cell = ob.cells[bar * grid.slotsPerBar + i] ?? [];
      const fixed = cell.some((hit) => hit.source !== 'ostinato');
      const fillable = (ctx.options[bar]?.[i] ?? []).some(
        (voice) =>
          !(isHandVoice(voice) && (empty.hands[i] ?? 0) >= 2) &&
          !((empty.size[i] ?? 0) === 1 && !overlapsLeft),
      );
      forced.push(fixed);
      allowed.push(fixed || fillable);
      if (typeof key === 'number') key = key * 3 + (fixed ? 2 : fillable ? 1 : 0);
      else key += fixed ? 'x' : fillable ? 'o' : '.';
    }
    let r = known.get(key);
    if (!r || gauge.measure !== 'lhl') {
      const values = listed ? listedValues(ctx, gauge, bar, allowed, forced) : null;
      r = values
        ? { least: values[0] ?? 0, most: values[values.length - 1] ?? 0, values }
        : gauge.measure === 'lhl'
          ? gauge.reach(forced, allowed)
          : { least: 0, most: gauge.most };
      known.set(key, r);
    }
    out.push(r);
  }
  return out;
}

/** Bars with at most this many fill patterns have their reachable values listed exactly. */
const LISTED_PATTERNS = 256;

/**
 * Every raw value the fills of a bar can reach, when the bar has few enough fill patterns: each
 * fillable slot stays silent or takes one fill voice (what the measure tells apart: any onset for
 * LHL, the instrument class for Witek). The limbs and the linear budget are not applied, so the
 * list can only be larger than what a drill reaches: a curve that cannot be stacked on it cannot
 * be kept. Null when there are too many patterns (the exact range stands in).
 */
function listedValues(
  ctx: FillContext,
  gauge: TensionGauge,
  bar: number,
  allowed: readonly boolean[],
  forced: readonly boolean[],
): number[] | null {
  const { grid, ob } = ctx;
  const base = Array.from({ length: grid.slotsPerBar }, (_, i) =>
    (ob.cells[bar * grid.slotsPerBar + i] ?? []).map((hit) => ({
      voice: hit.voice,
      time: hit.source === 'ostinato',
    })),
  );
  const choices: { i: number; voices: VoiceId[] }[] = [];
  let patterns = 1;
  for (let i = 0; i < grid.slotsPerBar; i++) {
    if (!allowed[i] || forced[i]) continue;
    const distinct = new Map<string, VoiceId>();
    for (const voice of ctx.options[bar]?.[i] ?? []) {
      const effect = gauge.measure === 'lhl' ? 'onset' : WITEK_CLASS_OF_VOICE[voice];
      if (!distinct.has(effect)) distinct.set(effect, voice);
    }
    if (distinct.size === 0) continue;
    choices.push({ i, voices: [...distinct.values()] });
    patterns *= distinct.size + 1;
    if (patterns > LISTED_PATTERNS) return null;
  }
  const values = new Set<number>();
  if (gauge.measure === 'lhl') {
    // Only onsets count: toggle them in place.
    const onsets = base.map((at) => at.some((v) => !v.time));
    const walkOnsets = (k: number): void => {
      const choice = choices[k];
      if (!choice) {
        values.add(gauge.rawOfOnsets(onsets));
        return;
      }
      walkOnsets(k + 1);
      onsets[choice.i] = true;
      walkOnsets(k + 1);
      onsets[choice.i] = false;
    };
    walkOnsets(0);
    return [...values].sort((a, b) => a - b);
  }
  const walk = (k: number): void => {
    const choice = choices[k];
    if (!choice) {
      values.add(gauge.rawOfVoices(base));
      return;
    }
    walk(k + 1);
    const at = base[choice.i] as { voice: VoiceId; time: boolean }[];
    for (const voice of choice.voices) {
      at.push({ voice, time: false });
      walk(k + 1);
      at.pop();
    }
  };
  walk(0);
  return [...values].sort((a, b) => a - b);
}

function unreachable(
  ctx: FillContext,
  gauge: TensionGauge,
  targets: readonly number[],
  reach: readonly BarReach[],
  levels: readonly number[][],
  failure: { level: number; bar: number; below: number; floor: number },
): RuleConflictError {
  const { card, ob } = ctx;
  const { level: failedLevel, bar, below, floor } = failure;
  const asks = `The tension rule asks bar ${bar + 1} to be more tense than bar ${below + 1} (targets ${targets[bar]} and ${targets[below]})`;
  const climbed = levels.slice(0, failedLevel + 1).flat();
  const least = Math.min(...climbed.map((b) => reach[b]?.least ?? 0));
  const most = Math.max(...climbed.map((b) => reach[b]?.most ?? 0));
  const values = most - least + 1;
  const parts = [...new Set(ob.placements.filter((p) => p.rule >= 0).map((p) => p.rule))];
  const kinds = ['tension', ...new Set(parts.map((r) => partKind(card, r)))];
  if (Number.isFinite(ctx.budget)) kinds.push('linear');
  if (failedLevel + 1 > values) {
    const span =
      values === 1
        ? `only one tension (${gauge.scale(least)})`
        : `only ${values} different tensions (from ${gauge.scale(least)} to ${gauge.scale(most)})`;
    return new RuleConflictError(
      `${asks}, but its curve climbs through ${failedLevel + 1} different targets up to there, while bars of this grid${parts.length > 0 ? ' with these rules' : ''} can measure ${span}: give the curve at most ${values} different value${values === 1 ? '' : 's'}, or use a finer subdivision.`,
      kinds,
    );
  }
  const taken = listWords(parts.map((r) => describePart(card, r)));
  return new RuleConflictError(
    `${asks}, but with the slots the fill may use${taken ? ` (${taken}${Number.isFinite(ctx.budget) ? ' and the linear rule' : ''} hold the others)` : ''} bar ${bar + 1} reaches at most tension ${gauge.scale(reach[bar]?.most ?? 0)}, while the lower steps of the curve already push bar ${below + 1} to at least ${gauge.scale(floor)}: free some slots, or flatten the curve.`,
    kinds,
  );
}
