import { RuleConflictError } from '../errors';
import type { FillContext } from '../fill';
import { positionOf, type Grid } from '../grid';
import { frameOf } from '../sticking/streams';
import { fullStrokesCrowded } from '../sticking/limits';
import { homeBackbeats, quietBeforeAccents } from '../sticking/into-accents';
import { spreadAccents } from '../sticking/spread-accents';
import { alternateHands } from '../sticking/alternate';
import { assignHandsRepairing, type WorkHit } from '../hands';
import type { KeptBars } from '../keep';
import { fitShares, keptShares, sharesConflict } from '../kept-shares';
import type { Rng } from '../random';
import { embellishmentDynamics, embellishmentVoices, fillHolesOwners } from '../rules/fill-holes';
import type { RuleCard } from '../schema';
import { voiceWord } from '../words';
import { isHandVoice, type VoiceId } from '../drill';
import type { Attempt, Shaped, Stuck } from './stages';

/**
 * Stage 6: the sticking. The fills join the obligations; every hand note gets R or L as a
 * teacher would write it (fill strokes the limbs cannot play are removed); then the dynamics of
 * the embellishments (ghost notes, a fillHoles rule's shares), with no full fill stroke right
 * before an accent of its hand (traded for a ghost, or removed and the hands assigned again), and
 * no two accents in a row on one hand closer than full strokes allow where the other hand can take
 * one.
 */
export function stick(shaped: Shaped, attempt: Attempt): Stuck {
  const { fills, ...proven } = shaped;
  const { card, grid, free, kept } = proven;
  // The obligations with the kept bars in place.
  const cells = free.ob.cells.map((cell) => cell.map((hit) => ({ ...hit })));
  for (const f of fills)
    for (const hit of f.fills)
      cells[f.bar * grid.slotsPerBar + hit.i]?.push({
        voice: hit.voice,
        source: 'fill',
        dynamic: 'normal',
        rule: -2,
        hand: null,
      });
  if (kept.size === 0 && card.measure === 'lhl') voiceEveryRule(free, cells, attempt.rng);
  repairHands(card, grid, cells, kept);
  // A linear groove: no two limbs strike together.
  const linear = card.rules.some((r) => r.kind === 'linear' && r.maxOverlaps === 0);
  if (linear)
    for (let k = 0; k < 3 && alternateHands(card, grid, cells, roomOf(free)); k++)
      repairHands(card, grid, cells, kept);
  // Around kept notes, a fillHoles rule's shares may need fewer (or more) free notes.
  for (let k = 0; k < 2 && fitShares(free, cells, kept, attempt.rng); k++)
    repairHands(card, grid, cells, kept);
  const owners = fillHolesOwners(card);
  for (let k = 0; ; k++) {
    markEmbellishments(free, cells, attempt.rng, kept);
    spreadAccents(card, grid, cells);
    if (k === 3) break;
    const quieted = quietBeforeAccents(grid, card.tempo, cells, owners);
    const alternated = linear && alternateHands(card, grid, cells, roomOf(free));
    if (!(homeBackbeats(card, cells) || quieted || alternated)) break;
    repairHands(card, grid, cells, kept);
  }
  return { ...proven, cells };
}

/**
 * Where a fill may put a voice (`voice`), and the kick instead of a hand stroke (`kick`): the fill
 * may add it there, and the kick keeps to at most two notes within a beat (a dotted quarter in a compound meter; see
 * `fill-limbs.ts`).
 */
