import { describe, expect, it } from 'vitest';
import { cardVariant, drillDifficulty, generateDrill, parseRuleCard } from './index';
import { findBuiltInPreset } from './presets/index';

const groove = (over: Record<string, unknown>) =>
  parseRuleCard({
    ostinato: { voice: 'hihat', slots: [0, 2] },
    density: 0.3,
    rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    ...over,
  });

describe('drill difficulty', () => {
  it('reads the fastest hand from the drill: eighths on the hi-hat at 120 are 4 notes a second', () => {
    // 120 beats a minute, two eighths a beat, one hand on the hi-hat: 4 strokes a second
    // (derived: 60 000 / (120 × 2) = 250 ms between strokes).
    const drill = generateDrill(groove({ tempo: 120, density: 0 }), 'a');
    expect(drill.difficulty.factors.handRate).toBe(4);
    expect(drill.difficulty).toEqual(drillDifficulty(drill));
  });

  it('rises with tempo and density, and stays within 0..10', () => {
    const seeds = ['a', 'b', 'c', 'd', 'e'];
    const mean = (card: ReturnType<typeof groove>) =>
      seeds.reduce((sum, s) => sum + generateDrill(card, s).difficulty.score, 0) / seeds.length;
    const slow = mean(groove({ tempo: 60, density: 0.1 }));
    const fast = mean(groove({ tempo: 160, density: 0.7 }));
    expect(fast).toBeGreaterThan(slow);
    for (const card of [groove({ tempo: 20 }), groove({ tempo: 200, density: 1 })]) {
      const { score } = generateDrill(card, 'z').difficulty;
      expect(score).toBeGreaterThanOrEqual(0);
      expect(score).toBeLessThanOrEqual(10);
    }
  });

  it('makes easier and harder cards that keep the idea', () => {
    const card = groove({ tempo: 100, density: 0.3 });
    const easier = cardVariant(card, 'easier');
    const harder = cardVariant(card, 'harder');
    expect([easier.tempo, easier.density]).toEqual([85, 0.15]);
    expect([harder.tempo, harder.density]).toEqual([110, 0.45]);
    expect(easier.rules).toEqual(card.rules);
    expect(harder.ostinato).toEqual(card.ostinato);
  });

  // The first groove a student learns (common practice): eighths on the hi-hat, kick on 1 and 3,
  // snare on 2 and 4, every note struck with the hi-hat. Nothing lies between the time's notes.
  const rockBeat = parseRuleCard({
    subdivision: 2,
    tempo: 84,
    voices: ['kick', 'snare', 'hihat'],
    ostinato: { voice: 'hihat', slots: [0, 1] },
    density: 0,
    rules: [
      { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
      { kind: 'backbeat', voice: 'kick', beats: [1, 3], dynamic: 'normal' },
    ],
  });

  it('rates the first rock beat a student learns as beginner, with no independence asked', () => {
    const { difficulty } = generateDrill(rockBeat, 'a');
    expect(difficulty.factors.independence).toBe(0);
    expect(difficulty.level).toBe('beginner');
  });

  it('counts the notes placed between the time as independence: a linear groove asks for it', () => {
    const linear = parseRuleCard({
      voices: ['kick', 'snare', 'hihat'],
      tempo: 84,
      ostinato: { voice: 'hihat', slots: [2] },
      density: 0.5,
      rules: [
        { kind: 'linear', maxOverlaps: 0 },
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
      ],
    });
    const { difficulty } = generateDrill(linear, 'a');
    // No limb ever strikes with the hi-hat: every other note lies between its strokes.
    expect(difficulty.factors.independence).toBe(1);
    expect(difficulty.score).toBeGreaterThan(generateDrill(rockBeat, 'a').difficulty.score);
  });

  it('rates the first preset (kick off the one, quarter-note hi-hat) beginner at most seeds', () => {
    const card = parseRuleCard(findBuiltInPreset('kick-off-the-one')?.card);
    const scores = Array.from(
      { length: 20 },
      (_, i) => generateDrill(card, `s${i}`).difficulty.score,
    ).sort((a, b) => a - b);
    // Median beginner (below 3.5); never past the low end of intermediate.
    expect(scores[10]).toBeLessThan(3.5);
    expect(scores[19]).toBeLessThanOrEqual(4);
  });
});

describe('drill difficulty: the feel', () => {
  const feel = (over: Record<string, unknown>) =>
    generateDrill(groove(over), 'feel').difficulty.factors.feel;

  // Odd tuplets read and play harder than sixteenths at the same rate (common practice).
  it('adds points for notes inside a quintuplet or septuplet beat, not for sixteenths', () => {
    expect(feel({ subdivision: 5, ostinato: { voice: 'hihat', slots: [0, 2, 4] } })).toBe(2);
    expect(feel({ subdivision: 7, ostinato: { voice: 'hihat', slots: [0, 2, 4] } })).toBe(2);
    expect(feel({ subdivision: 4 })).toBe(0);
  });

  // 4 over 3 is felt against the beat; 2 over 4 and 6 over 3 fall on beats and halves.
  it('adds points for a cross-rhythm only', () => {
    const poly = (against: number, span: number) =>
      feel({
        meter: { beats: span === 3 ? 3 : 4, unit: 4 },
        subdivision: 4,
        rules: [{ kind: 'polyrhythm', voices: ['kick'], against, span }],
      });
    expect(poly(4, 3)).toBe(2);
    expect(poly(2, 4)).toBe(0);
    expect(poly(6, 3)).toBe(0);
  });

  it('adds a point for an uneven grouping and one for a snare backbeat moved off 2 and 4', () => {
    expect(
      feel({
        meter: { beats: 7, unit: 8 },
        subdivision: 2,
        ostinato: { voice: 'hihat', slots: [0] },
        rules: [],
      }),
    ).toBe(1);
    expect(
      feel({
        meter: { beats: 6, unit: 8 },
        subdivision: 2,
        ostinato: { voice: 'hihat', slots: [0] },
        rules: [],
      }),
    ).toBe(0);
    expect(feel({ rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: -1 }] })).toBe(
      1,
    );
    expect(feel({ rules: [{ kind: 'backbeat', voice: 'snare', beats: [1, 3], shift: 2 }] })).toBe(
      0,
    );
  });
});
