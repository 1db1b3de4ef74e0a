import type { Dynamic, HitSource, VoiceId } from '../drill';

/**
 * A hit that a part of the card asks for: the obligations placed before any fill. `rule` is the
 * index of the rule in `card.rules`, or -1 for the ostinato.
 */
export interface Placement {
  readonly instant: number;
  readonly voice: VoiceId;
  readonly source: HitSource;
  readonly dynamic: Dynamic;
  readonly rule: number;
}

/** Precedence of sources when two parts want one voice at one instant (lower wins). */
export const SOURCE_RANK: Readonly<Record<HitSource, number>> = {
  ostinato: 0,
  backbeat: 1,
  avoidDownbeat: 2,
  phrase: 3,
  polyrhythm: 4,
  euclid: 5,
  anchor: 6,
  fill: 7,
};
