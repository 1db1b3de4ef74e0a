import { canonicalCard } from '../canonical';
import type { DrillBar } from '../drill';
import { phraseVaries } from '../rules/phrase';
import type { RuleCard } from '../schema';
import { frame } from './frame';
import { place } from './place';
import { prove } from './prove';
import type { Proven } from './stages';

/**
 * The proof of the last few cards (frame, place, prove): it reads the card and the kept bars,
 * never the seed, unless the phrase's fill varies with it. Real use asks for many seeds of one
 * card (a new seed, a worksheet's drills, sweeps), and the proof is about a third of a drill.
 * Only proofs that succeeded are kept: a refusal is worked out (and thrown) again every time.
 * The later stages never write to what a proof holds, except the fill room's pick weights,
 * themselves a memo of a pure function (`pipeline/memo.spec.ts` checks both).
 */
const KEPT_PROOFS = 8;
const proofs = new Map<string, Proven>();
let enabled = true;

/** `prove(place(frame(card, seed), keep), keep)`, from the memo when the card was seen. */
export function provenFor(
  input: RuleCard,
  seed: string,
  keep: readonly DrillBar[] | undefined,
): Proven {
  if (!enabled) return prove(place(frame(input, seed), keep), keep ?? []);
  // The drill hands its card to the caller: a copy of its own, never the one kept here.
  const card = canonicalCard(input);
  const key = keyOf(card, keep);
  if (key === null) return prove(place(frame(input, seed), keep), keep ?? []);
  const known = proofs.get(key);
  if (known) {
    // Newest last, so the oldest is the one let go.
    proofs.delete(key);
    proofs.set(key, known);
    return { ...known, seed, card };
  }
  const framed = frame(input, seed);
  const proven = prove(place(framed, keep), keep ?? []);
  if (phraseVaries(framed.card, framed.grid)) return proven;
  proofs.set(key, proven);
  if (proofs.size > KEPT_PROOFS) proofs.delete(proofs.keys().next().value as string);
  return { ...proven, card };
}

/**
 * The card and kept bars as JSON, or null when JSON would not tell them apart from others (a
 * number that is not finite, or a hole in an array: JSON writes null for both).
 */
function keyOf(card: RuleCard, keep: readonly DrillBar[] | undefined): string | null {
  const key = `${JSON.stringify(card)}\n${keep ? JSON.stringify(keep) : ''}`;
  // Without a null there was nothing JSON had to write as null (feet's hands are null).
  if (!key.includes('null')) return key;
  let faithful = true;
  const note = (_: string, value: unknown): unknown => {
    if (typeof value === 'number' && !Number.isFinite(value)) faithful = false;
    else if (Array.isArray(value) && value.includes(undefined)) faithful = false;
    return value;
  };
  JSON.stringify([card, keep], note);
  return faithful ? key : null;
}

/** Test hook: `false` works every proof out afresh (and forgets the kept ones). */
export function useProofMemo(on: boolean): void {
  enabled = on;
  proofs.clear();
}

/** Test hook: the proofs kept, oldest first. */
export function keptProofs(): readonly Proven[] {
  return [...proofs.values()];
}
