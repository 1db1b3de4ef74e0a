/**
 * Cards for the engine benchmark: a 16-bar, 4-voice card that uses every rule kind, and a card
 * whose rules cannot all hold (a linear rule with no overlaps against a backbeat on the
 * ostinato).
 */
export const FULL_CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 16,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4, anticipate: true },
    { kind: 'fillHoles', voices: ['snare'], ghost: 0.6, accent: 0.1 },
    { kind: 'linear', maxOverlaps: 9 },
    { kind: 'polyrhythm', voices: ['hihatFoot'], against: 4, span: 3 },
    { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, rotation: 1, span: 4 },
    { kind: 'tension', curve: [0.3, 0.6, 0.9] },
  ],
};

export const UNSATISFIABLE_CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 16,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'linear', maxOverlaps: 0 },
  ],
};
