import type { VoiceId } from './drill';
import type { RawRuleCard, VoiceRole } from './schema';

/**
 * What the default roles depend on: the voices that keep time. Loose enough for a card still
 * being written (the editor names the default beside each voice), layers missing meaning none.
 */
export interface RoleSource {
  readonly ostinato?: { readonly voice: VoiceId } | undefined;
  readonly layers?: readonly { readonly voice: VoiceId }[] | undefined;
}

/**
 * Each voice's part in the groove, when the card does not say:
 * - time: the ostinato and its layers, and the hi-hat foot; plays its pattern and nothing else;
 * - anchor: the kick; on beat 1 unless a rule keeps it off, and free to vary under the groove;
 * - colour: the crash; only on the first beat of a phrase;
 * - embellishment: everything else; fills go here, ghosted unless a rule asks for accents.
 */
export function defaultRole(card: RoleSource, voice: VoiceId): VoiceRole {
  if (card.ostinato?.voice === voice || (card.layers ?? []).some((l) => l.voice === voice)) {
    return 'time';
  }
  if (voice === 'hihatFoot') return 'time';
  if (voice === 'crash') return 'colour';
  if (voice === 'kick') return 'anchor';
  return 'embellishment';
}

/** Every card voice's role: the card's own choice, else the default. */
export function rolesOf(
  card: Pick<RawRuleCard, 'ostinato' | 'layers' | 'voices' | 'roles'>,
): Partial<Record<VoiceId, VoiceRole>> {
  const roles: Partial<Record<VoiceId, VoiceRole>> = {};
  for (const voice of card.voices) roles[voice] = card.roles?.[voice] ?? defaultRole(card, voice);
  return roles;
}
