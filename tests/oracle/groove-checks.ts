/**
 * The oracle's checks of the grooves a teacher would hand out (issue 8, the review of every preset
 * at three seeds): reach on the kit, full strokes into accents, busy feet, the shuffle's silent
 * triplet, accents in a row on one hand. Each reads the drill alone, with its own kit sides and
 * its own times; none shares code with the engine.
 */
import { rulesOf, type Voice } from './card';
import type { HitLike } from './checks';
import type { Plan } from './plan';

interface Hit extends HitLike {
  readonly bar: number;
  readonly index: number;
}

export const GROOVE_CHECKS = [
  'preset/no-reach-past-the-middle-in-one-note',
  'preset/no-full-note-into-an-accent',
  'preset/foot-at-most-two-in-a-beat',
  'preset/shuffle-kick-off-the-middle-triplet',
  'preset/no-accent-after-accent-on-one-hand',
  'preset/backbeat-on-the-free-hand',
  'preset/linear-hands-alternate',
  'preset/moved-backbeat-leaves-its-beat',
] as const;

export type GrooveCheck = (typeof GROOVE_CHECKS)[number];

const LINE = new Set(['ostinato', 'polyrhythm', 'euclid']);

/**
 * A right-handed kit seen from the throne (common practice, the usual five-piece setup): each
 * hand's far side, and the places past the middle of the kit on its own half. The right hand on
 * the hi-hat reaches the snare and the high tom in one quick note, not the mid tom, floor tom or
 * ride; the left hand on the floor tom or ride reaches the toms, not the snare, crash or hi-hat.
 */
const RIGHT_FAR = new Set(['hihat', 'hihatOpen']);
const RIGHT_PAST_MIDDLE = new Set(['tomMid', 'tomFloor', 'ride', 'rideBell']);
const LEFT_FAR = new Set(['tomFloor', 'ride', 'rideBell']);
const LEFT_PAST_MIDDLE = new Set(['hihat', 'hihatOpen', 'snare', 'rim', 'crash']);

