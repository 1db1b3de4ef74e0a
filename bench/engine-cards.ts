/**
 * Cards for the engine benchmark: a 16-bar, 4-voice card that uses every rule kind (and roles, a
 * phrase fill and sticking), and a card
 * whose rules cannot all hold (a linear rule with no overlaps against a backbeat on the
 * ostinato).
 */
export const FULL_CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 16,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
  ostinato: { voice: 'hihat', slots: [0] },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4, anticipate: true },
    { kind: 'fillHoles', voices: ['snare'], ghost: 0.6, accent: 0.1 },
    { kind: 'linear', maxOverlaps: 9 },
    { kind: 'polyrhythm', voices: ['hihatFoot'], against: 4, span: 3 },
    { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, rotation: 1, span: 4 },
    // The bars the 4:3 foot leaves most room in take the highest targets (the card's reach).
    { kind: 'tension', curve: [0.6, 0.3, 0.9] },
    { kind: 'phrase', every: 8, fillBeats: 1 },
  ],
};

/** The same grid and voices as FULL_CARD, with rules that cannot all hold. */
export const UNSATISFIABLE_CARD = {
  ...FULL_CARD,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'linear', maxOverlaps: 0 },
  ],
};

const SIXTEEN_LEVELS = [
  0.1, 0.9, 0.4, 0.7, 0.2, 0.8, 0.3, 0.6, 0.5, 0.95, 0.05, 0.85, 0.15, 0.75, 0.25, 0.65,
];

/**
 * A card the bounded search used to refuse after tens of milliseconds: a 16-level tension curve
 * over hi-hat sixteenths with a 2-over-3 hi-hat-foot polymeter and no fill (density 0). The
 * reach proof now refuses it before any search.
 */
export const SEARCH_CONFLICT_CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 16,
  subdivision: 4,
  tempo: 100,
  voices: ['kick', 'snare', 'hihat', 'hihatFoot'],
  ostinato: { voice: 'hihat', slots: [0, 1, 2, 3] },
  density: 0,
  rules: [
    { kind: 'tension', curve: SIXTEEN_LEVELS },
    { kind: 'polyrhythm', voices: ['hihatFoot'], against: 2, span: 3 },
  ],
};

/**
 * The worst refusals found: the largest grid (64 bars of 15 beats in thirty-seconds), where the
 * reach proof cannot see the conflict and the search runs to its work budget. `linear` allows one
 * overlap a bar over an ostinato on every slot, so each bar gets at most one fill hit; `hands`
 * asks for a full fill at 240 beats per minute beside a ride on every other thirty-second. The
 * hands could not play that fill (no hand stroke fits between two ride strokes), but the card is
 * refused before the hands are reached: with every free slot filled, the search can only remove
 * hits and runs out of its work budget on the first attempt.
 */
export const WORST_CONFLICT_CARDS = {
  linear: {
    meter: { beats: 15, unit: 4 },
    bars: 64,
    subdivision: 8,
    tempo: 60,
    voices: ['kick', 'snare', 'hihat'],
    ostinato: { voice: 'hihat', slots: [0, 1, 2, 3, 4, 5, 6, 7] },
    density: 0.5,
    rules: [
      { kind: 'linear', maxOverlaps: 1 },
      { kind: 'tension', curve: SIXTEEN_LEVELS },
    ],
  },
  hands: {
    meter: { beats: 15, unit: 4 },
    bars: 64,
    subdivision: 8,
    tempo: 240,
    voices: ['kick', 'snare', 'tomFloor', 'ride'],
    ostinato: { voice: 'ride', slots: [0, 2, 4, 6] },
    density: 1,
    rules: [{ kind: 'tension', curve: SIXTEEN_LEVELS }],
  },
};
