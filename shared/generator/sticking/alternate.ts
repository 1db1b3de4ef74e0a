import type { Grid } from '../grid';
import type { WorkHit } from './assign';
import { otherHand } from './kit';
import { frameOf, type StickingCard } from './streams';

/**
 * In a linear groove the hands alternate (common practice: a linear pattern is written hand to
 * hand through the drums, R L R L, with a double only where the teacher asks for one). Without
 * `doubles`, a fill stroke that would give one hand two grid notes running in a run (the left
 * hand's backbeat on 2 and a snare on the "e", a snare and then a tom on the left hand) goes to
 * the other hand where that hand is free on both sides (the right hand leaves the hi-hat for a
 * tom; the sticking, assigned again, keeps the move or removes a fill stroke the limbs cannot
 * play); else it becomes a kick where the kick may fill
 * (`mayKick`: the instant's onset, and so the bar's Longuet-Higgins & Lee tension, stay); else it
 * is removed. Notes of kept bars and of the card's rules stay as they are. Returns true when it
 * changed a stroke (the caller assigns the hands again, `steer` holding a move; a kick too fast
 * for the foot is removed then).
 */
export function alternateHands(
  card: StickingCard,
  grid: Grid,
  cells: WorkHit[][],
  room: {
    kick: (instant: number, cells: readonly WorkHit[][]) => boolean;
    voice: (instant: number, voice: WorkHit['voice']) => boolean;
    /** True for a voice whose ghost notes or accents a fillHoles rule asks for. */
    asked: (voice: WorkHit['voice']) => boolean;
  },
): boolean {
  if (card.sticking.doubles || card.sticking.lead === 'alternate') return false;
  const { ticks, run, pace } = frameOf(grid, card.tempo);
  const n = cells.length;
  if (n < 3) return false;
  /** True when the grid notes at `a` and the next instant are a run's neighbours. */
  const step = (a: number): boolean => {
    const i = (a + n) % n;
    const gap = (ticks[(i + 1) % n] ?? 0) - (ticks[i] ?? 0);
    return (gap > 0 ? gap : gap + pace.loop) <= run;
  };
  const beside = (hit: WorkHit, at: number, hand: WorkHit['hand']): boolean =>
    (step(at - 1) && (cells[(at - 1 + n) % n] ?? []).some((h) => h !== hit && h.hand === hand)) ||
    (step(at) && (cells[(at + 1) % n] ?? []).some((h) => h !== hit && h.hand === hand));
  /** Where `voice` has no fill note left, another hand fill stroke that alternates becomes one. */
  const keepVoice = (voice: WorkHit['voice'], from: number): void => {
    if (!room.asked(voice)) return;
    if (cells.some((c) => c.some((h) => h.source === 'fill' && h.voice === voice))) return;
    for (let d = 1; d < n; d++) {
      const at = (from + d) % n;
      const c = cells[at] ?? [];
      const k = c.findIndex(
        (h) => h.source === 'fill' && !h.pinned && h.hand !== null && !beside(h, at, h.hand),
      );
      if (k < 0 || c.some((h) => h.voice === voice) || !room.voice(at, voice)) continue;
      c[k] = { ...(c[k] as WorkHit), voice };
      return;
    }
  };
  let changed = false;
  for (let at = 0; at < n; at++) {
    const cell = cells[at] ?? [];
    for (let k = cell.length - 1; k >= 0; k--) {
      const hit = cell[k] as WorkHit;
      if (hit.source !== 'fill' || hit.pinned || hit.hand === null) continue;
      if (!beside(hit, at, hit.hand)) continue;
      const to = otherHand(hit.hand);
      changed = true;
      if (!cell.some((h) => h !== hit && h.hand === to) && !beside(hit, at, to)) {
        // The sticking, assigned again, keeps the move or removes a fill stroke near it.
        hit.steer = to;
        hit.hand = to;
        continue;
      }
      cell.splice(k, 1);
      keepVoice(hit.voice, at);
      if (!cell.some((h) => h.voice === 'kick') && room.kick(at, cells))
        cell.splice(k, 0, {
          voice: 'kick',
          source: 'fill',
          dynamic: 'normal',
          rule: hit.rule,
          hand: null,
        });
    }
  }
  return changed;
}
