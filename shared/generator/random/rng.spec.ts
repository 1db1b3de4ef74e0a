import { describe, expect, it } from 'vitest';
import { createRng } from './rng';

describe('createRng', () => {
  it('gives the same stream for the same seed and another for another seed', () => {
    const a = createRng('lesson-12');
    const b = createRng('lesson-12');
    const c = createRng('lesson-13');
    const draw = (r: ReturnType<typeof createRng>) => Array.from({ length: 5 }, () => r.next());
    const first = draw(a);
    expect(draw(b)).toEqual(first);
    expect(draw(c)).not.toEqual(first);
  });

  it('draws weighted indexes in proportion and never a zero weight', () => {
    const rng = createRng('w');
    const counts = [0, 0, 0];
    for (let i = 0; i < 3000; i++) counts[rng.weighted([1, 0, 3])]!++;
    expect(counts[1]).toBe(0);
    expect(counts[2]! / counts[0]!).toBeGreaterThan(2.4);
    expect(counts[2]! / counts[0]!).toBeLessThan(3.7);
    expect(rng.weighted([0, 0])).toBe(-1);
  });

  it('shuffles into a permutation', () => {
    const out = createRng('s').shuffle([1, 2, 3, 4, 5]);
    expect([...out].sort()).toEqual([1, 2, 3, 4, 5]);
  });
});
