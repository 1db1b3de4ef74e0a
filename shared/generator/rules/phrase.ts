import type { DrillBar, VoiceId } from '../drill';
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
  given?: GivenFill,
): Placement[] {
  const phrase = phraseOf(card);
  if (!phrase) return [];
  // A generator of its own, so the fill's draw leaves the drill's other draws as they were;
  // made only when a fill has a choice (making one costs more than the rest of this stage).
  let made: Rng | null = null;
  const rng = (): Rng => (made ??= createRng(`${seed}/phrase`));
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
    const fills = (
      seed !== undefined ? pairChoices(pairs, count, held) : [fairPairs(pairs, count)]
    ).map((choice) => runVoices(run, fill, choice, rule.voices));
    // A kept (or checked) bar keeps the allowed fill it has; otherwise the seed picks one.
    const mine = given?.(bar);
    const drawn = fills.length > 1 ? rng().int(fills.length) : 0;
    const match = mine ? fills.find((f) => [...f].every(([i, v]) => mine.get(i) === v)) : undefined;
    const chosen = match ?? fills[drawn] ?? new Map<number, VoiceId>();
    for (const [instant, voice] of chosen)
      out.push({ instant, voice, source: 'phrase', dynamic: 'normal', rule: index });
    const landing = ((bar + 1) % grid.bars) * grid.slotsPerBar;
    for (const voice of landingVoices(card, rule)) {
      out.push({ instant: landing, voice, source: 'phrase', dynamic: 'accent', rule: index });
    }
  }
  return out;
}

/** True when the seed can vary the phrase's fill: more pairs of strokes than fill voices. */
export function phraseVaries(card: RuleCard, grid: Grid): boolean {
  const rule = phraseOf(card)?.rule;
  if (!rule || rule.voices.length < 3) return false;
  let notes = 0;
  for (let b = grid.beatsPerBar - rule.fillBeats; b < grid.beatsPerBar; b++) {
    const slots = slotsIn(grid, b);
    notes += slots / fillStep(grid, card.tempo, slots);
  }
  return Math.ceil(notes / 2) > rule.voices.length;
}

/** Per fill bar (0-based), the phrase notes a bar already has (instant → voice), if any. */
export type GivenFill = (bar: number) => ReadonlyMap<number, VoiceId> | undefined;

/** The phrase notes of the given bars (kept bars, or a drill being checked). */
export function givenFillOf(grid: Grid, bars: readonly DrillBar[]): GivenFill {
  return (bar) => {
    const given = bars.find((b) => b.bar === bar + 1);
    if (!given) return undefined;
    const out = new Map<number, VoiceId>();
    for (const hit of given.hits)
      if (hit.source === 'phrase' && hit.beat >= 1 && hit.beat <= grid.beatsPerBar)
        out.set(bar * grid.slotsPerBar + (grid.beatStart[hit.beat - 1] ?? 0) + hit.slot, hit.voice);
    return out;
  };
}

/** Each pair's voice (index in the fill's voices), high to low, the extra pairs to the last. */
function fairPairs(pairs: number, count: number): number[] {
  return Array.from(
    { length: pairs },
    (_, pair) => count - 1 - Math.floor(((pairs - 1 - pair) * count) / pairs),
  );
}

/**
 * The ways the pairs may go round the voices, high to low, for the seed to pick from. The first
 * voice (the snare) opens with its fair share or, where there are more pairs than voices, none
 * (the fill opens on the high tom); the rest are shared among the later voices (the toms), each
 * at least one pair, so the fill changes from seed to seed and phrase to phrase (common
 * practice: a teacher writes more than one fill). A fill reaches its last voice (the floor tom)
 * only after the last pair `held` by another rule (a backbeat), so the hands never come back up
 * from it; with no such way, the fair share.
 */
function pairChoices(pairs: number, count: number, held: number): number[][] {
  const fair = fairPairs(pairs, count);
  if (count < 3 || pairs <= count) return [fair];
  const out: number[][] = [];
  for (const first of [fair.filter((v) => v === 0).length, 0]) {
    const share = (left: number, voice: number, so: number[]): void => {
      if (voice === count - 1) {
        // The last voice starts at pair so.length: after every held pair.
        if (left >= 1 && so.length > held)
          out.push([...so, ...new Array<number>(left).fill(voice)]);
        return;
      }
      for (let k = 1; k < left; k++)
        share(left - k, voice + 1, [...so, ...new Array<number>(k).fill(voice)]);
    };
    share(pairs - first, 1, new Array<number>(first).fill(0));
  }
  return out.length > 0 ? out : [fair];
}

/**
 * The run's notes (instant → voice) for one choice of pairs: the drum changes only on the first
 * note of a pair; a pair whose first note another rule holds stays on the drum before.
 */
function runVoices(
  run: readonly number[],
  fill: ReadonlySet<number>,
  choice: readonly number[],
  voices: readonly VoiceId[],
): Map<number, VoiceId> {
  const out = new Map<number, VoiceId>();
  let voice: VoiceId | undefined;
  run.forEach((instant, k) => {
    const target = voices[choice[Math.floor(k / 2)] ?? voices.length - 1];
    if (voice === undefined || (k % 2 === 0 && fill.has(instant))) voice = target;
    if (voice && fill.has(instant)) out.set(instant, voice);
  });
  return out;
}

function landingVoices(card: RuleCard, rule: PhraseRule): VoiceId[] {
  const voices: VoiceId[] = [];
  if (card.voices.includes('kick')) voices.push('kick');
  if (rule.crash && card.voices.includes('crash')) voices.push('crash');
  return voices;
}
