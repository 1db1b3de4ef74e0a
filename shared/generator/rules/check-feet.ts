import type { Grid } from '../grid';
import type { RuleCard } from '../schema';
import { instantTicks, paceOf, runTicks } from '../sticking/limits';
import { voiceWord } from '../words';
import { where, type Located } from './located';
import type { Violation } from './checker';

/**
 * A foot's fill never makes three notes of that foot within less than a beat (a dotted quarter in
 * a compound meter: 1-e-a on the kick, a kick triplet under a 12/8 shuffle), nor three grid notes
 * running in a run (engine 2.4 and 2.5, `fill-limbs.ts`; common practice: a groove's kick plays
 * singles and the odd double). Notes the card's rules place alone are never a fault here.
 */
export function checkBusyFeet(
  card: RuleCard,
  grid: Grid,
  cells: readonly Located[][],
  out: Violation[],
): void {
  const pace = paceOf(grid, card.tempo);
  const ticks = instantTicks(grid);
  const run = runTicks(pace);
  const grouping = card.meter.grouping;
  const pulse = pace.ticksPerBeat * (grouping?.length && grouping.every((g) => g === 3) ? 3 : 1);
  const n = cells.length;
  const span = (a: number, b: number): number => {
    const gap = (ticks[b] ?? 0) - (ticks[a] ?? 0);
    return gap > 0 ? gap : gap + pace.loop;
  };
  for (const foot of ['kick', 'hihatFoot'] as const) {
    const notes: { at: number; l: Located }[] = [];
    cells.forEach((cell, at) => {
      for (const l of cell) if (l.hit.voice === foot) notes.push({ at, l });
    });
    const k = notes.length;
    for (let s = 0; s < k && k >= 3; s++) {
      const three = [notes[s]!, notes[(s + 1) % k]!, notes[(s + 2) % k]!];
      if (three.every((x) => x.l.hit.source !== 'fill')) continue;
      const running =
        (three[1].at - three[0].at + n) % n === 1 &&
        (three[2].at - three[1].at + n) % n === 1 &&
        span(three[0].at, three[1].at) <= run &&
        span(three[1].at, three[2].at) <= run;
      if (span(three[0].at, three[1].at) + span(three[1].at, three[2].at) < pulse || running)
        out.push({
          code: 'feet',
          message: `The fill gives the ${voiceWord(foot)} three notes ${running ? 'running' : 'within a beat'}.`,
          ...where(three[0].l),
        });
    }
  }
}
