import { generateFromCard, onCardScale, targetTension } from './drill-result';

const CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 4,
  subdivision: 4,
  tempo: 92,
  voices: ['kick', 'snare', 'hihat'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 },
    { kind: 'tension', curve: [0.2, 0.8] },
  ],
};

describe('generateFromCard', () => {
  it('generates the same drill for the same seed', () => {
    const first = generateFromCard(CARD, 'lesson-12');
    const again = generateFromCard(CARD, 'lesson-12');
    expect(first.status).toBe('ready');
    expect(JSON.stringify(again)).toBe(JSON.stringify(first));
  });

  it('explains a bad card in the engine’s own words', () => {
    const result = generateFromCard({ ...CARD, tempo: 5000 }, 'x');
    expect(result.status).toBe('error');
    if (result.status === 'error') {
      expect(result.heading).toBe('This rule card needs a change');
      expect(result.message.toLowerCase()).toContain('tempo');
    }
  });

  it('names conflicting rules and says what to do', () => {
    const conflicting = { ...CARD, rules: [...CARD.rules, { kind: 'linear', maxOverlaps: 0 }] };
    const result = generateFromCard(conflicting, 'x');
    expect(result.status).toBe('error');
    if (result.status === 'error') {
      expect(result.heading).toBe('These rules cannot all hold at once');
      expect(result.message).toContain('Relax one of them');
    }
  });
});

describe('targetTension', () => {
  it('repeats the card’s curve over the bars', () => {
    const result = generateFromCard(CARD, 'lesson-12');
    if (result.status !== 'ready') throw new Error('card should generate');
    expect([1, 2, 3, 4].map((bar) => targetTension(result.drill, bar))).toEqual([
      0.2, 0.8, 0.2, 0.8,
    ]);
  });

  it('is null without a tension rule', () => {
    const result = generateFromCard({ ...CARD, rules: [CARD.rules[0]] }, 'lesson-12');
    if (result.status !== 'ready') throw new Error('card should generate');
    expect(targetTension(result.drill, 1)).toBeNull();
  });
});

describe('onCardScale', () => {
  it("places a bar's tension between the card's calmest and tensest bar", () => {
    const drill = { tensionReach: { least: 0.2, most: 0.6 } } as Parameters<typeof onCardScale>[0];
    expect(onCardScale(drill, 0.2)).toBe(0);
    expect(onCardScale(drill, 0.4)).toBeCloseTo(0.5, 10);
    expect(onCardScale(drill, 0.6)).toBe(1);
    const flat = { tensionReach: { least: 0.3, most: 0.3 } } as Parameters<typeof onCardScale>[0];
    expect(onCardScale(flat, 0.3)).toBeNull();
  });
});
