import type { VoiceId } from './drill';
import { defaultGrouping } from './meter';
import { rolesOf } from './roles';
import type { RawRuleCard, Rule, RuleCard } from './schema';

type RawRule = RawRuleCard['rules'][number];

const sortedUnique = (values: readonly number[]): number[] =>
  [...new Set(values)].sort((a, b) => a - b);

/**
 * The card rebuilt with a fixed key order and every default filled in (spans default to one
 * bar; ostinato slots, backbeat beats and bars sorted). Building each object literally, rather
 * than copying, keeps `JSON.stringify` of a drill independent of how the caller built its card.
 */
export function canonicalCard(card: RawRuleCard | RuleCard): RuleCard {
  const ostinato = card.ostinato;
  const grouping = card.meter.grouping ?? defaultGrouping(card.meter);
  const hand = card.hand;
  return {
    meter: {
      beats: card.meter.beats,
      unit: card.meter.unit,
      ...(grouping ? { grouping: grouping.slice() } : {}),
    },
    bars: card.bars,
    subdivision: typeof card.subdivision === 'number' ? card.subdivision : card.subdivision.slice(),
    tempo: card.tempo,
    voices: card.voices.slice(),
    ...(ostinato
      ? {
          ostinato: {
            voice: ostinato.voice,
            slots: sortedUnique(ostinato.slots),
            dynamic: ostinato.dynamic,
          },
        }
      : {}),
    layers: card.layers.map((layer) => ({
      voice: layer.voice,
      slots: sortedUnique(layer.slots),
      ...(layer.beats ? { beats: sortedUnique(layer.beats) } : {}),
      dynamic: layer.dynamic,
    })),
    roles: orderedRoles(card),
    ...(card.fillStep ? { fillStep: orderedSteps(card) } : {}),
    hand,
    sticking: {
      lead: card.sticking?.lead ?? hand,
      doubles: card.sticking?.doubles ?? false,
    },
    ...(card.swing ? { swing: { unit: card.swing.unit, ratio: card.swing.ratio } } : {}),
    measure: card.measure,
    density: card.density,
    rules: card.rules.map((rule) => canonicalRule(rule, card.meter.beats, card.voices)),
  };
}

/** Roles keyed in the card's voice order. */
function orderedRoles(card: RawRuleCard | RuleCard): RuleCard['roles'] {
  const roles = rolesOf(card);
  const out: Partial<Record<VoiceId, (typeof roles)[VoiceId]>> = {};
  for (const voice of card.voices) out[voice] = roles[voice];
  return out;
}

/** Fill steps keyed in the card's voice order (a step of 1 is no limit and is left out). */
function orderedSteps(card: RawRuleCard | RuleCard): NonNullable<RuleCard['fillStep']> {
  const out: Partial<Record<VoiceId, number>> = {};
  for (const voice of card.voices) {
    const step = card.fillStep?.[voice];
    if (step !== undefined && step > 1) out[voice] = step;
  }
  for (const [voice, step] of Object.entries(card.fillStep ?? {}))
    if (!(voice in out) && !card.voices.includes(voice as VoiceId) && step !== undefined)
      out[voice as VoiceId] = step;
  return out;
}

/** Toms high to low, then the snare: the voices a phrase fill goes round by default. */
const FILL_ORDER: readonly VoiceId[] = ['snare', 'tomHigh', 'tomMid', 'tomFloor'];

function canonicalRule(rule: RawRule | Rule, barBeats: number, voices: readonly VoiceId[]): Rule {
  switch (rule.kind) {
    case 'backbeat':
      return {
        kind: rule.kind,
        voice: rule.voice,
        beats: sortedUnique(rule.beats),
        shift: rule.shift,
        ...(rule.bars ? { bars: sortedUnique(rule.bars) } : {}),
        dynamic: rule.dynamic,
      };
    case 'avoidDownbeat':
      return {
        kind: rule.kind,
        voice: rule.voice,
        resolveEvery: rule.resolveEvery,
        anticipate: rule.anticipate,
        landing: rule.landing,
      };
    case 'fillHoles':
      return {
        kind: rule.kind,
        voices: rule.voices.slice(),
        ghost: rule.ghost,
        accent: rule.accent,
      };
    case 'linear':
      return { kind: rule.kind, maxOverlaps: rule.maxOverlaps };
    case 'polyrhythm':
      return {
        kind: rule.kind,
        voices: rule.voices.slice(),
        against: rule.against,
        span: rule.span ?? barBeats,
      };
    case 'euclid':
      return {
        kind: rule.kind,
        voice: rule.voice,
        pulses: rule.pulses,
        steps: rule.steps,
        rotation: rule.rotation,
        span: rule.span ?? barBeats,
      };
    case 'tension':
      return { kind: rule.kind, curve: rule.curve.slice() };
    case 'phrase':
      return {
        kind: rule.kind,
        every: rule.every,
        fillBeats: rule.fillBeats ?? barBeats,
        voices: rule.voices?.slice() ?? FILL_ORDER.filter((voice) => voices.includes(voice)),
        crash: rule.crash,
      };
  }
}
