import { describe, expect, it } from 'vitest';

import { freshSeedWord } from './seed-word';

describe('freshSeedWord', () => {
  it('makes a readable word-word-number seed that is URL-safe', () => {
    for (let i = 0; i < 50; i++) {
      const seed = freshSeedWord();
      expect(seed).toMatch(/^[a-z]+-[a-z]+-[1-9]\d$/);
      expect(encodeURIComponent(seed)).toBe(seed);
    }
  });

  it('varies from call to call', () => {
    const seeds = new Set(Array.from({ length: 40 }, () => freshSeedWord()));
    expect(seeds.size).toBeGreaterThan(30);
  });

  it('uses the given index source, so the choice is testable', () => {
    expect(freshSeedWord(() => 0)).toBe('amber-anchor-10');
  });
});
