import type { RuleCardIssue } from './errors';
import { beatsOf, createGrid, gcd, type Grid, type Landing } from './grid';
import { euclidLandings } from './rules/euclid';
import { polyrhythmLandings } from './rules/polyrhythm';
import type { Rule, RuleCard } from './schema';
import { listWords, voiceWord } from './words';
import { checkExtensions, checkPhrase } from './card-extension-checks';

/**
 * Checks that need more than one field: the subdivision list matches the meter, rules use the
 * card's voices and existing beats and bars, the ostinato's slots exist in every beat, and
 * polyrhythm and Euclidean points land on slots.
 */
export function checkCardConsistency(card: RuleCard): RuleCardIssue[] {
  const issues: RuleCardIssue[] = [];
  if (Array.isArray(card.subdivision) && card.subdivision.length !== card.meter.beats) {
    issues.push({
      path: 'subdivision',
      message: `The subdivision lists ${card.subdivision.length} beat${card.subdivision.length === 1 ? '' : 's'}, but the meter has ${card.meter.beats} beats in a bar: give one number per beat.`,
    });
    return issues; // the grid below would be wrong
  }
  const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  checkOstinato(card, grid, issues);
  checkExtensions(card, grid, issues);
  card.rules.forEach((rule, index) => checkRule(card, grid, rule, index, issues));
  if (card.rules.filter((r) => r.kind === 'phrase').length > 1) {
    issues.push({
      path: 'rules',
      message: 'A card may have only one phrase rule: one phrase length for the whole drill.',
    });
  }
  if (card.rules.filter((r) => r.kind === 'tension').length > 1) {
    issues.push({
      path: 'rules',
      message: 'A card may have only one tension rule: merge the curves into one.',
    });
  }
  return issues;
}

function checkOstinato(card: RuleCard, grid: Grid, issues: RuleCardIssue[]): void {
  const ostinato = card.ostinato;
  if (!ostinato) return;
  if (!card.voices.includes(ostinato.voice)) {
    issues.push({
      path: 'ostinato.voice',
      message: `The ostinato plays the ${voiceWord(ostinato.voice)}, which is not among the card's voices (${listWords(card.voices.map(voiceWord))}).`,
    });
  }
  const fewest = Math.min(...grid.beats);
  const beyond = ostinato.slots.filter((slot) => slot >= fewest);
  if (beyond.length > 0) {
    const beat = grid.beats.findIndex((slots) => slots === fewest) + 1;
    issues.push({
      path: 'ostinato.slots',
      message: `The ostinato plays slot ${listWords(beyond)} of every beat, but beat ${beat} has only ${fewest} slot${fewest === 1 ? '' : 's'} (numbered 0 to ${fewest - 1}).`,
    });
  }
}

function checkRule(
  card: RuleCard,
  grid: Grid,
  rule: Rule,
  index: number,
  issues: RuleCardIssue[],
): void {
  const at = `rules[${index}]`;
  const named = `Rule ${index + 1} (${rule.kind})`;
  const voices = 'voice' in rule ? [rule.voice] : 'voices' in rule ? rule.voices : [];
  for (const voice of voices) {
    if (card.voices.includes(voice)) continue;
    issues.push({
      path: `${at}.${'voice' in rule ? 'voice' : 'voices'}`,
      message: `${named} uses the ${voiceWord(voice)}, which is not among the card's voices (${listWords(card.voices.map(voiceWord))}): add it to the voices or change the rule.`,
    });
  }
  if (rule.kind === 'backbeat') {
    const missing = rule.beats.filter((beat) => beat > card.meter.beats);
    if (missing.length > 0) {
      issues.push({
        path: `${at}.beats`,
        message: `${named} names beat ${listWords(missing)}, but a bar has only ${card.meter.beats} beats.`,
      });
    }
    const bars = (rule.bars ?? []).filter((bar) => bar > card.bars);
    if (bars.length > 0) {
      issues.push({
        path: `${at}.bars`,
        message: `${named} names bar ${listWords(bars)}, but the drill has only ${card.bars} bars.`,
      });
    }
  }
  if (rule.kind === 'avoidDownbeat' && rule.landing === 'end' && rule.resolveEvery === 0) {
    issues.push({
      path: `${at}.landing`,
      message: `${named} lands at the end of each cycle, but resolveEvery is 0 (never land): give the cycle length in bars.`,
    });
  }
  if (rule.kind === 'phrase') checkPhrase(card, rule, at, named, issues);
  if (rule.kind === 'polyrhythm') {
    const miss = firstMiss(polyrhythmLandings(rule, grid).map((l) => l.landing));
    if (miss) {
      issues.push({
        path: `${at}.against`,
        message: `${named}: ${rule.against} hits over ${rule.span} beat${rule.span === 1 ? '' : 's'} fall between the slots of beat ${miss.beat}. ${suggest(rule.against, rule.span)}`,
      });
    }
  }
  if (rule.kind === 'euclid') {
    const miss = firstMiss(euclidLandings(rule, grid));
    if (miss) {
      issues.push({
        path: `${at}.steps`,
        message: `${named}: ${rule.steps} steps over ${rule.span} beat${rule.span === 1 ? '' : 's'} do not split into whole slots (beat ${miss.beat}). ${suggest(rule.steps, rule.span)}`,
      });
    }
  }
}

function firstMiss(landings: readonly Landing[]): { beat: number } | null {
  for (const landing of landings) if (!landing.ok) return { beat: landing.beat };
  return null;
}

/** Which subdivision would put `count` even points over `span` beats on slots. */
function suggest(count: number, span: number): string {
  const needed = count / gcd(count, span);
  const fits = [1, 2, 3, 4, 5, 6, 7, 8].filter((s) => s % needed === 0);
  if (fits.length === 0) {
    return `That needs ${needed} slots per beat (or a multiple), more than the 8 a beat can hold: change the count or the span.`;
  }
  return `Use ${listWords(fits, 'or')} slots per beat in every beat of the cycle.`;
}