function roomOf(ctx: FillContext): {
  kick: (instant: number, cells: readonly WorkHit[][]) => boolean;
  voice: (instant: number, voice: VoiceId) => boolean;
  asked: (voice: VoiceId) => boolean;
} {
  const { card, grid } = ctx;
  const owners = fillHolesOwners(card);
  const asked = (v: VoiceId): boolean => {
    const rule = card.rules[owners.get(v) ?? -1];
    return rule?.kind === 'fillHoles' && (rule.ghost > 0 || rule.accent > 0);
  };
  const voice = (instant: number, v: VoiceId): boolean =>
    (
      ctx.options[Math.floor(instant / grid.slotsPerBar)]?.[instant % grid.slotsPerBar] ?? []
    ).includes(v);
  const { ticks, pace, run } = frameOf(grid, card.tempo);
  const grouping = card.meter.grouping;
  const pulse =
    grouping?.length && grouping.every((g) => g === 3) ? 3 * pace.ticksPerBeat : pace.ticksPerBeat;
  const kick = (instant: number, cells: readonly WorkHit[][]): boolean => {
    if (!voice(instant, 'kick')) return false;
    const at: number[] = [];
    cells.forEach((cell, i) => {
      if (i === instant || cell.some((h) => h.voice === 'kick')) at.push(ticks[i] ?? 0);
    });
    // Nor the third of three grid notes running in a run (`fill-limbs.ts`).
    const n = cells.length;
    const kickAt = (i: number): boolean =>
      i === instant || (cells[(i + n) % n] ?? []).some((h) => h.voice === 'kick');
    const step = (i: number): boolean => {
      const a = (i + n) % n;
      const gap = (ticks[(a + 1) % n] ?? 0) - (ticks[a] ?? 0);
      return (gap > 0 ? gap : gap + pace.loop) <= run;
    };
    for (let s = instant - 2; s <= instant && n >= 3; s++)
      if (kickAt(s) && kickAt(s + 1) && kickAt(s + 2) && step(s) && step(s + 1)) return false;
    const k = at.length;
    if (k < 3) return true;
    const mine = at.indexOf(ticks[instant] ?? 0);
    for (let s = mine - 2; s <= mine; s++) {
      const first = at[(s + k) % k] ?? 0;
      const last = at[(s + 2 + k) % k] ?? 0;
      const width = last - first > 0 ? last - first : last - first + pace.loop;
      if (width < pulse) return false;
    }
    return true;
  };
  return { kick, voice, asked };
}

/**
 * A fillHoles rule that asks for ghost notes or accents is heard in every drill: where the fill
 * gave none of the drill's notes to the rule's voices, one fill note of a voice whose dynamics no
 * fillHoles rule asks for (a kick), at an instant where one of the rule's voices may play, becomes the rule's
 * (seeded). The bar's onsets, so its Longuet-Higgins & Lee tension, stay as they were.
 */
function voiceEveryRule(ctx: FillContext, cells: WorkHit[][], rng: Rng): void {
  const { card, grid } = ctx;
  const owners = fillHolesOwners(card);
  const asksNothing = (voice: VoiceId): boolean => {
    const rule = card.rules[owners.get(voice) ?? -1];
    return rule?.kind !== 'fillHoles' || (rule.ghost === 0 && rule.accent === 0);
  };
  card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles' || (rule.ghost === 0 && rule.accent === 0)) return;
    if (
      cells.some((cell) => cell.some((h) => h.source === 'fill' && owners.get(h.voice) === index))
    )
      return;
    const swaps: { cell: WorkHit[]; k: number; voice: VoiceId }[] = [];
    cells.forEach((cell, instant) => {
      const allowed =
        ctx.options[Math.floor(instant / grid.slotsPerBar)]?.[instant % grid.slotsPerBar];
      const hands = cell.filter((h) => isHandVoice(h.voice)).length;
      cell.forEach((hit, k) => {
        if (hit.source !== 'fill' || !asksNothing(hit.voice)) return;
        const voice = rule.voices.find(
          (v) =>
            owners.get(v) === index &&
            (allowed ?? []).includes(v) &&
            !cell.some((h) => h.voice === v) &&
            (!isHandVoice(v) || isHandVoice(hit.voice) || hands < 2),
        );
        if (voice) swaps.push({ cell, k, voice });
      });
    });
    const pick = swaps[rng.int(swaps.length)];
    if (swaps.length === 0 || !pick) return;
    const old = pick.cell[pick.k] as WorkHit;
    pick.cell[pick.k] = { ...old, voice: pick.voice, hand: null };
  });
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
    const mine: WorkHit[] = [];
    const free: WorkHit[] = [];
    const freeAt: number[] = [];
    cells.forEach((cell, instant) => {
      for (const hit of cell) {
        if (hit.source !== 'fill' || owners.get(hit.voice) !== index) continue;
        mine.push(hit);
        if (hit.pinned) continue;
        free.push(hit);
        freeAt.push(instant);
      }
    });
    const shares = keptShares(mine);
    const dynamics = embellishmentDynamics(rule, mine.length, free.length, shares, rng);
    if (!dynamics)
      throw sharesConflict(ctx, index, kept, { ...shares, total: mine.length - free.length });
    free.forEach((hit, k) => {
      hit.dynamic = dynamics[k] ?? 'normal';
    });
    separateAccents(ctx.grid, card.tempo, cells, free, freeAt);
  });
}

