import type { DrillHit, Hand, HitSource, RuleCard, VoiceId } from '../../generator/index';
import { isHandVoice } from '../../generator/index';
import { samePlace, type PlainBar, type PlainHit } from './infer-card';

/** The slots per beat of the card's grid at a beat (1-based). */
export const gridAt = (card: RuleCard, beat: number): number =>
  typeof card.subdivision === 'number' ? card.subdivision : (card.subdivision[beat - 1] ?? 4);

/**
 * Which part of the card would have placed a hit: the ostinato's voice on its slots, the
 * backbeat's voice on its beats, the kick on beat 1 (anchor), the crash on bar 1's downbeat
 * (colour, source `anchor`); every other hit is a fill.
 */
export function sourceOf(card: RuleCard, barNo: number, slots: number, hit: PlainHit): HitSource {
  const ost = card.ostinato;
  if (ost && hit.voice === ost.voice) {
    const n = gridAt(card, hit.beat);
    if (ost.slots.some((k) => samePlace(hit.slot, slots, k, n))) return 'ostinato';
  }
  for (const rule of card.rules) {
    if (
      rule.kind === 'backbeat' &&
      rule.voice === hit.voice &&
      hit.slot === 0 &&
      rule.beats.includes(hit.beat)
    ) {
      return 'backbeat';
    }
  }
  const downbeat = hit.beat === 1 && hit.slot === 0;
  if (downbeat && card.roles[hit.voice] === 'anchor') return 'anchor';
  if (downbeat && barNo === 1 && card.roles[hit.voice] === 'colour') return 'anchor';
  return 'fill';
}

/**
 * Where each voice sits from the hi-hat side to the ride side of a right-handed kit (common
 * practice, as in docs/engine.md, The kit), for sticking two hands at one instant.
 */
const KIT_ORDER: readonly VoiceId[] = [
  'hihat',
  'hihatOpen',
  'snare',
  'rim',
  'crash',
  'tomHigh',
  'tomMid',
  'tomFloor',
  'ride',
  'rideBell',
];

/** Which hand voices stay when more than two sound at once: the crash replaces the time. */
const KEEP_ORDER: readonly VoiceId[] = [
  'crash',
  'snare',
  'rim',
  'tomHigh',
  'tomMid',
  'tomFloor',
  'hihatOpen',
  'hihat',
  'ride',
  'rideBell',
];

/**
 * Hands for one instant of a right-handed player: the time cymbal in the right hand (crossed
 * over to the hi-hat, the usual grip) and the other note in the left; otherwise the left hand
 * on the left of the kit; a lone note in the right hand on the beat's even slots and the left on
 * the odd ones (natural sticking; common practice). Returns the hits kept (at most two hand
 * voices) and the voices left out.
 */
export function stickInstant(
  hits: readonly (Omit<DrillHit, 'hand'> & { hand?: Hand | null })[],
  timeVoice: VoiceId | null,
): { kept: DrillHit[]; dropped: VoiceId[] } {
  const feet = hits.filter((h) => !isHandVoice(h.voice)).map((h) => ({ ...h, hand: null }));
  const hands = hits
    .filter((h) => isHandVoice(h.voice))
    .sort((a, b) => KEEP_ORDER.indexOf(a.voice) - KEEP_ORDER.indexOf(b.voice));
  const playing = hands.slice(0, 2);
  const dropped = hands.slice(2).map((h) => h.voice);
  let stuck: DrillHit[];
  if (playing.length === 2) {
    const [a, b] = playing as [(typeof playing)[number], (typeof playing)[number]];
    const timeFirst = a.voice === timeVoice ? a : b.voice === timeVoice ? b : null;
    const left =
      timeFirst !== null
        ? timeFirst === a
          ? b
          : a
        : KIT_ORDER.indexOf(a.voice) <= KIT_ORDER.indexOf(b.voice)
          ? a
          : b;
    stuck = playing.map((h) => ({ ...h, hand: h === left ? 'L' : 'R' }));
  } else {
    stuck = playing.map((h) => ({
      ...h,
      hand: h.voice === timeVoice || h.slot % 2 === 0 ? 'R' : 'L',
    }));
  }
  return { kept: [...feet, ...stuck], dropped };
}

/** Hits ordered as drills keep them: beat, slot, then voice id as a plain string. */
export function byPlace(a: DrillHit, b: DrillHit): number {
  return a.beat - b.beat || a.slot - b.slot || (a.voice < b.voice ? -1 : a.voice > b.voice ? 1 : 0);
}

export type { PlainBar };
