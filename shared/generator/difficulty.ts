import { FOOT_VOICES, type Drill, type DrillHit, type Hand } from './drill';
import type { RuleCard } from './schema';

/** How demanding a drill is to play, with the factors behind the score. */
export interface Difficulty {
  /** 0 (a first lesson) to 10 (the hardest the engine writes), one decimal. */
  readonly score: number;
  readonly level: 'beginner' | 'intermediate' | 'advanced';
  readonly factors: {
    /** Beats per minute as written. */
    readonly tempo: number;
    /** The fastest single hand, in notes per second (closest two strokes of one hand). */
    readonly handRate: number;
    /** The fastest single foot, in notes per second. */
    readonly footRate: number;
    /** Share of the grid's slots where something other than the time layers plays. */
    readonly density: number;
    /** Mean bar tension. */
    readonly syncopation: number;
    /** Share of the instants where something other than the time plays that fall between the
     * time's notes (between the beats when nothing keeps time). */
    readonly independence: number;
    /** Points added for a feel the rates do not show: odd tuplets, cross-rhythms, uneven
     * groupings, a displaced backbeat (see `FEEL_POINTS`). */
    readonly feel: number;
  };
}

/**
 * The references each factor is scaled by (each factor counts 0 at rest and 1 at its reference,
 * capped there). Our own choice, tuned on the presets, not a published scale:
 * - hand rate 12 notes a second (the engine's single-hand limit, common practice);
 * - foot rate 8 notes a second (a sustained single-foot rate, common practice, from memory);
 * - density 0.75 of the grid's slots, syncopation 0.8, independence 0.5.
 */
const REFERENCE = { handRate: 12, footRate: 8, density: 0.75, syncopation: 0.8, independence: 0.5 };

/** Weights of the factors in the score (they add up to 1). */
const WEIGHT = {
  handRate: 0.3,
  footRate: 0.15,
  density: 0.15,
  syncopation: 0.25,
  independence: 0.15,
};

/**
 * Points (on the 0–10 score) for what a teacher counts beyond rates and syncopation (common
 * practice; the sizes are our own, tuned on the presets):
 * - odd tuplets: notes in a beat split in 5 or 7 are harder to read and to place than sixteenths
 *   at the same rate, since no eighth or quarter inside the beat guides the hand;
 * - a cross-rhythm: an even stream against the beat that lands on neither beats nor their halves
 *   (4 over 3), felt against the pulse rather than on it;
 * - an uneven grouping (7/8 as 2+2+3): the pulse itself is uneven;
 * - a displaced backbeat: the snare's backbeat moved off 2 and 4 asks the player to hold the
 *   beat while the ear hears it elsewhere.
 */
export const FEEL_POINTS = { oddTuplet: 2, crossRhythm: 2, unevenGrouping: 1, displaced: 1 };

function feelPoints(drill: Omit<Drill, 'difficulty'>): number {
  const card = drill.card;
  let points = 0;
  const odd = drill.bars.some((bar) =>
    bar.hits.some((hit) => {
      const slots = bar.beats[hit.beat - 1] ?? 1;
      return (slots === 5 || slots === 7) && hit.slot !== 0;
    }),
  );
  if (odd) points += FEEL_POINTS.oddTuplet;
  const cross = card.rules.some(
    (rule) =>
      rule.kind === 'polyrhythm' &&
      (2 * rule.span) % rule.against !== 0 &&
      rule.against % rule.span !== 0,
  );
  if (cross) points += FEEL_POINTS.crossRhythm;
  const groups = card.meter.grouping ?? [];
  if (new Set(groups).size > 1) points += FEEL_POINTS.unevenGrouping;
  const displaced = card.rules.some(
    (rule) =>
      rule.kind === 'backbeat' &&
      rule.voice === 'snare' &&
      rule.shift !== 0 &&
      rule.beats.every((beat) => beat % 2 === 0),
  );
  if (displaced) points += FEEL_POINTS.displaced;
  return points;
}

/**
 * The drill's difficulty: a weighted sum of its fastest hand and foot, how much of the grid it
 * fills, how syncopated it is and how much of it falls between the time's strokes, each scaled
 * to its reference and capped, times 10, plus the feel's points, capped at 10. Pure: the drill
 * (with its card) alone decides it.
 */
