import { describe, expect, it } from 'vitest';
import { TENSION_WORDS, tensionScaleText, tensionWord } from './tension-words';

describe('tensionWord', () => {
  it('reads the 0..1 measure in five even bands, calm to very syncopated', () => {
    expect(tensionWord(0)).toBe('calm');
    expect(tensionWord(0.19)).toBe('calm');
    expect(tensionWord(0.2)).toBe('lightly syncopated');
    expect(tensionWord(0.47)).toBe('syncopated');
    expect(tensionWord(0.6)).toBe('strongly syncopated');
    expect(tensionWord(0.8)).toBe('very syncopated');
    expect(tensionWord(1)).toBe('very syncopated');
  });

  it('reads values outside the measure as its nearest end, and NaN as calm', () => {
    expect(tensionWord(-0.3)).toBe('calm');
    expect(tensionWord(4)).toBe('very syncopated');
    expect(tensionWord(Number.NaN)).toBe('calm');
  });

  it('never goes down as tension rises', () => {
    let last = 0;
    for (let t = 0; t <= 1; t += 0.01) {
      const rank = TENSION_WORDS.indexOf(tensionWord(t));
      expect(rank).toBeGreaterThanOrEqual(last);
      last = rank;
    }
    expect(last).toBe(TENSION_WORDS.length - 1);
  });

  it('prints its legend with the same bands', () => {
    expect(tensionScaleText()).toBe(
      'calm 0–0.2, lightly syncopated 0.2–0.4, syncopated 0.4–0.6, strongly syncopated 0.6–0.8, very syncopated 0.8–1',
    );
  });
});
