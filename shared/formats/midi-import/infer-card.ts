import type { Dynamic, VoiceId } from '../../generator/index';

/** A quantised hit before the card names its source and the sticking its hand. */
export interface PlainHit {
  readonly beat: number;
  readonly slot: number;
  readonly voice: VoiceId;
  readonly dynamic: Dynamic;
}

export interface PlainBar {
  readonly beats: readonly number[];
  readonly hits: readonly PlainHit[];
}

/** Voices that keep time on a kit, in the order the importer tries them as the ostinato. */
export const TIME_CYMBALS: readonly VoiceId[] = ['hihat', 'ride', 'hihatOpen', 'rideBell'];

/** A part counts as the groove's when it plays in at least this share of its chances. */
export const STEADY_SHARE = 0.75;

/** The card as the importer writes it, before `parseRuleCard` fills in its defaults. */
export interface DraftCard {
  meter: { beats: number; unit: number };
  bars: number;
  subdivision: number | number[];
  tempo: number;
  voices: VoiceId[];
  ostinato?: { voice: VoiceId; slots: number[]; dynamic: Dynamic };
  density: number;
  rules: Record<string, unknown>[];
  roles?: Partial<Record<VoiceId, 'embellishment'>>;
}

const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
const lcm = (a: number, b: number): number => (a / gcd(a, b)) * b;

/** Same place in the beat: slot s of n against slot k of m, compared exactly. */
export const samePlace = (s: number, n: number, k: number, m: number): boolean => s * m === k * n;

function mostCommon<T>(values: readonly T[]): T | undefined {
  const counts = new Map<T, number>();
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
  let best: T | undefined;
  let most = 0;
  for (const [v, n] of counts) if (n > most) [best, most] = [v, n];
  return best;
}

/**
 * The card's grid: one subdivision for every beat when the bars' subdivisions have a common
 * multiple of at most 8 (eighths and sixteenths make sixteenths); otherwise, beat by beat, the
 * least common multiple of the subdivisions used there, or the most used one when that would
 * pass 8 slots.
 */
export function cardGrid(bars: readonly PlainBar[], beats: number): number | number[] {
  const usedAt = (b: number): number[] =>
    bars.filter((bar) => bar.hits.some((h) => h.beat === b + 1)).map((bar) => bar.beats[b]!);
  const all = Array.from({ length: beats }, (_, b) => usedAt(b)).flat();
  const whole = all.length > 0 ? all.reduce(lcm) : 2;
  if (whole <= 8) return whole;
  const perBeat: (number | null)[] = [];
  for (let b = 0; b < beats; b++) {
    const used = usedAt(b);
    if (used.length === 0) {
      perBeat.push(null);
      continue;
    }
    const joined = used.reduce(lcm);
    perBeat.push(joined <= 8 ? joined : mostCommon(used)!);
  }
  const fallback = mostCommon(perBeat.filter((n): n is number => n !== null)) ?? 2;
  const grid = perBeat.map((n) => n ?? fallback);
  return grid.every((n) => n === grid[0]) ? grid[0]! : grid;
}

/** The time cymbal and its slots of every beat, when one plays steadily on a uniform grid. */
export function inferOstinato(
  bars: readonly PlainBar[],
  grid: number | number[],
): DraftCard['ostinato'] | undefined {
  if (typeof grid !== 'number') return undefined;
  const totalBeats = bars.reduce((sum, bar) => sum + bar.beats.length, 0);
  const candidates = TIME_CYMBALS.map((voice) => {
    const hits = bars.flatMap((bar) =>
      bar.hits.filter((h) => h.voice === voice).map((h) => ({ ...h, n: bar.beats[h.beat - 1]! })),
    );
    const slots: number[] = [];
    for (let k = 0; k < grid; k++) {
      const played = hits.filter((h) => samePlace(h.slot, h.n, k, grid)).length;
      if (played >= STEADY_SHARE * totalBeats) slots.push(k);
    }
    return { voice, slots, hits };
  }).filter((c) => c.slots.length > 0);
  const best = candidates.sort((a, b) => b.hits.length - a.hits.length)[0];
  if (!best) return undefined;
  return { voice: best.voice, slots: best.slots, dynamic: 'normal' };
}

/**
 * Beats after the first whose first slot the snare (or, without one, the rim) plays in most bars:
 * the backbeat (beat 1 is the downbeat, never a backbeat; common practice).
 */
export function inferBackbeat(
  bars: readonly PlainBar[],
  beats: number,
): Record<string, unknown> | undefined {
  const voice = bars.some((bar) => bar.hits.some((h) => h.voice === 'snare')) ? 'snare' : 'rim';
  const onBeat = (bar: PlainBar, beat: number) =>
    bar.hits.find((h) => h.voice === voice && h.beat === beat && h.slot === 0);
  const chosen: number[] = [];
  const dynamics: Dynamic[] = [];
  for (let beat = 2; beat <= beats; beat++) {
    const hits = bars.map((bar) => onBeat(bar, beat)).filter((h) => h !== undefined);
    if (hits.length >= STEADY_SHARE * bars.length) {
      chosen.push(beat);
      dynamics.push(...hits.map((h) => h.dynamic));
    }
  }
  if (chosen.length === 0 || (beats > 2 && chosen.length === beats - 1)) return undefined;
  return { kind: 'backbeat', voice, beats: chosen, shift: 0, dynamic: mostCommon(dynamics)! };
}
