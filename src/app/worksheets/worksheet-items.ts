import type { Aids, ItemSource, Ladder } from './worksheets-api';

/** The card's tempo bounds, which every rung of a ladder keeps to. */
export const MIN_TEMPO = 20;
export const MAX_TEMPO = 320;
export const MAX_RUNGS = 24;

/** An item on the editor's list; `key` tells rows apart while they move. */
export interface EditorItem {
  readonly key: number;
  readonly source: ItemSource;
  readonly title: string;
  readonly tempo: number | null;
  readonly problem: string | null;
  readonly ladder: Ladder;
  readonly aids: Aids;
}

/** From 20 below the drill's tempo (not under 20) up to it, in steps of 4, as the server does. */
export function defaultLadder(tempo: number): Ladder {
  return { start: Math.max(MIN_TEMPO, tempo - 20), target: tempo, step: 4 };
}

/** The tempos printed as the ladder's rungs: every step from the start, then the target. */
export function rungs(ladder: Ladder): number[] {
  if (ladderProblem(ladder)) return [];
  const tempos: number[] = [];
  for (let tempo = ladder.start; tempo < ladder.target; tempo += ladder.step) tempos.push(tempo);
  tempos.push(ladder.target);
  return tempos;
}

/** What is wrong with a ladder, in the teacher's words, or null. */
export function ladderProblem(ladder: Ladder): string | null {
  const whole = (n: number) => Number.isInteger(n);
  for (const [name, tempo] of [
    ['start', ladder.start],
    ['target', ladder.target],
  ] as const) {
    if (!whole(tempo) || tempo < MIN_TEMPO || tempo > MAX_TEMPO) {
      return `The ${name} tempo is ${MIN_TEMPO} to ${MAX_TEMPO} beats per minute.`;
    }
  }
  if (!whole(ladder.step) || ladder.step < 1) return 'The step is at least 1 beat per minute.';
  if (ladder.start > ladder.target) return 'The target tempo is below the start: a ladder climbs.';
  const count = Math.ceil((ladder.target - ladder.start) / ladder.step) + 1;
  if (count > MAX_RUNGS) {
    return `That makes ${count} rungs; a ladder has at most ${MAX_RUNGS}. Take a larger step.`;
  }
  return null;
}

/** The list with the item at `from` moved to `to` (both clamped to the list). */
export function moveItem<T>(items: readonly T[], from: number, to: number): T[] {
  const next = [...items];
  if (from < 0 || from >= next.length) return next;
  const target = Math.max(0, Math.min(next.length - 1, to));
  const [moved] = next.splice(from, 1);
  next.splice(target, 0, moved as T);
  return next;
}
