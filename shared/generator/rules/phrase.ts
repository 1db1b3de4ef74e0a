import type { VoiceId } from '../drill';
import { Gap, gapOf, HAND_LIMITS, paceOf, thresholdsOf } from '../sticking/limits';
import { slotsIn, type Grid } from '../grid';
import type { PhraseRule, RuleCard } from '../schema';
import { countOverlaps, overlapBudget } from './linear';
import type { Placement } from './placement';
import { createRng, type Rng } from '../random';

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
 * the next phrase. How many pairs each tom takes varies with the seed (`pairVoices`); the
 * checker rebuilds it from the card and the drill's seed.
 */
export function placePhrase(
  card: RuleCard,
  grid: Grid,
  taken: (instant: number) => boolean,
  voicesAt: (instant: number) => number,
  seed?: string,
): Placement[] {
  const phrase = phraseOf(card);
  if (!phrase) return [];
  // A generator of its own, so the fill's draw leaves the drill's other draws as they were.
  const rng = seed === undefined ? null : createRng(`${seed}/phrase`);
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
    let held = -1;
    run.forEach((instant, k) => {
      if (!fill.has(instant)) held = Math.floor(k / 2);
    });
    const voiceOfPair = pairVoices(pairs, count, rng, held);
    let voice: VoiceId | undefined;
    run.forEach((instant, k) => {
      const target = rule.voices[voiceOfPair[Math.floor(k / 2)] ?? count - 1];
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

/**
 * The voice (index in the fill's voices) of each pair of strokes, high to low. The first voice
 * (the snare) opens with its fair share or, where there are more pairs than voices, by the seed
 * none (the fill opens on the high tom); the seed shares the rest among the later voices (the
 * toms), each at least one pair, so the fill changes from seed to seed and phrase to phrase
 * (common practice: a teacher writes more than one fill). A shared-out fill reaches its last
 * voice (the floor tom) only after the last pair `held` by another rule (a backbeat), so the
 * hands never come back up from it. With no seed the extra pairs go to the last voices.
 */
function pairVoices(pairs: number, count: number, rng: Rng | null, held: number): number[] {
  const fair = Array.from(
    { length: pairs },
    (_, pair) => count - 1 - Math.floor(((pairs - 1 - pair) * count) / pairs),
  );
  if (!rng || count < 3 || pairs <= count) return fair;
  const first = rng.int(2) === 0 ? fair.filter((v) => v === 0).length : 0;
  const shares: number[][] = [];
  const share = (left: number, parts: number, so: number[]): void => {
    if (parts === 1) {
      if (left >= 1) shares.push([...so, left]);
      return;
    }
    for (let k = 1; k < left; k++) share(left - k, parts - 1, [...so, k]);
  };
  share(pairs - first, count - 1, []);
  // The pair where the last voice starts: after every held pair.
  const fits = shares.filter((p) => first + p.reduce((a, b) => a + b, 0) - (p.at(-1) ?? 0) > held);
  if (fits.length === 0) return fair;
  const pick = fits[rng.int(fits.length)] ?? [];
  const out: number[] = new Array<number>(first).fill(0);
  pick.forEach((n, k) => {
    for (let j = 0; j < n; j++) out.push(k + 1);
  });
  return out;
}

function landingVoices(card: RuleCard, rule: PhraseRule): VoiceId[] {
  const voices: VoiceId[] = [];
  if (card.voices.includes('kick')) voices.push('kick');
  if (rule.crash && card.voices.includes('crash')) voices.push('crash');
  return voices;
}
