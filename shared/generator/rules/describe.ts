import type { RuleCard } from '../schema';
import { listWords, voiceWord } from '../words';

/**
 * A part of the card in a teacher's words, for conflict messages: "the hi-hat ostinato",
 * "the backbeat on 2 and 4". `rule` is the index in `card.rules`, -1 for the ostinato.
 */
export function describePart(card: RuleCard, rule: number): string {
  if (rule <= -10) {
    const layer = card.layers[-10 - rule];
    return layer ? `the ${voiceWord(layer.voice)} layer` : 'a time layer';
  }
  if (rule === -3) return 'the kick on one';
  if (rule === -4) return 'a pinned bar';
  if (rule < 0)
    return card.ostinato ? `the ${voiceWord(card.ostinato.voice)} ostinato` : 'the ostinato';
  const r = card.rules[rule];
  if (!r) return 'a rule';
  switch (r.kind) {
    case 'backbeat': {
      const moved =
        r.shift === 0
          ? ''
          : ` moved ${Math.abs(r.shift)} slot${Math.abs(r.shift) === 1 ? '' : 's'} ${r.shift < 0 ? 'early' : 'late'}`;
      return `the backbeat on ${listWords(r.beats)}${moved}`;
    }
    case 'avoidDownbeat':
      return `the avoidDownbeat rule for the ${voiceWord(r.voice)}`;
    case 'polyrhythm':
      return `the ${r.against}-over-${r.span} polyrhythm on the ${listWords(r.voices.map(voiceWord))}`;
    case 'euclid':
      return `the Euclidean E(${r.pulses},${r.steps}) ${voiceWord(r.voice)}`;
    case 'fillHoles':
      return `the fillHoles rule for the ${listWords(r.voices.map(voiceWord))}`;
    case 'linear':
      return r.maxOverlaps === 0
        ? 'the linear rule'
        : `the linear rule (at most ${r.maxOverlaps} overlaps a bar)`;
    case 'tension':
      return 'the tension rule';
    case 'phrase':
      return `the ${r.every}-bar phrase with its fill`;
  }
}

/** The kind names behind parts, for `RuleConflictError.rules`. */
export function partKind(card: RuleCard, rule: number): string {
  if (rule <= -10) return 'layers';
  if (rule === -3) return 'anchor';
  if (rule === -4) return 'keep';
  return rule < 0 ? 'ostinato' : (card.rules[rule]?.kind ?? 'rule');
}
