import { describe, expect, it } from 'vitest';
import { checkDrill, generateDrill, isHandVoice, parseRuleCard, type Drill } from '../index';
import { BUILT_IN_PRESETS, findBuiltInPreset } from '../presets/index';

const SEEDS = Array.from({ length: 20 }, (_, i) => `seed-${i}`);

/** Every hand stroke of a drill in time order: instant (over the drill), voice, hand, source. */
interface Stroke {
  readonly at: number;
  readonly voice: string;
  readonly hand: 'R' | 'L';
  readonly source: string;
}

/** The drill's instants on its own grid (every preset has the same subdivision on every beat). */
function strokesOf(drill: Drill): { strokes: Stroke[]; slots: number; instants: number } {
  const beats = drill.bars[0]?.beats ?? [];
  const slots = beats[0] ?? 1;
  if (beats.some((b) => b !== slots)) throw new Error('uneven grid');
  const perBar = beats.length * slots;
  const strokes: Stroke[] = [];
  for (const bar of drill.bars) {
    for (const h of bar.hits) {
      if (!isHandVoice(h.voice) || (h.hand !== 'R' && h.hand !== 'L')) continue;
      const at = (bar.bar - 1) * perBar + (h.beat - 1) * slots + h.slot;
      strokes.push({ at, voice: h.voice, hand: h.hand, source: h.source });
    }
  }
  return { strokes, slots, instants: drill.bars.length * perBar };
}

/**
 * True when `n` instants of a grid of `slots` per beat at `tempo` last at most 1/8 s: the
 * issue's "sixteenths at 120 BPM or faster" (n × 60 / (slots × tempo) ≤ 1/8).
 */
const fast = (n: number, slots: number, tempo: number): boolean => n * 60 * 8 <= slots * tempo;

describe('every preset at 20 seeds', () => {
  it.each(BUILT_IN_PRESETS.map((p) => [p.id, p] as const))('%s', (_id, preset) => {
    const card = parseRuleCard(preset.card);
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      expect(checkDrill(card, drill)).toEqual([]);
      const { strokes, slots, instants } = strokesOf(drill);
      const handAt = new Map<number, string>();
      for (const s of strokes) handAt.set(s.at, (handAt.get(s.at) ?? '') + s.hand);
      // No single hand plays three consecutive notes of the grid at 120 BPM sixteenths or
      // faster (the card asks for no doubles).
      if (!card.sticking.doubles && fast(1, slots, card.tempo)) {
        for (let i = 0; i < instants; i++) {
          const three = [0, 1, 2].map((k) => handAt.get((i + k) % instants) ?? '');
          for (const hand of ['R', 'L'])
            expect(
              three.every((h) => h.includes(hand)),
              `${seed} ${i}`,
            ).toBe(false);
        }
      }
      // No hand crossing to the far side while the other hand is free: the left hand on the
      // floor tom or ride (time and rule figures aside) only when the right hand strikes from
      // the left hand's stroke before to its stroke after (all presets are right-handed).
      const left = strokes.filter((s) => s.hand === 'L');
      const right = strokes.filter((s) => s.hand === 'R').map((s) => s.at);
      left.forEach((s, k) => {
        if (!['tomFloor', 'ride', 'rideBell'].includes(s.voice)) return;
        if (['ostinato', 'polyrhythm', 'euclid'].includes(s.source)) return;
        const before = k > 0 ? (left[k - 1]?.at ?? 0) : (left[left.length - 1]?.at ?? 0) - instants;
        const after = k < left.length - 1 ? (left[k + 1]?.at ?? 0) : (left[0]?.at ?? 0) + instants;
        const busy = right.some((r) =>
          [r - instants, r, r + instants].some((x) => x >= before && x <= after),
        );
        expect(busy, `${seed}: left hand alone on the ${s.voice} at ${s.at}`).toBe(true);
      });
    }
  });
});

