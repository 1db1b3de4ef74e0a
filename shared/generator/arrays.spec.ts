import { describe, expect, it } from 'vitest';
import { arrayOf } from './arrays';

describe('arrayOf', () => {
  it('builds what Array.from builds, calling make in index order', () => {
    const calls: number[] = [];
    const made = arrayOf(5, (i) => {
      calls.push(i);
      return i * i;
    });
    expect(made).toEqual(Array.from({ length: 5 }, (_, i) => i * i));
    expect(calls).toEqual([0, 1, 2, 3, 4]);
    expect(arrayOf(0, () => 1)).toEqual([]);
  });
});
