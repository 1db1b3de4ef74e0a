import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../index';

const card = parseRuleCard({
  bars: 8,
  voices: ['kick', 'snare', 'hihat', 'crash', 'tomHigh', 'tomMid', 'tomFloor'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'phrase', every: 4, fillBeats: 2 },
  ],
});

describe('phrase', () => {
  it('fills the defaults: snare and toms high to low, crash on the landing', () => {
    expect(card.rules[1]).toEqual({
      kind: 'phrase',
      every: 4,
      fillBeats: 2,
      voices: ['snare', 'tomHigh', 'tomMid', 'tomFloor'],
      crash: true,
    });
  });

  it('ends every fourth bar with a fill around the kit and lands on one with kick and crash', () => {
    for (const seed of ['a', 'b', 'c', 'd', 'e']) {
      const drill = generateDrill(card, seed);
      for (const bar of drill.bars) {
        const fill = bar.hits.filter((h) => h.source === 'phrase' && h.beat >= 3);
        const isFillBar = bar.bar % 4 === 0;
        if (!isFillBar) {
          expect(fill).toEqual([]);
          continue;
        }
        // Every sixteenth of beats 3 and 4 sounds: the run, or the backbeat it leaves in place.
        const sounding = bar.hits.filter(
          (h) => h.beat >= 3 && h.voice !== 'hihat' && h.voice !== 'kick',
        );
        expect(new Set(sounding.map((h) => `${h.beat}.${h.slot}`)).size).toBe(8);
        // The hands leave the hi-hat during the fill.
        expect(bar.hits.some((h) => h.voice === 'hihat' && h.beat >= 3)).toBe(false);
        // Around the kit: the run never climbs back up once it has moved down.
        const order = ['snare', 'tomHigh', 'tomMid', 'tomFloor'];
        const ranks = fill.map((h) => order.indexOf(h.voice));
        expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
        const next = drill.bars[bar.bar % drill.bars.length];
        const landing = next?.hits.filter((h) => h.beat === 1 && h.slot === 0) ?? [];
        expect(landing.map((h) => h.voice).sort()).toEqual(['crash', 'kick']);
      }
    }
  });

  it('refuses a phrase that does not divide the drill, and a fill longer than the bar', () => {
    expect(() =>
      parseRuleCard({ bars: 6, voices: ['kick', 'snare'], rules: [{ kind: 'phrase', every: 4 }] }),
    ).toThrow(/a 4-bar phrase needs a drill of 4, 8 or 12 bars/);
    expect(() =>
      parseRuleCard({
        voices: ['kick', 'snare'],
        rules: [{ kind: 'phrase', every: 2, fillBeats: 5 }],
      }),
    ).toThrow(/the fill lasts 5 beats, but a bar has only 4/);
  });
});