describe('linear-sixteenths sticking', () => {
  const preset = findBuiltInPreset('linear-sixteenths');
  const card = parseRuleCard(preset?.card);

  // common practice: a linear groove is played hand to hand, the right hand keeping the hi-hat.
  it('never reads R L L L in a beat, nor gives one hand three notes in a row of the line', () => {
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      for (const bar of drill.bars) {
        for (let beat = 1; beat <= 4; beat++) {
          const hands = [0, 1, 2, 3].map(
            (slot) => bar.hits.find((h) => h.beat === beat && h.slot === slot)?.hand ?? '-',
          );
          expect(hands.join(''), `${seed} bar ${bar.bar} beat ${beat}`).not.toBe('RLLL');
        }
      }
      const { strokes, instants } = strokesOf(drill);
      const handAt = new Map(strokes.map((s) => [s.at, s.hand]));
      for (let i = 0; i < instants; i++) {
        const three = [0, 1, 2].map((k) => handAt.get((i + k) % instants));
        expect(three[0] !== undefined && three.every((h) => h === three[0]), `${seed} ${i}`).toBe(
          false,
        );
      }
    }
  });

  // The same groove with a floor tom in the line: the tom on the far right of the kit.
  const withFloorTom = parseRuleCard({
    ...(preset?.card as object),
    voices: ['kick', 'snare', 'hihat', 'tomHigh', 'tomFloor'],
    rules: [
      { kind: 'linear', maxOverlaps: 0 },
      { kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 },
      { kind: 'fillHoles', voices: ['snare', 'tomHigh', 'tomFloor'], ghost: 0.5, accent: 0.1 },
    ],
  });

  it('keeps the hi-hat on the right hand, and never runs the left hand round the toms while the right waits', () => {
    for (const seed of SEEDS) {
      const { strokes } = strokesOf(generateDrill(withFloorTom, seed));
      for (const s of strokes) if (s.voice === 'hihat') expect(s.hand).toBe('R');
      // High tom, floor tom, high tom on the left hand with no right-hand stroke among them.
      for (let k = 0; k + 2 < strokes.length; k++) {
        const run = strokes.slice(k, k + 3);
        const lefty = run.every((s) => s.hand === 'L') && run[1]?.voice === 'tomFloor';
        expect(lefty, `${seed} at ${strokes[k]?.at}`).toBe(false);
      }
    }
  });

  // common practice: at sixteenths the right hand has no time to travel from the floor tom to
  // the hi-hat (or back) between two notes running, across the whole kit.
  it('never takes the right hand between the floor tom and the hi-hat from one sixteenth to the next', () => {
    let floorToms = 0;
    for (const seed of SEEDS) {
      const drill = generateDrill(withFloorTom, seed);
      const { strokes, instants } = strokesOf(drill);
      const at = new Map(strokes.filter((s) => s.hand === 'R').map((s) => [s.at, s.voice]));
      for (const [i, voice] of at) {
        if (voice === 'tomFloor') floorToms++;
        const next = at.get((i + 1) % instants);
        const pair = [voice, next].sort().join(' ');
        expect(pair, `${seed} at ${i}`).not.toBe('hihat tomFloor');
      }
    }
    expect(floorToms).toBeGreaterThan(0);
  });
});

describe('the left-handed mirror', () => {
  it('is the exact mirror of the right-handed drill for every preset', () => {
    const swap = { R: 'L', L: 'R' } as const;
    for (const preset of BUILT_IN_PRESETS) {
      const right = parseRuleCard(preset.card);
      const left = parseRuleCard({ ...(preset.card as object), hand: 'left' });
      expect(left.sticking.lead).toBe('left');
      for (const seed of SEEDS.slice(0, 5)) {
        const a = generateDrill(right, seed);
        const b = generateDrill(left, seed);
        expect(checkDrill(left, b)).toEqual([]);
        const mirrored = a.bars.map((bar) =>
          bar.hits.map((h) => ({ ...h, hand: h.hand === null ? null : swap[h.hand] })),
        );
        expect(
          b.bars.map((bar) => bar.hits),
          `${preset.id} ${seed}`,
        ).toEqual(mirrored);
      }
    }
  });
});
