/**
 * A small, independent feasibility reasoner: it proves a card impossible from the notes the card
 * fixes (plan.ts), in the common ways a card can be impossible. A refusal (RuleConflictError) is
 * accepted only when this reasoner finds a reason; it never reads the engine's message.
 *
 * The reasons, each a plain consequence of the drill contract and docs/engine.md:
 * 1. one voice must play and must stay silent at one instant (e.g. a Euclidean kick, an ostinato
 *    or a phrase landing on a downbeat an avoidDownbeat rule keeps free);
 * 2. more than two hand voices must play at one instant (a drummer has two hands);
 * 3. a bar holds more instants where two or more voices must strike together than a linear rule
 *    allows (each voice at an instant takes a limb of its own);
 *
 * Besides these proofs it names one reason of sticking policy, which explains a refusal but does
 * not make a drill for the card wrong (the oracle checks it on presets only):
 * 4. the leading hand must play the time cymbal's whole pattern (docs/engine.md, "Sticking"),
 *    and that pattern puts three notes in a row on a grid at least as fast as sixteenths at
 *    120 BPM, which a single hand should not play without doubles (issue 8, "Tests").
 */
import { isHand, rulesOf } from './card';
import { key, type Plan } from './plan';

export interface Feasibility {
  /** Proofs that no drill can keep every rule. */
  readonly impossible: readonly string[];
  /** Sticking-policy reasons that explain a refusal without proving the card impossible. */
  readonly policy: readonly string[];
}

export function reasonAbout(plan: Plan): Feasibility {
  const reasons: string[] = [];
  const policy: string[] = [];
  const { grid, card } = plan;
  const at = (index: number): string => grid.describe(index);

  for (const s of plan.silent) {
    const wanted = plan.wantedBy.get(key(s.voice, s.index)) ?? [];
    if (wanted.length > 0)
      reasons.push(
        `${s.voice} must stay off ${at(s.index)} (${s.why}) but ${wanted[0]!.why} puts it there`,
      );
  }

  const byIndex = new Map<number, Set<string>>();
  for (const w of plan.wants) {
    const set = byIndex.get(w.index) ?? new Set<string>();
    set.add(w.voice);
    byIndex.set(w.index, set);
  }
  for (const [index, voices] of byIndex) {
    const hands = [...voices].filter(isHand);
    if (hands.length > 2)
      reasons.push(`${hands.join(', ')} must all play at ${at(index)}, with two hands`);
  }

  for (const rule of rulesOf(card, 'linear'))
    for (let bar = 1; bar <= card.bars; bar++) {
      let together = 0;
      for (let i = grid.downbeat(bar); i < grid.downbeat(bar) + grid.slotsPerBar; i++)
        if ((byIndex.get(i)?.size ?? 0) >= 2) together += 1;
      if (together > rule.maxOverlaps)
        reasons.push(
          `bar ${bar} needs ${together} instants with two limbs, the linear rule allows ${rule.maxOverlaps}`,
        );
    }

  const lead = card.ostinato;
  if (lead && isHand(lead.voice) && card.lead !== 'alternate' && !card.doubles) {
    const plays = (i: number): boolean =>
      (
        plan.wantedBy.get(
          key(lead.voice, ((i % grid.totalSlots) + grid.totalSlots) % grid.totalSlots),
        ) ?? []
      ).some((w) => w.part === 'ostinato');
    const fast = (i: number): boolean => grid.notesPerMinuteAt(i, card.tempo) >= 480;
    for (let i = 0; i < grid.totalSlots; i++)
      if (plays(i) && plays(i + 1) && plays(i + 2) && fast(i) && fast(i + 1)) {
        policy.push(
          `the leading hand plays the ${lead.voice} ostinato three grid notes in a row from ${at(i)} at ${card.tempo} BPM`,
        );
        break;
      }
  }
  return { impossible: reasons, policy };
}
