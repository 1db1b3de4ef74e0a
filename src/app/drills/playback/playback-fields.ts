import type { ErrorStateMatcher } from '@angular/material/core';

/**
 * What is wrong with the playback panel's number fields, in words for their `<mat-error>`. A
 * field that fails keeps what was typed and the panel keeps playing with the value in use: an
 * entry is refused out loud, never clamped or swapped behind the user's back.
 */

/** A whole-number field's range, both ends included. */
export interface WholeRange {
  readonly min: number;
  readonly max: number;
}

/** "20–320" (an en dash, as ranges are printed). */
export function rangeText(range: WholeRange): string {
  return `${range.min}–${range.max}`;
}

/**
 * What is wrong with a number typed into a field (`null` when the field is empty or not a
 * number), or null when it is a whole number inside `range`. `name` starts the sentence
 * ("Tempo"), `unit` follows the range (" BPM").
 */
export function wholeNumberProblem(
  value: number | null,
  range: WholeRange,
  name: string,
  unit = '',
): string | null {
  const allowed = `${rangeText(range)}${unit}`;
  if (value === null || !Number.isFinite(value)) return `${name}: type a number, ${allowed}.`;
  if (!Number.isInteger(value)) return `${name} must be a whole number, ${allowed}.`;
  if (value < range.min || value > range.max) return `${name} must be ${allowed}.`;
  return null;
}

/** Problems of the "Loop bars" fields; the loop runs from `from` to `to`, both included. */
export function loopBarProblems(
  from: number | null,
  to: number | null,
  barCount: number,
): { readonly from: string | null; readonly to: string | null } {
  const range = { min: 1, max: barCount };
  const problems = {
    from: wholeNumberProblem(from, range, 'From bar'),
    to: wholeNumberProblem(to, range, 'To bar'),
  };
  if (problems.from !== null || problems.to !== null || from === null || to === null) {
    return problems;
  }
  if (from > to) {
    return {
      from: `From bar ${from} comes after To bar ${to}.`,
      to: `To bar must be ${from} or later (the loop runs forward).`,
    };
  }
  return problems;
}

/** Which way the tempo trainer moves: up to the target, or down to it on purpose. */
export type TrainerDirection = 'up' | 'down';

export interface TrainerDraft {
  readonly start: number | null;
  readonly step: number | null;
  readonly every: number | null;
  readonly target: number | null;
  readonly direction: TrainerDirection;
}

export type TrainerProblems = Readonly<
  Record<'start' | 'step' | 'every' | 'target', string | null>
>;

export const TRAINER_STEP_RANGE: WholeRange = { min: 1, max: 100 };
export const TRAINER_EVERY_RANGE: WholeRange = { min: 1, max: 64 };

/**
 * Problems of the tempo trainer's fields. Speeding up needs a start below the target; slowing
 * down (a descending ladder, chosen on purpose) needs a start above it.
 */
export function trainerProblems(draft: TrainerDraft, tempoRange: WholeRange): TrainerProblems {
  const problems = {
    start: wholeNumberProblem(draft.start, tempoRange, 'Start', ' BPM'),
    step: wholeNumberProblem(draft.step, TRAINER_STEP_RANGE, 'Step', ' BPM'),
    every: wholeNumberProblem(draft.every, TRAINER_EVERY_RANGE, 'Every', ' loops'),
    target: wholeNumberProblem(draft.target, tempoRange, 'Target', ' BPM'),
  };
  const { start, target } = draft;
  if (problems.start !== null || problems.target !== null || start === null || target === null) {
    return problems;
  }
  if (start === target) {
    return { ...problems, start: `Start and target are both ${start} BPM: nothing to train.` };
  }
  if (draft.direction === 'up' && start > target) {
    return {
      ...problems,
      start: `Speeding up starts below the target (${target} BPM). Lower the start, or choose "Slow down".`,
    };
  }
  if (draft.direction === 'down' && start < target) {
    return {
      ...problems,
      start: `Slowing down starts above the target (${target} BPM). Raise the start, or choose "Speed up".`,
    };
  }
  return problems;
}

/** Whether none of a set of problems is set. */
export function allClear(problems: Readonly<Record<string, string | null>>): boolean {
  return Object.values(problems).every((problem) => problem === null);
}

/**
 * Shows a field's `<mat-error>` whenever `problem` reports one (the fields have no form
 * validators, so Material's default, invalid and touched, would never show it).
 */
export function errorWhen(problem: () => string | null): ErrorStateMatcher {
  return { isErrorState: () => problem() !== null };
}
