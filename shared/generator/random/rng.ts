import seedrandom from 'seedrandom';

/**
 * The engine's only source of randomness: a seeded generator drawn in a fixed order. seedrandom's
 * default ARC4 generator gives the same stream for the same seed in every JavaScript engine.
 */
export interface Rng {
  /** A float in [0, 1). */
  next(): number;
  /** An integer in [0, n). */
  int(n: number): number;
  /** An index chosen with probability proportional to its (non-negative) weight; -1 if all 0. */
  weighted(weights: ArrayLike<number>): number;
  /** A new array with the items in a seeded order (Fisher–Yates). */
  shuffle<T>(items: readonly T[]): T[];
}

/** Creates the seeded generator for one drill. */
export function createRng(seed: string): Rng {
  const prng = seedrandom(seed);
  const next = (): number => prng();
  const int = (n: number): number => Math.floor(next() * n);
  return {
    next,
    int,
    weighted(weights) {
      // Hot in the fill search: plain indexed loops, summed and spent in index order (the
      // float results, hence the draws, depend on that order).
      const n = weights.length;
      let total = 0;
      for (let i = 0; i < n; i++) total += weights[i] as number;
      if (total <= 0) return -1;
      let pick = next() * total;
      for (let i = 0; i < n; i++) {
        pick -= weights[i] as number;
        if (pick < 0) return i;
      }
      // Rounding can leave a sliver at the end: the last positive weight takes it.
      for (let i = n - 1; i >= 0; i--) if ((weights[i] as number) > 0) return i;
      return -1;
    },
    shuffle(items) {
      const out = items.slice();
      for (let i = out.length - 1; i > 0; i--) {
        const j = int(i + 1);
        const tmp = out[i] as (typeof out)[number];
        out[i] = out[j] as (typeof out)[number];
        out[j] = tmp;
      }
      return out;
    },
  };
}
