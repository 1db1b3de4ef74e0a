import { describe, expect, it } from 'vitest';
import { createGrid } from '../grid';
import { parseRuleCard } from '../index';
import { ostinatoPlaysAt, placeOstinato } from './ostinato';

describe('ostinato', () => {
  it('plays its slots in every beat of every bar', () => {
    const card = parseRuleCard({
      bars: 2,
      subdivision: 4,
      ostinato: { voice: 'hihat', slots: [0, 2] },
    });
    const grid = createGrid(2, [4, 4, 4, 4]);
    const hits = placeOstinato(card, grid);
    expect(hits).toHaveLength(16);
    expect(hits.every((h) => h.voice === 'hihat' && h.source === 'ostinato')).toBe(true);
  });

  // common practice: quintuplet ostinati 1-3-5 ([0, 2, 4]) and 1-3-4 ([0, 2, 3]) leave the
  // holes {1, 3} and {1, 4} of each beat.
  it.each([
    [
      [0, 2, 4],
      [1, 3],
    ],
    [
      [0, 2, 3],
      [1, 4],
    ],
  ])('quintuplet mask %j leaves holes %j', (slots, holes) => {
    const card = parseRuleCard({
      bars: 1,
      subdivision: 5,
      ostinato: { voice: 'ride', slots },
      voices: ['kick', 'snare', 'ride'],
    });
    const grid = createGrid(1, [5, 5, 5, 5]);
    for (let beat = 0; beat < 4; beat++) {
      const found = [0, 1, 2, 3, 4].filter((slot) => !ostinatoPlaysAt(card, grid, beat * 5 + slot));
      expect(found).toEqual(holes);
    }
  });
});
