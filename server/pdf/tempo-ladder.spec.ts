import { describe, expect, it } from 'vitest';
import { ladderRungs, MAX_RUNGS } from './tempo-ladder';

describe('ladderRungs', () => {
  it('climbs from start to target in steps, the target last', () => {
    expect(ladderRungs({ start: 60, target: 80, step: 5 })).toEqual([60, 65, 70, 75, 80]);
    expect(ladderRungs({ start: 60, target: 78, step: 5 })).toEqual([60, 65, 70, 75, 78]);
  });

  it('steps down when the target is slower, and holds one rung when they are equal', () => {
    expect(ladderRungs({ start: 100, target: 90, step: 4 })).toEqual([100, 96, 92, 90]);
    expect(ladderRungs({ start: 90, target: 90, step: 4 })).toEqual([90]);
  });

  it('thins a fine ladder to a printable number of rungs, keeping both ends', () => {
    const rungs = ladderRungs({ start: 40, target: 200, step: 1 });
    expect(rungs).toHaveLength(MAX_RUNGS);
    expect(rungs[0]).toBe(40);
    expect(rungs.at(-1)).toBe(200);
    for (let i = 1; i < rungs.length; i++) expect(rungs[i]!).toBeGreaterThan(rungs[i - 1]!);
  });
});
