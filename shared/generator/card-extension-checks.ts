import { isHandVoice } from './drill';
import type { RuleCardIssue } from './errors';
import type { Grid } from './grid';
import type { PhraseRule, RuleCard } from './schema';
import { listWords, voiceWord } from './words';

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/** Checks of the grouping, layers, roles and swing against the rest of the card. */
export function checkExtensions(card: RuleCard, grid: Grid, issues: RuleCardIssue[]): void {
  const grouping = card.meter.grouping;
  if (grouping) {
    const sum = grouping.reduce((a, b) => a + b, 0);
    if (sum !== card.meter.beats) {
      issues.push({
        path: 'meter.grouping',
        message: `The grouping ${grouping.join('+')} adds up to ${sum} beats, but the meter has ${card.meter.beats}.`,
      });
    }
  }
  const cardVoices = listWords(card.voices.map(voiceWord));
  const seen = new Set<string>();
  card.layers.forEach((layer, i) => {
    const at = `layers[${i}]`;
    if (!card.voices.includes(layer.voice)) {
      issues.push({
        path: `${at}.voice`,
        message: `Layer ${i + 1} plays the ${voiceWord(layer.voice)}, which is not among the card's voices (${cardVoices}).`,
      });
    }
    if (layer.voice === card.ostinato?.voice || seen.has(layer.voice)) {
      issues.push({
        path: `${at}.voice`,
        message: `Layer ${i + 1}: the ${voiceWord(layer.voice)} already keeps time in another layer; give each layer its own voice.`,
      });
    }
    seen.add(layer.voice);
    const beats = layer.beats ?? grid.beats.map((_, b) => b + 1);
    const far = beats.filter((beat) => beat > card.meter.beats);
    if (far.length > 0) {
      issues.push({
        path: `${at}.beats`,
        message: `Layer ${i + 1} names beat ${listWords(far)}, but a bar has only ${card.meter.beats} beats.`,
      });
    }
    const fewest = Math.min(
      ...beats.filter((b) => b <= card.meter.beats).map((b) => grid.beats[b - 1] ?? 1),
    );
    const beyond = layer.slots.filter((slot) => slot >= fewest);
    if (beyond.length > 0) {
      issues.push({
        path: `${at}.slots`,
        message: `Layer ${i + 1} plays slot ${listWords(beyond)}, but its beats have only ${plural(fewest, 'slot')} (numbered 0 to ${fewest - 1}).`,
      });
    }
  });
  for (const voice of Object.keys(card.roles)) {
    if (card.voices.includes(voice as (typeof card.voices)[number])) continue;
    issues.push({
      path: `roles.${voice}`,
      message: `The roles name the ${voiceWord(voice)}, which is not among the card's voices (${cardVoices}).`,
    });
  }
  for (const voice of Object.keys(card.fillStep ?? {})) {
    if (card.voices.includes(voice as (typeof card.voices)[number])) continue;
    issues.push({
      path: `fillStep.${voice}`,
      message: `The fill steps name the ${voiceWord(voice)}, which is not among the card's voices (${cardVoices}).`,
    });
  }
  if (card.swing) checkSwing(card, grid, issues);
}

function checkSwing(card: RuleCard, grid: Grid, issues: RuleCardIssue[]): void {
  const swing = card.swing;
  if (!swing) return;
  // Slots per swung pair: eighths in a quarter beat are its halves, sixteenths its quarters.
  const pairsPerBeat = swing.unit / card.meter.unit / 2;
  const fits = grid.beats.every(
    (slots) =>
      Number.isInteger(pairsPerBeat) && pairsPerBeat >= 1 && slots % (pairsPerBeat * 2) === 0,
  );
  if (!fits) {
    issues.push({
      path: 'swing.unit',
      message: `Swung ${swing.unit === 8 ? 'eighths' : 'sixteenths'} need every beat split into ${swing.unit === 8 ? 'eighths' : 'sixteenths'} (or finer, evenly) in a meter of quarter${swing.unit === 16 ? ' or eighth' : ''} beats.`,
    });
  }
}

export function checkPhrase(
  card: RuleCard,
  rule: PhraseRule,
  at: string,
  named: string,
  issues: RuleCardIssue[],
): void {
  if (card.bars % rule.every !== 0) {
    issues.push({
      path: `${at}.every`,
      message: `${named}: a ${rule.every}-bar phrase needs a drill of ${rule.every}, ${rule.every * 2} or ${rule.every * 3} bars…, not ${card.bars}.`,
    });
  }
  if (rule.fillBeats > card.meter.beats) {
    issues.push({
      path: `${at}.fillBeats`,
      message: `${named}: the fill lasts ${plural(rule.fillBeats, 'beat')}, but a bar has only ${card.meter.beats}.`,
    });
  }
  if (rule.voices.length === 0) {
    issues.push({
      path: `${at}.voices`,
      message: `${named} needs a snare or tom to play the fill: add one to the card's voices.`,
    });
  }
  const feet = rule.voices.filter((voice) => !isHandVoice(voice));
  if (feet.length > 0) {
    issues.push({
      path: `${at}.voices`,
      message: `${named}: the fill is played by the hands, so it cannot use the ${listWords(feet.map(voiceWord))}.`,
    });
  }
}
