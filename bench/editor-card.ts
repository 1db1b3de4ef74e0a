/**
 * The editor benchmark's card: 16 bars, 4 voices and every rule kind, a heavy but honest card a
 * teacher could write.
 */
export const EDITOR_BENCH_CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 16,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'tomHigh'],
  ostinato: { voice: 'hihat', slots: [2], dynamic: 'normal' },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4 },
    { kind: 'phrase', every: 4, fillBeats: 2, voices: ['snare', 'tomHigh'] },
    { kind: 'fillHoles', voices: ['snare'], ghost: 0.5, accent: 0 },
    { kind: 'linear', maxOverlaps: 12 },
    { kind: 'polyrhythm', voices: ['tomHigh'], against: 4, span: 3 },
    { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, rotation: 1 },
    { kind: 'tension', curve: [0.5] },
  ],
} as const;
