import type { Grid } from '../grid';
import { otherHand } from './kit';
import { assignHands, type WorkHit } from './assign';
import { fullStrokesCrowded, type Pace } from './limits';
import { frameOf, type StickingCard } from './streams';

const LINE = new Set(['ostinato', 'polyrhythm', 'euclid']);

/**
 * One hand does not accent two strokes in a row closer than full strokes allow
 * (`FULL_STROKES_PER_SECOND`, common practice: an accent is a full stroke from a raised stick;
 * two accents a sixteenth apart at 100 BPM are two of them back to back, whatever the other hand
 * plays between; the left hand's snare on the "&" of 1 and again on 2 at 76 BPM is not). The second
 * (else the first) goes to the other hand where that hand is free and a sticking keeps every
 * rule with it; notes of a line (time, figures) and of kept bars keep their hand. Returns true
 * when it moved one (the hands are assigned again, `steer` holding the move).
 */
export function spreadAccents(card: StickingCard, grid: Grid, cells: WorkHit[][]): boolean {
  const { ticks, pace } = frameOf(grid, card.tempo);
  const n = cells.length;
  let moved = false;
  const tried = new Set<WorkHit>();
  for (let round = 0; round < 8; round++) {
    const pair = crowdedPair(cells, ticks, pace, n, tried);
    if (!pair) break;
    let done = false;
    for (const { hit, at } of pair) {
      if (hit.pinned || LINE.has(hit.source) || hit.hand === null || tried.has(hit)) continue;
      tried.add(hit);
      const to = otherHand(hit.hand);
      if ((cells[at] ?? []).some((h) => h !== hit && h.hand === to)) continue;
      const hands = cells.map((cell) => cell.map((h) => h.hand));
      hit.steer = to;
      if (assignHands(card, grid, cells) === null) {
        done = moved = true;
        break;
      }
      hit.steer = undefined;
      cells.forEach((cell, at) => cell.forEach((h, k) => (h.hand = hands[at]?.[k] ?? null)));
    }
    if (!done) for (const { hit } of pair) tried.add(hit);
  }
  return moved;
}

/** The first two accents in a row on one hand closer than full strokes allow, or null. */
function crowdedPair(
  cells: readonly WorkHit[][],
  ticks: ArrayLike<number>,
  pace: Pace,
  n: number,
  tried: ReadonlySet<WorkHit>,
): { hit: WorkHit; at: number }[] | null {
  for (const hand of ['R', 'L'] as const) {
    const strokes: { hit: WorkHit; at: number }[] = [];
    cells.forEach((cell, at) => {
      for (const hit of cell) if (hit.hand === hand) strokes.push({ hit, at });
    });
    const k = strokes.length;
    for (let s = 0; s < k && k >= 2 && n >= 2; s++) {
      const a = strokes[s]!;
      const b = strokes[(s + 1) % k]!;
      if (a.hit.dynamic !== 'accent' || b.hit.dynamic !== 'accent') continue;
      if (LINE.has(a.hit.source) && LINE.has(b.hit.source)) continue;
      if (tried.has(a.hit) && tried.has(b.hit)) continue;
      let gap = (ticks[b.at] ?? 0) - (ticks[a.at] ?? 0);
      if (gap <= 0) gap += pace.loop;
      if (fullStrokesCrowded(pace, gap)) return [b, a];
    }
  }
  return null;
}
