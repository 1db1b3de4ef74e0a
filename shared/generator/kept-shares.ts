import type { VoiceId } from './drill';
import { RuleConflictError, SearchExhaustedError } from './errors';
import type { FillContext } from './fill';
import type { WorkHit } from './hands';
import type { KeptBars } from './keep';
import type { Rng } from './random';
import { describePart } from './rules/describe';
import { fillHolesOwners, freeShares } from './rules/fill-holes';
import type { FillHolesRule } from './schema';
import { listWords } from './words';

/**
 * A fillHoles rule's ghost and accent shares count over the whole drill. Kept notes keep their
 * dynamics, so the free notes must make the shares up; these helpers count and, where the fill
 * drew a number of free notes that cannot, change that number.
 */

/** Ghost and accent counts of the kept notes among `hits`, and how many are kept. */
export function keptShares(hits: readonly WorkHit[]): {
  total: number;
  ghost: number;
  accent: number;
} {
  let total = 0;
  let ghost = 0;
  let accent = 0;
  for (const hit of hits) {
    if (!hit.pinned) continue;
    total++;
    if (hit.dynamic === 'ghost') ghost++;
    else if (hit.dynamic === 'accent') accent++;
  }
  return { total, ghost, accent };
}

/**
 * For each fillHoles rule whose free notes cannot make its shares up around the kept ones,
 * removes (seeded) free notes of its voices, or adds some where the fill may, until their number
 * can. True when it changed anything (the sticking is then done again).
 */
export function fitShares(ctx: FillContext, cells: WorkHit[][], kept: KeptBars, rng: Rng): boolean {
  if (kept.size === 0) return false;
  const owners = fillHolesOwners(ctx.card);
  let changed = false;
  ctx.card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles') return;
    const mine = (hit: WorkHit): boolean =>
      hit.source === 'fill' && owners.get(hit.voice) === index;
    const pinned = keptShares(cells.flatMap((cell) => cell.filter(mine)));
    const free = freeInstants(cells, mine);
    const fits = (n: number): boolean => freeShares(rule, pinned.total + n, n, pinned) !== null;
    if (fits(free.length)) return;
    const target = nearestFit(free.length, roomFor(ctx, rule), fits);
    if (target === null) return;
    changed = true;
    for (let n = free.length; n > target; n--) {
      const [instant] = free.splice(rng.int(free.length), 1);
      const cell = cells[instant ?? -1];
      const k = cell?.findIndex(mine) ?? -1;
      if (cell && k >= 0) cell.splice(k, 1);
    }
    if (target > free.length) addNotes(ctx, cells, rule, target - free.length, rng);
  });
  return changed;
}

/** Instants holding a free note of the rule (one note per instant: the fill adds one a slot). */
function freeInstants(cells: readonly WorkHit[][], mine: (hit: WorkHit) => boolean): number[] {
  const out: number[] = [];
  cells.forEach((cell, instant) => {
    if (cell.some((hit) => mine(hit) && !hit.pinned)) out.push(instant);
  });
  return out;
}

/** The count closest to `from` (fewer first on ties) in 0..room that `fits`, or null. */
function nearestFit(from: number, room: number, fits: (n: number) => boolean): number | null {
  for (let d = 1; d <= Math.max(from, room); d++) {
    if (from - d >= 0 && fits(from - d)) return from - d;
    if (from + d <= room && fits(from + d)) return from + d;
  }
  return null;
}

/** How many notes of the rule's voices the free bars could hold at most. */
function roomFor(ctx: FillContext, rule: FillHolesRule): number {
  const voices = new Set<VoiceId>(rule.voices);
  let room = 0;
  for (const bar of ctx.options) for (const at of bar) if (at.some((v) => voices.has(v))) room++;
  return room;
}

/**
 * Adds `count` notes of the rule's voices at seeded free instants where the fill may play them
 * and nothing else sounds (so no overlap, and no hand, is added to a busy instant).
 */
function addNotes(
  ctx: FillContext,
  cells: WorkHit[][],
  rule: FillHolesRule,
  count: number,
  rng: Rng,
): void {
  const { grid } = ctx;
  const voices = new Set<VoiceId>(rule.voices);
  const open: { instant: number; voice: VoiceId }[] = [];
  ctx.options.forEach((bar, b) =>
    bar.forEach((at, i) => {
      const instant = b * grid.slotsPerBar + i;
      const voice = at.find((v) => voices.has(v));
      if (voice && (cells[instant]?.length ?? 1) === 0) open.push({ instant, voice });
    }),
  );
  for (let n = 0; n < count && open.length > 0; n++) {
    const [at] = open.splice(rng.int(open.length), 1);
    if (!at) break;
    cells[at.instant]?.push({
      voice: at.voice,
      source: 'fill',
      dynamic: 'normal',
      rule: -2,
      hand: null,
    });
  }
}

/**
 * A fillHoles rule whose shares the free notes cannot make up around the kept ones. A
 * RuleConflictError when no number of free notes the other bars could hold would do (proved by
 * trying each); otherwise this drawing of the fill was unlucky, which blames no rule.
 */
export function sharesConflict(
  ctx: FillContext,
  index: number,
  kept: KeptBars,
  pinned: { total: number; ghost: number; accent: number },
): Error {
  const { card } = ctx;
  const rule = card.rules[index];
  if (!rule || rule.kind !== 'fillHoles') return new SearchExhaustedError();
  const room = roomFor(ctx, rule);
  for (let free = 0; free <= room; free++)
    if (freeShares(rule, pinned.total + free, free, pinned)) return new SearchExhaustedError();
  const bars = [...kept.keys()].sort((a, b) => a - b).map((b) => b + 1);
  return new RuleConflictError(
    `The pinned bar${bars.length === 1 ? '' : 's'} ${listWords(bars)} carry ${pinned.ghost} ghost notes and ${pinned.accent} accents of ${describePart(card, index)}, and the other bars have no room to bring its shares (ghost ${rule.ghost}, accent ${rule.accent}) back over the whole drill: unpin a bar, or change its dynamics.`,
    ['keep', 'fillHoles'],
  );
}