/**
 * No hand plays accents on two grid notes in a row of a run, nor on two strokes in a row closer
 * than full strokes allow (`FULL_STROKES_PER_SECOND`; common practice: an accent is a full stroke from a raised stick, and
 * the note right after it is a tap as the stick comes down; the left hand's snare accent right
 * after its backbeat blurs the backbeat). Where a free
 * note's accent lies beside another accent of its hand, it trades its dynamic with a free note
 * of the rule whose accent would lie beside none (a normal note first, then a ghost), so the
 * rule's shares stay as they are; no draw of the seeded generator is spent. `freeAt`: each free
 * note's instant.
 */
function separateAccents(
  grid: Grid,
  tempo: number,
  cells: WorkHit[][],
  free: WorkHit[],
  freeAt: readonly number[],
): void {
  // Most drills have no accent to move: nothing to work out then.
  if (!free.some((hit) => hit.dynamic === 'accent')) return;
  const { ticks, run, pace } = frameOf(grid, tempo);
  const n = grid.instants;
  const step = (a: number, b: number): number => {
    const gap = (ticks[b] ?? 0) - (ticks[a] ?? 0);
    return gap > 0 ? gap : gap + pace.loop;
  };
  const near = (gap: number): boolean => fullStrokesCrowded(pace, gap);
  /** True when free note `k`, accented, would sit beside another accent of its hand in a run, or
   * its hand's stroke before or after it, closer than full strokes allow, is an accent. */
  const crowded = (k: number): boolean => {
    const hit = free[k] as WorkHit;
    const at = freeAt[k];
    if (at === undefined || hit.hand === null || n < 2) return false;
    const accentOf = (i: number): boolean =>
      (cells[i] ?? []).some((h) => h !== hit && h.hand === hit.hand && h.dynamic === 'accent');
    const strikes = (i: number): boolean =>
      (cells[i] ?? []).some((h) => h !== hit && h.hand === hit.hand);
    for (const dir of [-1, 1]) {
      for (let d = 1; d < n; d++) {
        const i = (at + dir * d + n * d) % n;
        const gap = dir < 0 ? step(i, at) : step(at, i);
        if (d > 1 && !near(gap)) break;
        if (d === 1 && gap > run && !near(gap)) break;
        if (accentOf(i)) return true;
        if (strikes(i)) break;
      }
    }
    return false;
  };
  const find = (dynamic: WorkHit['dynamic'], not: number): WorkHit | undefined => {
    for (let k = 0; k < free.length; k++)
      if (free[k]?.dynamic === dynamic && k !== not && !crowded(k)) return free[k];
    return undefined;
  };
  for (let k = 0; k < free.length; k++) {
    const hit = free[k] as WorkHit;
    if (hit.dynamic !== 'accent' || !crowded(k)) continue;
    hit.dynamic = 'normal';
    const swap = find('normal', k) ?? find('ghost', -1);
    if (!swap) {
      hit.dynamic = 'accent';
      continue;
    }
    hit.dynamic = swap.dynamic;
    swap.dynamic = 'accent';
  }
}
