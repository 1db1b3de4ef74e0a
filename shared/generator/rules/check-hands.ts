import { isHandVoice } from '../drill';
import { ticksOf, type Grid } from '../grid';
import { handRested, MAX_HAND_NOTES_PER_SECOND } from '../hands';
import type { RuleCard } from '../schema';
import { voiceWord } from '../words';
import type { Violation } from './checker';
import { where, type Located } from './located';

/**
 * Playability: hands on hand voices and none on feet, at most two hand voices at an instant on
 * different hands, and no hand faster than the single-hand limit, the loop seam included.
 */
export function checkHands(
  card: RuleCard,
  grid: Grid,
  cells: readonly Located[][],
  out: Violation[],
): void {
  const last: Record<'R' | 'L', number | null> = { R: null, L: null };
  const firstStroke: Record<'R' | 'L', number | null> = { R: null, L: null };
  cells.forEach((present, instant) => {
    const hands = present.filter((l) => isHandVoice(l.hit.voice));
    for (const l of present) {
      const footOk = isHandVoice(l.hit.voice)
        ? l.hit.hand === 'R' || l.hit.hand === 'L'
        : l.hit.hand === null;
      if (!footOk)
        out.push({
          code: 'hands',
          message: `The ${voiceWord(l.hit.voice)} has hand ${String(l.hit.hand)}.`,
          ...where(l),
        });
    }
    const first = present[0];
    if (!first) return;
    if (hands.length > 2)
      out.push({
        code: 'hands',
        message: 'More than two hand voices strike at once.',
        ...where(first),
      });
    if (hands.length === 2 && hands[0]?.hit.hand === hands[1]?.hit.hand) {
      out.push({
        code: 'hands',
        message: 'One hand is given two voices at once.',
        ...where(first),
      });
    }
    const now = ticksOf(grid, instant);
    for (const l of hands) {
      const hand = l.hit.hand;
      if (hand !== 'R' && hand !== 'L') continue;
      const before = last[hand];
      if (before !== null && !handRested(grid, card.tempo, now - before)) {
        out.push({
          code: 'hands',
          message: `The ${hand === 'R' ? 'right' : 'left'} hand plays faster than ${MAX_HAND_NOTES_PER_SECOND} notes a second.`,
          ...where(l),
        });
      }
      last[hand] = now;
      firstStroke[hand] ??= now;
    }
  });
  // Drills loop: the last stroke of a hand runs on into its first one.
  const loop = grid.bars * grid.beatsPerBar * grid.ticksPerBeat;
  for (const hand of ['R', 'L'] as const) {
    const a = firstStroke[hand];
    const b = last[hand];
    if (a === null || b === null || handRested(grid, card.tempo, a + loop - b)) continue;
    out.push({
      code: 'hands',
      message: `Looping the drill, the ${hand === 'R' ? 'right' : 'left'} hand plays faster than ${MAX_HAND_NOTES_PER_SECOND} notes a second from the last bar into the first.`,
    });
  }
}
