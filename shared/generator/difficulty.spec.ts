import { describe, expect, it } from 'vitest';
import { cardVariant, drillDifficulty, generateDrill, parseRuleCard } from './index';

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
});
