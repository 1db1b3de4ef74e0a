import { describe, expect, it } from 'vitest';
import { defaultLadder, ladderProblem, moveItem, rungs } from './worksheet-items';

describe('worksheet items', () => {
  it('moves an item up, down and to either end, clamped to the list', () => {
    const list = ['a', 'b', 'c', 'd'];
    expect(moveItem(list, 2, 1)).toEqual(['a', 'c', 'b', 'd']);
    expect(moveItem(list, 0, 3)).toEqual(['b', 'c', 'd', 'a']);
    expect(moveItem(list, 3, -5)).toEqual(['d', 'a', 'b', 'c']);
    expect(moveItem(list, 9, 0)).toEqual(list);
    expect(list).toEqual(['a', 'b', 'c', 'd']);
  });

  it('lists the rungs of a ladder with the target as the last', () => {
    expect(rungs({ start: 60, target: 80, step: 5 })).toEqual([60, 65, 70, 75, 80]);
    expect(rungs({ start: 60, target: 70, step: 4 })).toEqual([60, 64, 68, 70]);
    expect(rungs({ start: 90, target: 90, step: 4 })).toEqual([90]);
    expect(rungs({ start: 90, target: 80, step: 4 })).toEqual([]);
  });

  it('says what is wrong with a ladder', () => {
    expect(ladderProblem({ start: 60, target: 80, step: 5 })).toBeNull();
    expect(ladderProblem({ start: 10, target: 80, step: 5 })).toMatch(/start tempo is 20 to 320/);
    expect(ladderProblem({ start: 60, target: 400, step: 5 })).toMatch(/target tempo is 20 to/);
    expect(ladderProblem({ start: 60, target: 80, step: 0 })).toMatch(/at least 1/);
    expect(ladderProblem({ start: 80, target: 60, step: 5 })).toMatch(/climbs/);
    expect(ladderProblem({ start: 40, target: 200, step: 1 })).toMatch(/161 rungs/);
  });

  it('starts a ladder 20 below the drill’s tempo, never under 20', () => {
    expect(defaultLadder(96)).toEqual({ start: 76, target: 96, step: 4 });
    expect(defaultLadder(30)).toEqual({ start: 20, target: 30, step: 4 });
  });
});