export function checkGrooves(
  plan: Plan,
  hits: readonly Hit[],
): { check: GrooveCheck; message: string }[] {
  const out: { check: GrooveCheck; message: string }[] = [];
  const { grid, card } = plan;
  const n = grid.totalSlots;
  const at = new Map<number, Hit[]>();
  for (const h of hits) at.set(h.index, [...(at.get(h.index) ?? []), h]);
  const cell = (i: number): Hit[] => at.get(((i % n) + n) % n) ?? [];
  /** Seconds from slot i to the next slot. */
  const slotSeconds = (i: number): number =>
    60 / grid.notesPerMinuteAt(((i % n) + n) % n, card.tempo);
  /** A run: the grid moves at 4 notes a second or more there (docs/engine.md, "Runs"). */
  const runStep = (i: number): boolean => slotSeconds(i) <= 0.25 + 1e-9;

  // 1. One quick note does not take a hand from its far side past the middle of the kit (the
  // right hand from the mid tom on the "e" to the hi-hat on the "&" at 72 BPM): where a fill note
  // is one of the two, the other hand could have taken it, or the slot stayed empty (common
  // practice: a hand moves a drum or two in a sixteenth, not across the kit).
  const mirrored = card.hand === 'left';
  const farOf = (side: string): Set<string> => ((side === 'R') !== mirrored ? RIGHT_FAR : LEFT_FAR);
  const pastOf = (side: string): Set<string> =>
    (side === 'R') !== mirrored ? RIGHT_PAST_MIDDLE : LEFT_PAST_MIDDLE;
  for (let i = 0; i < n && n > 1; i++) {
    if (!runStep(i)) continue;
    for (const a of cell(i))
      for (const b of cell(i + 1)) {
        if (a.hand === null || a.hand !== b.hand) continue;
        if (a.source !== 'fill' && b.source !== 'fill') continue;
        const far = farOf(a.hand);
        const past = pastOf(a.hand);
        if ((far.has(a.voice) && past.has(b.voice)) || (past.has(a.voice) && far.has(b.voice)))
          out.push({
            check: 'preset/no-reach-past-the-middle-in-one-note',
            message: `hand ${a.hand} goes from the ${a.voice} at ${grid.describe(i)} to the ${b.voice} at the next note`,
          });
      }
  }

  // 2. A fill note at full strength does not sit on the grid note right before an accent of its
  // own hand in a run: the note before an accent is a low tap (a ghost) as the stick comes up, or
  // the other hand's (common practice: the upstroke before an accented downstroke).
  for (let i = 0; i < n && n > 1; i++) {
    if (!runStep(i)) continue;
    for (const a of cell(i))
      for (const b of cell(i + 1))
        if (
          a.hand !== null &&
          a.hand === b.hand &&
          a.source === 'fill' &&
          a.dynamic !== 'ghost' &&
          b.dynamic === 'accent'
        )
          out.push({
            check: 'preset/no-full-note-into-an-accent',
            message: `hand ${a.hand} plays a ${a.dynamic} ${a.voice} at ${grid.describe(i)} straight into its accented ${b.voice}`,
          });
  }

  // 3. A foot plays at most two notes within one beat (the dotted quarter of a compound meter)
  // where the fill added one of them: 1-e-a on the kick, or a kick triplet under a 12/8 shuffle, is
  // too busy for a groove (common practice: a groove's kick plays singles and the odd double).
  const compound = card.grouping !== null && card.grouping.every((g) => g === 3);
  const pulse = compound ? 3 : 1;
  const beatsAt = (h: Hit): number =>
    (h.bar - 1) * card.beatsPerBar + (h.beat - 1) + h.slot / grid.slotsIn(h.beat);
  const span = card.bars * card.beatsPerBar;
  for (const foot of ['kick', 'hihatFoot']) {
    const notes = hits.filter((h) => h.voice === foot).sort((a, b) => a.index - b.index);
    const k = notes.length;
    for (let s = 0; s < k && k >= 3; s++) {
      const three = [notes[s]!, notes[(s + 1) % k]!, notes[(s + 2) % k]!];
      if (three.every((h) => h.source !== 'fill')) continue;
      const width = (((beatsAt(three[2]) - beatsAt(three[0])) % span) + span) % span;
      if (width < pulse - 1e-9)
        out.push({
          check: 'preset/foot-at-most-two-in-a-beat',
          message: `the ${foot} plays three notes within a beat from ${grid.describe(three[0].index)}`,
        });
    }
  }

  // 4. In a shuffle (the time plays the first and last note of every triplet, never the middle
  // one) the kick's own notes favour the beat and the last triplet: a fill kick does not land on
  // the silent middle note (common practice), unless a fillHoles rule asks for the kick in the
  // holes.
  const triples: number[][] = [];
  if (compound && grid.subs.every((s) => s === 1))
    for (let i = 0; i < n; i += 3) triples.push([i, i + 1, i + 2]);
  else
    for (let bar = 1; bar <= card.bars; bar++)
      for (let beat = 1; beat <= card.beatsPerBar; beat++)
        if (grid.slotsIn(beat) === 3) {
          const i = grid.index(bar, beat, 0);
          triples.push([i, i + 1, i + 2]);
        }
  const time = (i: number): boolean =>
    cell(i).some((h) => h.source === 'ostinato' && h.hand !== null);
  const shuffle =
    triples.length > 0 &&
    triples.every(([a, m, b]) => !time(m!) && (plan.fillWindow.has(a!) || (time(a!) && time(b!))));
  const holes = new Set(rulesOf(card, 'fillHoles').flatMap((r) => r.voices as readonly Voice[]));
  if (shuffle)
    for (const [, m] of triples)
      for (const h of cell(m!))
        if (h.hand === null && h.source === 'fill' && !holes.has(h.voice as Voice))
          out.push({
            check: 'preset/shuffle-kick-off-the-middle-triplet',
            message: `fill ${h.voice} on the shuffle's silent middle triplet at ${grid.describe(m!)}`,
          });

  // 5. One hand does not accent two strokes in a row less than a quarter of a second apart (more
  // than 4 full strokes a second), whatever lies between them on the other hand (two accents a
  // sixteenth apart at 100 BPM): the other hand takes one of them where it is free (common
  // practice: an accent is a full stroke from a raised stick and back, slower than a tap; a left
  // hand plays accented eighths at 90 BPM, 0.33 s apart, with ease). Two notes of one line (an
  // accented ride) are the line's.
  for (const side of ['R', 'L']) {
    const strokes = hits.filter((h) => h.hand === side).sort((a, b) => a.index - b.index);
    const k = strokes.length;
    for (let s = 0; s < k && k >= 2; s++) {
      const a = strokes[s]!;
      const b = strokes[(s + 1) % k]!;
      if (a.dynamic !== 'accent' || b.dynamic !== 'accent') continue;
      if (LINE.has(a.source) && LINE.has(b.source)) continue;
      let seconds = 0;
      for (let i = a.index; i !== b.index || seconds === 0; i = (i + 1) % n)
        seconds += slotSeconds(i);
      if (seconds < 0.25 - 1e-9)
        out.push({
          check: 'preset/no-accent-after-accent-on-one-hand',
          message: `hand ${side} accents the ${a.voice} at ${grid.describe(a.index)} and its next stroke, the ${b.voice}, ${seconds.toFixed(3)} s later`,
        });
    }
  }

  // 6. The backbeat is the hand's the time leaves free (common practice: the ostinato hand stays on
  // its cymbal while the other hand is free; a right hand going hi-hat, snare, hi-hat within one
  // eighth while the left waits is not how the late backbeat is written). A backbeat on the time
  // hand is a fault where the other hand strikes nothing at its instant, nor at the grid notes
  // either side of it.
  const timeHands = new Set(
    hits.filter((h) => h.source === 'ostinato' && h.hand !== null).map((h) => h.hand),
  );
  if (timeHands.size === 1 && card.ostinato !== null) {
    const timeHand = [...timeHands][0]!;
    for (const h of hits) {
      if (h.source !== 'backbeat' || h.hand !== timeHand) continue;
      const free = [h.index - 1, h.index, h.index + 1].every(
        (i) => !cell(i).some((x) => x.hand !== null && x.hand !== timeHand),
      );
      if (free)
        out.push({
          check: 'preset/backbeat-on-the-free-hand',
          message: `the ${h.voice} backbeat at ${grid.describe(h.index)} is on the time hand ${timeHand} while the other hand is free`,
        });
    }
  }

  // 7. In a linear groove (no two limbs strike together) the hands alternate: without doubles on the card, no hand plays two grid
  // notes running in a run where the generator's own note is one of them (common practice: linear
  // patterns are written hand to hand, R L R L through the drums; L L from the snare to a tom is a
  // double the card did not ask for).
  const linear = rulesOf(card, 'linear').some((r) => r.maxOverlaps === 0);
  if (linear && !card.doubles)
    for (let i = 0; i < n && n > 1; i++) {
      if (!runStep(i)) continue;
      for (const a of cell(i))
        for (const b of cell(i + 1))
          if (a.hand !== null && a.hand === b.hand && (a.source === 'fill' || b.source === 'fill'))
            out.push({
              check: 'preset/linear-hands-alternate',
              message: `hand ${a.hand} plays the ${a.voice} at ${grid.describe(i)} and the ${b.voice} at the next note`,
            });
    }

  // 8. A backbeat moved early or late leaves its beat empty of the generator's notes (common
  // practice: the point of an early backbeat is the hole where the backbeat used to be; a kick
  // on 2 right after an early snare fills it).
  for (const i of plan.movedHomes)
    for (const h of cell(i))
      if (h.source === 'fill')
        out.push({
          check: 'preset/moved-backbeat-leaves-its-beat',
          message: `fill ${h.voice} at ${grid.describe(i)}, where the moved backbeat used to be`,
        });
  return out;
}
