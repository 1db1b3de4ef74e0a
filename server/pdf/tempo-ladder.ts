import type { TempoLadder } from './worksheet-print';

/** Most rungs a printed ladder shows; a finer ladder is thinned to its ends and even steps. */
export const MAX_RUNGS = 12;

/**
 * The tempos of a ladder, from start to target in steps of `step` (up or down), the target always
 * last even when the step does not divide the distance.
 */
export function ladderRungs(ladder: TempoLadder): number[] {
  const { start, target } = ladder;
  const step = Math.max(1, Math.abs(ladder.step));
  const direction = target >= start ? 1 : -1;
  const rungs: number[] = [];
  for (let t = start; direction * (target - t) > 0; t += direction * step) rungs.push(t);
  rungs.push(target);
  if (rungs.length <= MAX_RUNGS) return rungs;
  // Keep the first and last, and evenly spread rungs between them.
  return Array.from({ length: MAX_RUNGS }, (_, i) =>
    i === MAX_RUNGS - 1 ? target : rungs[Math.round((i * (rungs.length - 1)) / (MAX_RUNGS - 1))]!,
  );
}
