import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';

/** One golden case: a raw rule card and a seed; the drill JSON is stored beside it. */
export interface GoldenCase {
  readonly name: string;
  readonly seed: string;
  readonly card: unknown;
}

const groove = {
  voices: ['kick', 'snare', 'hihat'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
};

/** Cards of our own, chosen to cover meters, tuplets, mixed grids and every rule kind. */
const OWN_CARDS: readonly GoldenCase[] = [
  {
    name: 'lesson-groove',
    seed: 'lesson-12',
    card: {
      ...groove,
      bars: 4,
      tempo: 92,
      density: 0.35,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 },
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2, anticipate: true },
        { kind: 'fillHoles', voices: ['snare', 'kick'], ghost: 0.5, accent: 0.1 },
        { kind: 'tension', curve: [0.2, 0.7, 0.8, 0.1] },
      ],
    },
  },
  { name: 'defaults-only', seed: '1', card: {} },
  {
    name: 'seven-eight-mixed',
    seed: 'odd-time',
    card: {
      meter: { beats: 3, unit: 8 },
      subdivision: [2, 2, 3],
      bars: 2,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0] },
      density: 0.5,
    },
  },
  {
    name: 'polymeter-two-over-three',
    seed: 'across-the-bar',
    card: {
      ...groove,
      ostinato: { voice: 'hihat', slots: [0, 1] },
      bars: 3,
      subdivision: 2,
      density: 0.2,
      voices: ['kick', 'snare', 'hihat', 'tomFloor'],
      // Open-handed: the left hand keeps the hi-hat, so the right hand can take the floor tom
      // (leading with the right, the arms would cross both ways on beat 1).
      sticking: { lead: 'left' },
      rules: [{ kind: 'polyrhythm', voices: ['tomFloor', 'snare'], against: 2, span: 3 }],
    },
  },
  {
    name: 'euclid-rotated-kick',
    seed: 'tresillo',
    card: {
      ...groove,
      bars: 2,
      density: 0.25,
      rules: [
        { kind: 'euclid', voice: 'kick', pulses: 5, steps: 16, rotation: 2 },
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
      ],
    },
  },
  {
    name: 'fast-alternating-sixteenths',
    seed: 'two-hundred',
    card: {
      voices: ['kick', 'snare', 'hihat', 'tomHigh'],
      tempo: 200,
      bars: 2,
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.5,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    },
  },
  {
    name: 'sextuplet-linear-toms',
    seed: 'rolling',
    card: {
      subdivision: 6,
      tempo: 70,
      bars: 2,
      voices: ['kick', 'snare', 'tomHigh', 'tomFloor'],
      density: 0.6,
      rules: [{ kind: 'linear', maxOverlaps: 0 }],
    },
  },
  {
    name: 'five-four-backbeat-pushed',
    seed: 'push',
    card: {
      ...groove,
      meter: { beats: 5, unit: 4 },
      bars: 2,
      density: 0.3,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [1], shift: -1, bars: [2] }],
    },
  },
  {
    name: 'six-eight-triplet-feel',
    seed: 'compound',
    card: {
      meter: { beats: 2, unit: 4 },
      subdivision: 3,
      bars: 4,
      voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
      ostinato: { voice: 'hihat', slots: [0, 1, 2] },
      density: 0.4,
      rules: [
        { kind: 'polyrhythm', voices: ['hihatFoot'], against: 1, span: 2 },
        { kind: 'tension', curve: [0.1, 0.6] },
      ],
    },
  },
  {
    name: 'quintuplet-ride-holes',
    seed: 'five',
    card: {
      subdivision: 5,
      tempo: 64,
      bars: 2,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0, 2, 4] },
      density: 0.6,
      rules: [{ kind: 'fillHoles', voices: ['snare'], ghost: 0.75, accent: 0 }],
    },
  },
  {
    name: 'septuplets-sparse',
    seed: 'seven',
    card: {
      subdivision: 7,
      tempo: 50,
      bars: 1,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0] },
      density: 0.15,
    },
  },
  {
    name: 'one-beat-quarters',
    seed: 'minimal',
    card: {
      meter: { beats: 1, unit: 4 },
      subdivision: 1,
      bars: 3,
      voices: ['kick', 'snare'],
      density: 0.5,
    },
  },
];

/** Every built-in preset with a fixed seed, then our own cards. */
export const GOLDEN_CASES: readonly GoldenCase[] = [
  ...BUILT_IN_PRESETS.map((preset) => ({
    name: `preset-${preset.id}`,
    seed: `golden-${preset.id}`,
    card: preset.card,
  })),
  ...OWN_CARDS,
];
