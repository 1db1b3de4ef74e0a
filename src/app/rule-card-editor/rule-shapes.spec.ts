import { describe, expect, it } from 'vitest';
import { bjorklund } from '../../../shared/generator/rhythm/bjorklund';
import { euclidDots, landingSpans, spanLands } from './rule-shapes';

const show = (dots: boolean[]): string => dots.map((on) => (on ? 'x' : '.')).join('');

describe('euclidDots', () => {
  it('draws the patterns of Toussaint 2005, table of Euclidean rhythms', () => {
    // G. T. Toussaint, "The Euclidean Algorithm Generates Traditional Musical Rhythms", 2005.
    expect(show(euclidDots(3, 8))).toBe('x..x..x.');
    expect(show(euclidDots(5, 13))).toBe('x..x.x..x.x..');
    expect(show(euclidDots(2, 3))).toBe('x.x');
  });

  it('turns the pattern left by the rotation', () => {
    expect(show(euclidDots(3, 8, 1))).toBe('..x..x.x');
  });

  it('matches the engine pattern for every small case', () => {
    for (let steps = 1; steps <= 16; steps += 1) {
      for (let pulses = 0; pulses <= steps; pulses += 1) {
        expect(euclidDots(pulses, steps)).toEqual(bjorklund(pulses, steps));
      }
    }
  });

  it('shows nothing for a pattern the engine refuses', () => {
    expect(euclidDots(9, 8)).toEqual([]);
  });
});

describe('polyrhythm spans', () => {
  it('lets 4 against 3 land on sixteenths (a hit every three sixteenths)', () => {
    // 4:3 puts hits at 0, 3/4, 6/4, 9/4 beats: common practice.
    expect(spanLands(4, 3, [4, 4, 4, 4], 16)).toBe(true);
    expect(spanLands(4, 3, [3, 3, 3, 3], 16)).toBe(false);
  });

  it('lists the spans of 3 against n on eighths', () => {
    expect(landingSpans(3, [2, 2, 2, 2], 16, 6)).toEqual([3, 6]);
  });

  it('checks every beat of a mixed grid', () => {
    // 2 over 1 beat needs an even split of every beat; a triplet beat breaks it.
    expect(spanLands(2, 1, [4, 4, 4, 4], 8)).toBe(true);
    expect(spanLands(2, 1, [4, 4, 3, 4], 8)).toBe(false);
  });
});
