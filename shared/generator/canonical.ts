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
  return {
    meter: { beats: card.meter.beats, unit: card.meter.unit },
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
    density: card.density,
    rules: card.rules.map((rule) => canonicalRule(rule, card.meter.beats)),
  };
}

function canonicalRule(rule: RawRule | Rule, barBeats: number): Rule {
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
  }
}
