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
 * 5. a tension curve with two or more different targets, while every bar must sound the same: no
 *    slot anywhere is open to a fill (docs/engine.md, "Voice roles": fills go to anchor voices
 *    and to embellishment voices a fillHoles rule lists, embellishments only where the ostinato
 *    rests and off the downbeats kept free, never on a euclid or polyrhythm voice) and the fixed notes repeat bar for bar; the rank order is strict, so equal
 *    bars cannot keep it;
 * 7. a phrase's fill bar whose fill beats are all taken by notes other rules fix (docs/engine.md,
 *    "Phrases": a fill keeps at least one slot free of other rules);
 * 6. the same, when every bar measures 0 on the Longuet-Higgins & Lee measure because no note
 *    that counts (fills and rule notes; time layers are left out) can sound on a position with a
 *    strictly stronger position after it in the bar: a syncopation needs a note on a weaker
 *    position followed by silence on a stronger one (H. C. Longuet-Higgins, C. S. Lee, "The
 *    rhythmic interpretation of monophonic music", Music Perception 1(4), 1984).
 *
 * Besides these proofs it names one reason of sticking policy, which explains a refusal but does
 * not make a drill for the card wrong (the oracle checks it on presets only):
 * 4. the leading hand must play the time cymbal's whole pattern (docs/engine.md, "Sticking"),
 *    and that pattern puts three notes in a row on a grid at least as fast as sixteenths at
 *    120 BPM, which a single hand should not play without doubles (issue 8, "Tests").
 */
import {
  FAR_SIDE_FOR_LEFT_HAND,
  FAR_SIDE_FOR_RIGHT_HAND,
  isHand,
  rulesOf,
  TIME_CYMBALS,
  type Voice,
} from './card';
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

  if (plan.targets && new Set(plan.targets).size > 1 && barsCannotDiffer(plan))
    reasons.push('every bar must sound the same, but the tension curve asks them to differ');
  for (const bar of plan.fillBars) {
    const from = grid.downbeat(bar);
    const window = [...plan.fillWindow].filter((i) => i >= from && i < from + grid.slotsPerBar);
    // Under a linear rule whose budget the bar's fixed notes already spend, a slot where a foot
    // keeps time is taken too: a fill note there would be one overlap more.
    const budget = Math.min(Infinity, ...rulesOf(card, 'linear').map((r) => r.maxOverlaps));
    let together = 0;
    for (let i = from; i < from + grid.slotsPerBar; i++)
      if ((byIndex.get(i)?.size ?? 0) >= 2) together += 1;
    const taken = (i: number): boolean =>
      plan.wants.some(
        (w) =>
          w.index === i &&
          w.part !== 'phrase' &&
          (w.part !== 'ostinato' || (!isHand(w.voice) && together >= budget)),
      ) || plan.freeDownbeats.has(i);
    if (window.length > 0 && window.every(taken))
      reasons.push(`the fill of bar ${bar} has no slot that other rules leave free`);
  }
  if (plan.targets && new Set(plan.targets).size > 1 && nothingCanSyncopate(plan))
    reasons.push('no note can sound before a stronger silent position, so every bar measures 0');

  // 5. (policy) The leading hand keeps the time cymbal; where another hand voice must sound with
  // it on the other hand's far side of the kit, the arms would cross both ways (docs/engine.md,
  // "Sticking": an open-handed lead is the way out).
  const timeCymbal = card.timeLayers.find((l) => TIME_CYMBALS.has(l.voice))?.voice;
  if (timeCymbal && isHand(timeCymbal) && card.lead !== 'alternate') {
    const otherFar = (v: string): boolean =>
      (card.lead === 'right') === (card.hand === 'right')
        ? FAR_SIDE_FOR_LEFT_HAND.has(v)
        : FAR_SIDE_FOR_RIGHT_HAND.has(v);
    for (const [index, voices] of byIndex)
      if (
        voices.has(timeCymbal) &&
        [...voices].some((v) => v !== timeCymbal && isHand(v) && otherFar(v))
      ) {
        policy.push(`the time cymbal and a far-side voice for the other hand meet at ${at(index)}`);
        break;
      }
  }

  // 6. (policy) Two hand time layers at one instant: the leading hand keeps the time, so one of
  // them goes to the other hand and may take it across the kit.
  const handTimes = card.timeLayers.filter((l) => isHand(l.voice)).map((l) => l.voice);
  for (const [index, voices] of byIndex)
    if (handTimes.filter((v) => voices.has(v)).length >= 2) {
      policy.push(`two hand time layers meet at ${at(index)}`);
      break;
    }

  // 7. (policy) With a leading hand, it keeps every hand time note. A time note on its far side
  // of the kit with another fixed hand note on the other hand's far side at the next (or the
  // previous) grid note of a run leaves no sticking: the leading hand would leap across the
  // kit, the other hand would cross arms with it (docs/engine.md, "Sticking"; common practice).
  if (card.lead !== 'alternate') {
    const leadHand = card.lead === 'right' ? 'R' : 'L';
    const farFor = (hand: 'R' | 'L', v: string): boolean =>
      (hand === 'R') === (card.hand === 'right')
        ? FAR_SIDE_FOR_RIGHT_HAND.has(v)
        : FAR_SIDE_FOR_LEFT_HAND.has(v);
    const other = leadHand === 'R' ? 'L' : 'R';
    const n = grid.totalSlots;
    for (let i = 0; i < n; i++) {
      const time = plan.wants.some(
        (w) =>
          w.index === i && w.part === 'ostinato' && isHand(w.voice) && farFor(leadHand, w.voice),
      );
      if (!time) continue;
      // The note before (reached at its own slot's rate) and the note after (at this one's).
      const before = (i + n - 1) % n;
      const beside = [
        ...(grid.notesPerMinuteAt(before, card.tempo) >= 240 ? [before] : []),
        ...(grid.notesPerMinuteAt(i, card.tempo) >= 240 ? [(i + 1) % n] : []),
      ];
      if (
        beside.some((j) =>
          plan.wants.some((w) => w.index === j && isHand(w.voice) && farFor(other, w.voice)),
        )
      ) {
        policy.push(
          `the time at ${at(i)} and a note beside it lie on the two far sides of the kit`,
        );
        break;
      }
    }
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

/** Slots where some fill voice may sound (docs/engine.md, "Voice roles"). */
export function fillableSlots(plan: Plan): Set<number> {
  const { card, grid } = plan;
  const open = new Set<number>();
  const named = new Set(rulesOf(card, 'fillHoles').flatMap((r) => r.voices));
  const fillable = card.voices.filter((v) => {
    const role = card.roles.get(v);
    if (plan.figureVoices.has(v)) return false;
    return role === 'anchor' || (role === 'embellishment' && named.has(v));
  });
  const embellishing = (v: Voice): boolean => card.roles.get(v) === 'embellishment' || named.has(v);
  const silentAt = new Set(plan.silent.map((x) => key(x.voice, x.index)));
  const ostinatoAt = (i: number): boolean =>
    card.ostinato !== null &&
    (plan.wantedBy.get(key(card.ostinato.voice, i)) ?? []).some((w) => w.part === 'ostinato');
  for (let i = 0; i < grid.totalSlots; i++) {
    const wanted = plan.wants.filter((w) => w.index === i);
    if (wanted.some((w) => w.part !== 'ostinato') || plan.fillWindow.has(i)) continue;
    if (plan.movedHomes.has(i)) continue;
    for (const v of fillable) {
      if (wanted.some((w) => w.voice === v)) continue;
      if (grid.place(i).slot % (card.fillStep.get(v) ?? 1) !== 0) continue;
      if (embellishing(v)) {
        if (!ostinatoAt(i) && !plan.freeDownbeats.has(i)) {
          open.add(i);
          break;
        }
      } else if (!silentAt.has(key(v, i))) {
        open.add(i);
        break;
      }
    }
  }
  return open;
}

/** True when no slot is open to a fill and the notes the card fixes repeat in every bar. */
function barsCannotDiffer(plan: Plan): boolean {
  const { card, grid } = plan;
  if (fillableSlots(plan).size > 0) return false;
  const silentAt = new Set(plan.silent.map((x) => key(x.voice, x.index)));
  // The fixed notes bar by bar (anchors on the downbeat where nothing keeps them off).
  const signature = (bar: number): string => {
    const from = grid.downbeat(bar);
    const notes = plan.wants
      .filter((w) => w.index >= from && w.index < from + grid.slotsPerBar)
      .map((w) => `${w.voice}@${w.index - from}`);
    for (const v of card.voices)
      if (
        card.roles.get(v) === 'anchor' &&
        !plan.figureVoices.has(v) &&
        !silentAt.has(key(v, from))
      )
        notes.push(`${v}@0`);
    return [...new Set(notes)].sort().join(' ');
  };
  const first = signature(1);
  for (let bar = 2; bar <= card.bars; bar++) if (signature(bar) !== first) return false;
  return true;
}

/** Depth at which `index` first starts a node when `n` splits into its primes, smallest first. */
function levelIn(index: number, n: number): number {
  if (index === 0) return 0;
  let size = n;
  let level = 0;
  for (let p = 2; size > 1;) {
    if (size % p !== 0) {
      p++;
      continue;
    }
    size /= p;
    level++;
    if (index % size === 0) return level;
  }
  return level + 1;
}

/** Metrical level of each beat start in the bar (0 = the downbeat), by grouping when given. */
function beatLevels(card: Plan['card']): number[] {
  const beats = card.beatsPerBar;
  if (!card.grouping) return Array.from({ length: beats }, (_, b) => levelIn(b, beats));
  const groups = card.grouping;
  let depth = 0;
  for (let n = groups.length, p = 2; n > 1;)
    if (n % p === 0) {
      n /= p;
      depth++;
    } else p++;
  const out: number[] = [];
  groups.forEach((size, g) => {
    for (let k = 0; k < size; k++) out.push(k === 0 ? levelIn(g, groups.length) : depth + 1);
  });
  return out;
}

/** True when no note that counts can sit before a strictly stronger position of its bar. */
function nothingCanSyncopate(plan: Plan): boolean {
  const { card, grid } = plan;
  if (card.measure !== 'lhl') return false;
  const levels = beatLevels(card);
  const strongerLater = (beat: number, slot: number): boolean => {
    // A later beat start is stronger than any slot inside a beat, and than a weaker beat start.
    if (slot > 0 && beat < card.beatsPerBar) return true;
    if (slot === 0) {
      for (let b = beat + 1; b <= card.beatsPerBar; b++)
        if ((levels[b - 1] ?? 0) < (levels[beat - 1] ?? 0)) return true;
      return false;
    }
    const slots = grid.slotsIn(beat);
    for (let s = slot + 1; s < slots; s++)
      if (levelIn(s, slots) < levelIn(slot, slots)) return true;
    return false;
  };
  const open = fillableSlots(plan);
  for (let i = 0; i < grid.totalSlots; i++) {
    const counts = open.has(i) || plan.wants.some((w) => w.index === i && w.part !== 'ostinato');
    if (!counts) continue;
    const { beat, slot } = grid.place(i);
    if (strongerLater(beat, slot)) return false;
  }
  return true;
}
