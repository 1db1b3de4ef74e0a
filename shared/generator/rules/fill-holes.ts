import type { Dynamic, VoiceId } from '../drill';
import type { Rng } from '../random';
import type { FillHolesRule, RuleCard } from '../schema';
import { lineVoices } from './anchor';

/**
 * Which fillHoles rule governs each voice's embellishments (the first rule that lists it).
 * Those voices are filled only in the holes, the slots where the ostinato rests.
 */
export function fillHolesOwners(card: RuleCard): Map<VoiceId, number> {
  const owners = new Map<VoiceId, number>();
  card.rules.forEach((rule, index) => {
    if (rule.kind !== 'fillHoles') return;
    for (const voice of rule.voices) if (!owners.has(voice)) owners.set(voice, index);
  });
  return owners;
}

/**
 * Voices the density fill may use: anchors (the kick moves under the groove), and embellishments
 * only where a fillHoles rule lists them, so ghost notes appear only where the card asks for
 * them (common practice: a written groove has no ghost notes unless the teacher adds them).
 * Never a time-keeper or a colour, and never a voice whose euclid or polyrhythm line would be
 * blurred by extra notes.
 */
export function fillVoices(card: RuleCard): VoiceId[] {
  const lines = lineVoices(card);
  const named = fillHolesOwners(card);
  return card.voices.filter((voice) => {
    const role = card.roles[voice];
    if (lines.has(voice)) return false;
    return role === 'anchor' || (role === 'embellishment' && named.has(voice));
  });
}

/**
 * Voices filled as embellishments: ghosted by default, only in the holes of the ostinato, never
 * on a downbeat the card keeps free. A voice a fillHoles rule lists is one, whatever its role.
 */
export function embellishmentVoices(card: RuleCard): Set<VoiceId> {
  const out = new Set<VoiceId>(fillHolesOwners(card).keys());
  for (const voice of card.voices) if (card.roles[voice] === 'embellishment') out.add(voice);
  return out;
}

/**
 * How many of `count` embellishments a rule marks ghost and accent: the shares rounded, with
 * accents taking what the ghosts leave.
 */
export function shareCounts(rule: FillHolesRule, count: number): { ghost: number; accent: number } {
  const ghost = Math.min(count, Math.round(rule.ghost * count));
  const accent = Math.min(count - ghost, Math.round(rule.accent * count));
  return { ghost, accent };
}

/**
 * Dynamics for the `free` of a rule's `total` embellishments in time order, in a seeded
 * arrangement, so that with the `kept` ones (ghost and accent counts of notes that keep theirs)
 * the rule's shares hold over all of them; null when the kept notes leave no way to.
 */
export function embellishmentDynamics(
  rule: FillHolesRule,
  total: number,
  free: number,
  kept: { ghost: number; accent: number },
  rng: Rng,
): Dynamic[] | null {
  const need = freeShares(rule, total, free, kept);
  if (!need) return null;
  const dynamics: Dynamic[] = [];
  for (let i = 0; i < free; i++)
    dynamics.push(i < need.ghost ? 'ghost' : i < need.ghost + need.accent ? 'accent' : 'normal');
  return rng.shuffle(dynamics);
}

/** The ghost and accent counts the free notes must carry, or null when none can do. */
export function freeShares(
  rule: FillHolesRule,
  total: number,
  free: number,
  kept: { ghost: number; accent: number },
): { ghost: number; accent: number } | null {
  const want = shareCounts(rule, total);
  const ghost = want.ghost - kept.ghost;
  const accent = want.accent - kept.accent;
  return ghost < 0 || accent < 0 || ghost + accent > free ? null : { ghost, accent };
}
