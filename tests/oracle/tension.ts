/**
 * Tension as the oracle reads it: each bar re-measured with its own Longuet-Higgins & Lee
 * syncopation (syncopation.ts) and the card's reach worked out from the notes the card fixes and
 * the slots it leaves open to fills (plan.ts, feasibility.ts), never from the engine's values.
 *
 * The drill contract: a bar's tension is the measure on the bar alone, hits whose source is
 * `ostinato` left out, scaled to 0..1 by the greatest value the bar's grid allows; docs/engine.md
 * ("Tension targets"): a target reads on the card's reach, 0 = the calmest bar the card allows,
 * 1 = the tensest.
 */
import { isHand, rulesOf } from './card';
import type { BarLike } from './checks';
import { fillableSlots } from './feasibility';
import { key, type Plan } from './plan';
import { barTree, exactRange, lhl, scaled, type TreeNode } from './syncopation';
import { greatest, STREAM_OF_VOICE, subsetsOf, weightsOf, witek, type Stream } from './witek';

export interface Scale {
  readonly tree: TreeNode;
  /** The greatest syncopation any onset pattern reaches on the bar's grid. */
  readonly most: number;
}

const scales = new Map<string, Scale>();

/** The bar's tree and its exact maximum, worked out once per grid. */
export function scaleOf(plan: Plan): Scale {
  const { subs, grouping } = plan.card;
  const k = `${subs.join(',')}/${grouping?.join(',') ?? ''}`;
  let s = scales.get(k);
  if (!s) {
    const tree = barTree(subs, grouping);
    const slots = subs.reduce((a, b) => a + b, 0);
    const none = Array.from({ length: slots }, () => false);
    const all = none.map(() => true);
    s = { tree, most: exactRange(tree, none, all).most };
    scales.set(k, s);
  }
  return s;
}

/** The bar's tension as the contract defines it, measured by the oracle. */
export function measuredTension(plan: Plan, bar: BarLike): number {
  const { tree, most } = scaleOf(plan);
  const onsets = Array.from({ length: plan.grid.slotsPerBar }, () => false);
  for (const h of bar.hits)
    if (h.source !== 'ostinato') onsets[plan.grid.index(1, h.beat, h.slot)] = true;
  return scaled(lhl(tree, onsets), most);
}

const witekScales = new Map<TreeNode, { weights: number[]; most: number }>();

/**
 * The bar's tension on the polyphonic measure (docs/tension.md, "Polyphonic syncopation"): the
 * Witek index of every hit, the ostinato's too, over the greatest index of the bar's grid.
 */
export function measuredWitek(plan: Plan, bar: BarLike): number {
  const { tree } = scaleOf(plan);
  let s = witekScales.get(tree);
  if (!s) {
    const weights = weightsOf(tree);
    const all = subsetsOf(['low', 'mid', 'high']);
    s = {
      weights,
      most: greatest(
        weights,
        weights.map(() => all),
      ),
    };
    witekScales.set(tree, s);
  }
  const cells = s.weights.map(() => new Set<Stream>());
  for (const h of bar.hits) {
    const stream = STREAM_OF_VOICE[h.voice];
    if (!stream) throw new Error(`no Witek class for voice ${h.voice}`);
    cells[plan.grid.index(1, h.beat, h.slot)]!.add(stream);
  }
  return scaled(witek(s.weights, cells), s.most);
}

/** Limbs the fixed notes use at each slot of the drill (each foot voice its own, hands apart). */
function fixedLimbs(plan: Plan): Map<number, { hands: number; feet: Set<string> }> {
  const at = new Map<number, { hands: number; feet: Set<string> }>();
  const seen = new Set<string>();
  for (const w of plan.wants) {
    const k = key(w.voice, w.index);
    if (seen.has(k)) continue;
    seen.add(k);
    const cell = at.get(w.index) ?? { hands: 0, feet: new Set<string>() };
    if (isHand(w.voice)) cell.hands += 1;
    else cell.feet.add(w.voice);
    at.set(w.index, cell);
  }
  return at;
}

/**
 * Per bar, the least and greatest raw syncopation over every fill the card allows: the notes the
 * card fixes sound (rule notes, and the anchor on beat 1 where nothing keeps it off); a fill may
 * sound on any slot open to some fill voice (docs/engine.md, "Voice roles"), a hand voice only
 * where fewer than two hands are fixed, and under a linear rule at most as many fills beside a
 * fixed note as the bar's overlap budget has left. Phrase fill windows are open too.
 */
export function barReaches(plan: Plan): { least: number; most: number }[] {
  const { grid, card } = plan;
  const { tree } = scaleOf(plan);
  const open = fillableSlots(plan);
  const limbs = fixedLimbs(plan);
  const count = (i: number): number =>
    Math.min(2, limbs.get(i)?.hands ?? 0) + (limbs.get(i)?.feet.size ?? 0);
  const budget = Math.min(Infinity, ...rulesOf(card, 'linear').map((r) => r.maxOverlaps));
  const silent = new Set(plan.silent.map((s) => key(s.voice, s.index)));
  const anchors = card.voices.filter(
    (v) => card.roles.get(v) === 'anchor' && !plan.figureVoices.has(v),
  );
  // Embellishments fill only where a fillHoles rule lists them (docs/engine.md, "Voice roles").
  const listed = new Set(rulesOf(card, 'fillHoles').flatMap((r) => r.voices));
  const handFills = card.voices.some(
    (v) =>
      isHand(v) &&
      !plan.figureVoices.has(v) &&
      (card.roles.get(v) === 'anchor' || (card.roles.get(v) === 'embellishment' && listed.has(v))),
  );
  const out: { least: number; most: number }[] = [];
  for (let bar = 1; bar <= card.bars; bar++) {
    const from = grid.downbeat(bar);
    const n = grid.slotsPerBar;
    const forced: boolean[] = [];
    const allowed: boolean[] = [];
    const costly: boolean[] = [];
    let overlaps = 0;
    for (let s = 0; s < n; s++) {
      const i = from + s;
      const rule = plan.wants.some((w) => w.index === i && w.part !== 'ostinato');
      if (count(i) >= 2) overlaps += 1;
      forced.push(rule);
      const handsFull = (limbs.get(i)?.hands ?? 0) >= 2;
      allowed.push(rule || plan.fillWindow.has(i) || (open.has(i) && (!handsFull || !handFills)));
      costly.push(count(i) === 1);
    }
    // The anchor on one, unless an avoidDownbeat rule or the linear budget keeps it off.
    for (const v of anchors) {
      if (silent.has(key(v, from)) || plan.wantedBy.has(key(v, from))) continue;
      if (count(from) === 1 && overlaps >= budget) continue;
      forced[0] = true;
      if (count(from) === 1) overlaps += 1;
    }
    const left = Math.max(0, budget - overlaps);
    out.push(exactRange(tree, forced, allowed, costly, left));
  }
  return out;
}

/** The card's reach on the 0..1 scale: its calmest bar's least, its tensest bar's most. */
export function cardReach(plan: Plan): { least: number; most: number } {
  const { most } = scaleOf(plan);
  const bars = barReaches(plan);
  return {
    least: scaled(Math.min(...bars.map((b) => b.least)), most),
    most: scaled(Math.max(...bars.map((b) => b.most)), most),
  };
}
