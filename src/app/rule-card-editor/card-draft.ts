import type { z } from 'zod';
import type { RawRuleCardSchema, RuleKind, VoiceId } from '../../../shared/generator/index';

/** The rule card as the teacher writes it: the engine's input type, defaults not yet filled. */
export type CardDraft = z.input<typeof RawRuleCardSchema>;
export type RuleDraft = NonNullable<CardDraft['rules']>[number];

/** What a new card starts from: a plain 4/4 groove a teacher can shape from there. */
export function blankCard(): CardDraft {
  return {
    meter: { beats: 4, unit: 4 },
    bars: 4,
    subdivision: 4,
    tempo: 90,
    voices: ['kick', 'snare', 'hihat'],
    ostinato: { voice: 'hihat', slots: [0, 2], dynamic: 'normal' },
    density: 0.3,
    rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
  };
}

/** Slots per beat for every beat of the bar (a single number repeats for each beat). */
export function beatSlots(card: CardDraft): number[] {
  const beats = card.meter?.beats ?? 4;
  const subdivision = card.subdivision ?? 4;
  return Array.from({ length: beats }, (_, i) =>
    Array.isArray(subdivision) ? (subdivision[i] ?? subdivision.at(-1) ?? 4) : subdivision,
  );
}

/** The voices the card plays (the engine's default when it names none). */
export function cardVoices(card: CardDraft): VoiceId[] {
  return [...(card.voices ?? ['kick', 'snare', 'hihat'])];
}

/** A new rule of `kind`, its voices taken from the card so it is valid as soon as it is added. */
export function newRule(kind: RuleKind, card: CardDraft): RuleDraft {
  const voices = cardVoices(card);
  const pick = (preferred: VoiceId): VoiceId =>
    voices.includes(preferred) ? preferred : (voices[0] ?? preferred);
  const bars = card.bars ?? 4;
  switch (kind) {
    case 'backbeat':
      return {
        kind,
        voice: pick('snare'),
        beats: [2, 4].filter((b) => b <= beatSlots(card).length),
      };
    case 'avoidDownbeat':
      return { kind, voice: pick('kick'), resolveEvery: 0, anticipate: false, landing: 'start' };
    case 'phrase':
      return { kind, every: Math.max(2, Math.min(16, bars)), crash: true };
    case 'fillHoles':
      return { kind, voices: [pick('snare')], ghost: 0.5, accent: 0 };
    case 'linear':
      return { kind, maxOverlaps: 0 };
    case 'polyrhythm':
      return { kind, voices: [pick('kick')], against: 3, span: 2 };
    case 'euclid':
      return { kind, voice: pick('kick'), pulses: 3, steps: 8, rotation: 0 };
    case 'tension':
      // Flat to start with: equal targets constrain nothing until the teacher shapes the curve.
      return { kind, curve: Array.from({ length: Math.min(64, bars) }, () => 0.5) };
  }
}

/** Every rule kind, in the drill contract's order (the add-a-rule menu). */
export const RULE_KINDS: readonly RuleKind[] = [
  'backbeat',
  'avoidDownbeat',
  'phrase',
  'fillHoles',
  'linear',
  'polyrhythm',
  'euclid',
  'tension',
];

/** Rule kinds in the teacher's words. */
export const RULE_KIND_LABELS: Readonly<Record<RuleKind, string>> = {
  backbeat: 'Backbeat',
  avoidDownbeat: 'Avoid the downbeat',
  phrase: 'Phrase fill',
  fillHoles: 'Fill the holes',
  linear: 'Linear (no two limbs at once)',
  polyrhythm: 'Polyrhythm',
  euclid: 'Euclidean rhythm',
  tension: 'Tension curve',
};

/** A one-line summary of a rule, e.g. "Snare on beats 2 and 4". */
export function ruleSummary(rule: RuleDraft): string {
  switch (rule.kind) {
    case 'backbeat':
      return `${rule.voice} on beats ${rule.beats.join(', ')}`;
    case 'avoidDownbeat':
      return `${rule.voice} off beat 1${rule.resolveEvery ? `, lands every ${rule.resolveEvery} bars` : ''}`;
    case 'phrase':
      return `fill every ${rule.every} bars`;
    case 'fillHoles':
      return `${rule.voices.join(' and ')} fill the holes`;
    case 'linear':
      return `at most ${rule.maxOverlaps ?? 0} overlaps per bar`;
    case 'polyrhythm':
      return `${rule.against} against ${rule.span ?? 'one bar of'} beats on ${rule.voices.join(', ')}`;
    case 'euclid':
      return `E(${rule.pulses}, ${rule.steps}) on ${rule.voice}`;
    case 'tension':
      return `${rule.curve.length} target${rule.curve.length === 1 ? '' : 's'}`;
  }
}