export function drillDifficulty(drill: Omit<Drill, 'difficulty'>): Difficulty {
  const card = drill.card;
  const secondsPerBeat = 60 / card.tempo;
  // Every hit's time in seconds, in the drill's order (the engine checks thousands a second:
  // limbs are small numbers, not strings in maps and sets).
  const times: number[] = [];
  const hits: DrillHit[] = [];
  let slots = 0;
  drill.bars.forEach((bar, b) => {
    const beats = bar.beats.length;
    slots += bar.beats.reduce((a, n) => a + n, 0);
    for (const hit of bar.hits) {
      const beatsIn = b * beats + (hit.beat - 1) + hit.slot / (bar.beats[hit.beat - 1] ?? 1);
      times.push(beatsIn * secondsPerBeat);
      hits.push(hit);
    }
  });
  const loop = drill.bars.length * (drill.bars[0]?.beats.length ?? 1) * secondsPerBeat;
  // Each limb a number: the hands, then each voice heard without a hand (at most 14 in all).
  const limbBits = new Map<string, number>();
  const limbOf = (name: string): number => {
    let bit = limbBits.get(name);
    if (bit === undefined) {
      bit = limbBits.size;
      limbBits.set(name, bit);
    }
    return bit;
  };
  limbOf('R');
  limbOf('L');
  const rate = (picks: (hit: DrillHit) => number): number => {
    const last: (number | undefined)[] = [];
    const first: (number | undefined)[] = [];
    let gap = Infinity;
    for (let k = 0; k < times.length; k++) {
      const limb = picks(hits[k] as DrillHit);
      if (limb < 0) continue;
      const t = times[k] ?? 0;
      const before = last[limb];
      if (before !== undefined && t > before) gap = Math.min(gap, t - before);
      if (first[limb] === undefined) first[limb] = t;
      last[limb] = t;
    }
    last.forEach((t, limb) => {
      if (t === undefined) return;
      const wrap = (first[limb] ?? t) + loop - t;
      if (wrap > 0) gap = Math.min(gap, wrap);
    });
    return Number.isFinite(gap) ? 1 / gap : 0;
  };
  // The common limbs without a map look-up (any other name still gets its own number).
  const handOf = (hit: DrillHit): number => {
    const hand = hit.hand ?? null;
    return hand === null ? -1 : hand === 'R' ? 0 : hand === 'L' ? 1 : limbOf(hand as Hand);
  };
  const kick = limbOf('kick');
  const hihatFoot = limbOf('hihatFoot');
  const footOf = (hit: DrillHit): number =>
    hit.voice === 'kick'
      ? kick
      : hit.voice === 'hihatFoot'
        ? hihatFoot
        : FOOT_VOICES.has(hit.voice)
          ? limbOf(hit.voice)
          : -1;
  const handRate = rate(handOf);
  const footRate = rate(footOf);
  // Independence: notes the other limbs place between the strokes of the time (a kick on the
  // "e" under a quarter-note hi-hat) ask more of a player than notes struck with it (kick and
  // snare with the hi-hat, the first groove a student learns). Without a time layer the beats
  // stand in for it.
  const moving = new Set<number>();
  const time = new Set<number>();
  const hasTime = hits.some((hit) => hit.source === 'ostinato');
  for (let k = 0; k < times.length; k++) {
    const hit = hits[k] as DrillHit;
    const key = Math.round((times[k] ?? 0) * 1e6);
    if (hit.source !== 'ostinato') moving.add(key);
    if (hasTime ? hit.source === 'ostinato' : hit.slot === 0) time.add(key);
    // A phrase's fill is a run of the hands alone while the time rests: nothing to coordinate.
    if (hit.source === 'phrase' && hit.dynamic !== 'accent') time.add(key);
  }
  const density = slots === 0 ? 0 : moving.size / slots;
  let between = 0;
  for (const key of moving) if (!time.has(key)) between++;
  const independence = moving.size === 0 ? 0 : between / moving.size;
  const syncopation =
    drill.bars.reduce((sum, bar) => sum + bar.tension, 0) / Math.max(1, drill.bars.length);
  const factors = { handRate, footRate, density, syncopation, independence };
  let score = 0;
  for (const name of Object.keys(WEIGHT) as (keyof typeof WEIGHT)[])
    score += WEIGHT[name] * Math.min(1, factors[name] / REFERENCE[name]);
  const feel = feelPoints(drill);
  const rounded = Math.min(100, Math.round(score * 100 + feel * 10)) / 10;
  return {
    score: rounded,
    level: rounded < 3.5 ? 'beginner' : rounded < 6.5 ? 'intermediate' : 'advanced',
    factors: {
      tempo: card.tempo,
      handRate: round2(handRate),
      footRate: round2(footRate),
      density: round2(density),
      syncopation: round2(syncopation),
      independence: round2(independence),
      feel,
    },
  };
}

const round2 = (x: number): number => Math.round(x * 100) / 100;

/**
 * An easier or harder version of a card that keeps its idea (its meter, voices and rules): the
 * tempo down 15 % or up 10 % (whole beats, within 20–320), the density down or up 0.15 (within
 * 0–1). Curves, rules and roles stay as written.
 */
export function cardVariant(card: RuleCard, way: 'easier' | 'harder'): RuleCard {
  const tempo =
    way === 'easier'
      ? Math.max(20, Math.round(card.tempo * 0.85))
      : Math.min(320, Math.round(card.tempo * 1.1));
  const step = way === 'easier' ? -0.15 : 0.15;
  const density = Math.round(Math.min(1, Math.max(0, card.density + step)) * 100) / 100;
  return { ...card, tempo, density };
}
