import type { VoiceId } from '../drill';
import { Gap, gapOf, HAND_LIMITS, paceOf, thresholdsOf } from '../sticking/limits';
import { slotsIn, type Grid } from '../grid';
import type { PhraseRule, RuleCard } from '../schema';
import { countOverlaps, overlapBudget } from './linear';
import type { Placement } from './placement';

/** The card's phrase rule and its index, if it has one. */
export function phraseOf(card: RuleCard): { rule: PhraseRule; index: number } | null {
  const index = card.rules.findIndex((rule) => rule.kind === 'phrase');
  const rule = card.rules[index];
  return rule?.kind === 'phrase' ? { rule, index } : null;
}

/** 0-based fill bars: the last bar of every phrase. */
export function fillBars(rule: PhraseRule, bars: number): number[] {
  const out: number[] = [];
  for (let bar = rule.every - 1; bar < bars; bar += rule.every) out.push(bar);
  return out;
}

/**
 * Per instant: true inside a phrase's fill (the last `fillBeats` beats of each fill bar), where
 * the hands leave the time cymbal and no groove fill is added.
 */
export function fillWindow(card: RuleCard, grid: Grid): boolean[] {
  const inFill = new Array<boolean>(grid.instants).fill(false);
  const phrase = phraseOf(card);
  if (!phrase) return inFill;
  const firstBeat = grid.beatsPerBar - phrase.rule.fillBeats;
  for (const bar of fillBars(phrase.rule, grid.bars)) {
    const from = bar * grid.slotsPerBar + (grid.beatStart[firstBeat] ?? 0);
    for (let i = from; i < (bar + 1) * grid.slotsPerBar; i++) inFill[i] = true;
  }
  return inFill;
}

/**
 * How many slots apart the fill's notes are in a beat of `slots`: every slot when two
 * alternating hands can play them at the tempo, else every second, third… (whole divisors).
 */
function fillStep(grid: Grid, tempo: number, slots: number): number {
  const hand = thresholdsOf(paceOf(grid, tempo), HAND_LIMITS);
  for (let step = 1; step <= slots; step++) {
    if (slots % step !== 0) continue;
    // Alternating hands: each hand plays every second note of the run, as single strokes.
    if (gapOf(hand, (2 * step * grid.ticksPerBeat) / slots) === Gap.Single) return step;
  }
  return slots;
}

/**
 * The fill's hits and the landing: a run in the card's grid over the fill beats, moving through
 * the fill voices in equal stretches (snare, then the toms high to low: "around the kit"), on
 * every instant no other rule has taken; then the kick, and the crash when asked, on beat 1 of
 * the next phrase. Deterministic: the checker rebuilds it from the card alone.
 */
export function placePhrase(
  card: RuleCard,
  grid: Grid,
  taken: (instant: number) => boolean,
  voicesAt: (instant: number) => number,
): Placement[] {
  const phrase = phraseOf(card);
  if (!phrase) return [];
  const { rule, index } = phrase;
  const out: Placement[] = [];
  const firstBeat = grid.beatsPerBar - rule.fillBeats;
  for (const bar of fillBars(rule, grid.bars)) {
    const run: number[] = [];
    for (let b = firstBeat; b < grid.beatsPerBar; b++) {
      const slots = slotsIn(grid, b);
      const step = fillStep(grid, card.tempo, slots);
      for (let s = 0; s < slots; s += step)
        run.push(bar * grid.slotsPerBar + (grid.beatStart[b] ?? 0) + s);
    }
    // Where a foot keeps time the fill joins it only while the linear budget lasts.
    let overlaps = countOverlaps(bar * grid.slotsPerBar, (bar + 1) * grid.slotsPerBar, voicesAt);
    const budget = overlapBudget(card);
    const playable = run.filter((instant) => {
      if (taken(instant)) return false;
      if (voicesAt(instant) === 0) return true;
      if (overlaps >= budget) return false;
      overlaps++;
      return true;
    });
    const fill = new Set(playable);
    // Around the kit in pairs of strokes (R L for a right-handed lead): the drum changes only
    // on the first note of a pair, so each drum starts on the leading hand and that hand leads
    // down the kit; a pair whose first note another rule holds stays on the drum before. Extra
    // pairs go to the later voices (the toms), so the snare starts the fill and the toms carry
    // it (common practice).
    const pairs = Math.ceil(run.length / 2);
    const count = rule.voices.length;
    let voice: VoiceId | undefined;
    run.forEach((instant, k) => {
      const pair = Math.floor(k / 2);
      const target = rule.voices[count - 1 - Math.floor(((pairs - 1 - pair) * count) / pairs)];
      if (voice === undefined || (k % 2 === 0 && fill.has(instant))) voice = target;
      if (voice && fill.has(instant))
        out.push({ instant, voice, source: 'phrase', dynamic: 'normal', rule: index });
    });
    const landing = ((bar + 1) % grid.bars) * grid.slotsPerBar;
    for (const voice of landingVoices(card, rule)) {
      out.push({ instant: landing, voice, source: 'phrase', dynamic: 'accent', rule: index });
    }
  }
  return out;
}

function landingVoices(card: RuleCard, rule: PhraseRule): VoiceId[] {
  const voices: VoiceId[] = [];
  if (card.voices.includes('kick')) voices.push('kick');
  if (rule.crash && card.voices.includes('crash')) voices.push('crash');
  return voices;
}
