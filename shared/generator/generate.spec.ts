import { describe, expect, it } from 'vitest';
import {
  checkDrill,
  ENGINE_VERSION,
  generateDrill,
  parseRuleCard,
  RuleConflictError,
  type RuleCard,
} from './index';

const lesson = {
  meter: { beats: 4, unit: 4 },
  bars: 4,
  subdivision: 4,
  tempo: 92,
  voices: ['kick', 'snare', 'hihat'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.35,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2, anticipate: true },
    { kind: 'fillHoles', voices: ['snare', 'kick'], ghost: 0.5, accent: 0.1 },
    { kind: 'tension', curve: [0.2, 0.7, 0.8, 0.1] },
  ],
};

describe('generateDrill', () => {
  const card = parseRuleCard(lesson);

  it('records the engine, the seed and the normalised card', () => {
    const drill = generateDrill(card, 'lesson-12');
    expect(drill.engine).toBe(ENGINE_VERSION);
    expect(drill.seed).toBe('lesson-12');
    expect(drill.card).toEqual(card);
    expect(drill.bars.map((b) => b.bar)).toEqual([1, 2, 3, 4]);
    expect(checkDrill(card, drill)).toEqual([]);
  });

  it('is deterministic to the byte, whatever the key order of the card', () => {
    const first = JSON.stringify(generateDrill(card, 'same'));
    expect(JSON.stringify(generateDrill(card, 'same'))).toBe(first);
    const reversed = Object.fromEntries(Object.entries(card).reverse()) as RuleCard;
    expect(JSON.stringify(generateDrill(reversed, 'same'))).toBe(first);
    expect(JSON.stringify(generateDrill(card, 'other'))).not.toBe(first);
  });

  it('stores no float but the 4-decimal tension', () => {
    const drill = generateDrill(card, 'ints');
    for (const bar of drill.bars) {
      expect(Math.round(bar.tension * 10000) / 10000).toBe(bar.tension);
      for (const hit of bar.hits)
        expect(Number.isInteger(hit.beat) && Number.isInteger(hit.slot)).toBe(true);
    }
  });

  it('places the backbeat, the resolutions and the anticipations of the card', () => {
    const drill = generateDrill(card, 'lesson-12');
    for (const bar of drill.bars) {
      const snare = bar.hits.filter((h) => h.source === 'backbeat').map((h) => h.beat);
      expect(snare).toEqual([2, 4]);
      const downbeatKick = bar.hits.some((h) => h.voice === 'kick' && h.beat === 1 && h.slot === 0);
      expect(downbeatKick).toBe(bar.bar % 2 === 1);
    }
    // bars 2 and 4 avoid the downbeat, so bars 1 and 3 end with a pushed kick on the "a" of 4
    for (const b of [0, 2]) {
      expect(drill.bars[b]!.hits).toContainEqual(
        expect.objectContaining({ beat: 4, slot: 3, voice: 'kick', source: 'avoidDownbeat' }),
      );
    }
  });

  it('throws a readable RuleConflictError naming both rules when they cannot hold', () => {
    const clash = parseRuleCard({
      ...lesson,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'linear', maxOverlaps: 0 },
      ],
    });
    expect(() => generateDrill(clash, 'x')).toThrow(RuleConflictError);
    expect(() => generateDrill(clash, 'x')).toThrow(
      /linear rule allows no overlaps, but the backbeat on 2 and 4 lands on the hi-hat ostinato/,
    );
  });

  it('refuses a rule voice that the card lacks even on an unparsed card', () => {
    const sneaky = { ...card, voices: ['kick', 'hihat'] } as RuleCard;
    expect(() => generateDrill(sneaky, 'x')).toThrow(
      /backbeat on 2 and 4 plays the snare, but the card's voices/,
    );
  });
});
