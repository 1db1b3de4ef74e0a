import { isHandVoice } from '../drill';
import type { Grid } from '../grid';
import type { WorkHit } from './assign';
import { handOf } from './kit';
import { frameOf, type StickingCard } from './streams';

/**
 * A fill stroke at full strength does not sit on the grid note right before an accent of its own
 * hand in a run (common practice: the note before an accented downstroke is a low tap as the
 * stick comes up; a full tom on the "a" into the left hand's backbeat, or a full snare on a
 * quintuplet's last note into it, is not hand-out-able). Where a fillHoles rule of its voice has
 * a ghost note that lies before no accent of its hand, the two trade dynamics (the rule's shares
 * stay); otherwise the stroke is removed and the slot stays empty. Pinned notes stay as they are.
 * Returns true when it removed a stroke (the hands must be assigned again).
 */
export function quietBeforeAccents(
  grid: Grid,
  tempo: number,
  cells: WorkHit[][],
  owners: ReadonlyMap<string, number>,
): boolean {
  const { ticks, run, pace } = frameOf(grid, tempo);
  const n = cells.length;
  if (n < 2) return false;
  const step = (a: number): boolean => {
    const b = (a + 1) % n;
    const gap = (ticks[b] ?? 0) - (ticks[a] ?? 0);
    return (gap > 0 ? gap : gap + pace.loop) <= run;
  };
  const intoAccent = (hit: WorkHit, at: number): boolean =>
    hit.hand !== null &&
    step(at) &&
    (cells[(at + 1) % n] ?? []).some((h) => h.hand === hit.hand && h.dynamic === 'accent');
  const ghosts = new Map<number, WorkHit[]>();
  cells.forEach((cell, at) => {
    for (const hit of cell) {
      const rule = owners.get(hit.voice);
      if (rule === undefined || hit.source !== 'fill' || hit.pinned || hit.dynamic !== 'ghost')
        continue;
      if (intoAccent({ ...hit, dynamic: 'normal' }, at)) continue;
      ghosts.set(rule, [...(ghosts.get(rule) ?? []), hit]);
    }
  });
  let removed = false;
  cells.forEach((cell, at) => {
    for (let k = cell.length - 1; k >= 0; k--) {
      const hit = cell[k] as WorkHit;
      if (hit.source !== 'fill' || hit.pinned || hit.dynamic === 'ghost') continue;
      if (!intoAccent(hit, at)) continue;
      const partner =
        hit.dynamic === 'normal' ? ghosts.get(owners.get(hit.voice) ?? -1)?.pop() : undefined;
      if (partner) {
        partner.dynamic = 'normal';
        hit.dynamic = 'ghost';
        continue;
      }
      cell.splice(k, 1);
      removed = true;
    }
  });
  return removed;
}

/**
 * A backbeat stays on the hand the time leaves free (the left hand's snare under a right-hand
 * hi-hat): where the sticking could only keep its other rules by giving it to the time hand, a
 * fill stroke right beside it (the note before first) is removed instead and the slot stays
 * empty. A backbeat moved on purpose (`steer`, two accents in a row) and one inside a phrase's
 * fill stay as they are. Returns true when it removed a stroke.
 */
export function homeBackbeats(card: StickingCard, cells: WorkHit[][]): boolean {
  const lead = card.sticking.lead;
  if (lead === 'alternate' || !card.ostinato || !isHandVoice(card.ostinato.voice)) return false;
  const timeHand = handOf(lead);
  const n = cells.length;
  if (n < 3) return false;
  let removed = false;
  cells.forEach((cell, at) => {
    const beat = cell.find((h) => h.source === 'backbeat' && h.hand === timeHand && !h.steer);
    if (!beat || !isHandVoice(beat.voice)) return;
    const around = [(at + n - 1) % n, (at + 1) % n];
    if (around.some((i) => (cells[i] ?? []).some((h) => h.source === 'phrase'))) return;
    for (const i of around) {
      const near = cells[i] ?? [];
      const k = near.findIndex((h) => h.source === 'fill' && !h.pinned && h.hand !== null);
      if (k < 0) continue;
      near.splice(k, 1);
      removed = true;
      return;
    }
  });
  return removed;
}
