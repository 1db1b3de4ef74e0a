import type { ErrorStateMatcher } from '@angular/material/core';

/** Longest seed the drill pages accept; seeds are words, not documents. */
export const MAX_SEED_LENGTH = 64;

/** What is wrong with a typed seed, in words for the field's error, or null when it is fine. */
export function seedProblem(seed: string): string | null {
  const trimmed = seed.trim();
  if (trimmed === '') return 'Type a seed: any word or number.';
  if (trimmed.length > MAX_SEED_LENGTH) return `A seed has at most ${MAX_SEED_LENGTH} characters.`;
  return null;
}

/**
 * Shows a seed field's `<mat-error>` whenever `problem` reports one. The field is a plain
 * signal-bound input with no form validators, so Material's default (invalid and touched) would
 * never show it.
 */
export function seedErrorState(problem: () => string | null): ErrorStateMatcher {
  return { isErrorState: () => problem() !== null };
}
