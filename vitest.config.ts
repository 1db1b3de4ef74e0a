import { defineConfig } from 'vitest/config';

// Engine, server and cross-cutting tests run in Node. Angular unit tests run through `ng test`;
// browser journeys have their own config under tests/e2e.
const include = ['shared/**/*.spec.ts', 'server/**/*.spec.ts', 'tests/**/*.spec.ts'];
const exclude = ['tests/e2e/**', 'node_modules/**', 'dist/**'];
/** Specs that measure latency under load: they run alone, after the rest, one file at a time. */
const LOAD_SPECS = '**/*.load.spec.ts';

export default defineConfig({
  test: {
    environment: 'node',
    testTimeout: 30_000,
    pool: 'forks',
    projects: [
      {
        extends: true,
        test: { name: 'node', include, exclude: [...exclude, LOAD_SPECS] },
      },
      {
        extends: true,
        test: {
          name: 'load',
          include: include.map((glob) => glob.replace('*.spec.ts', '*.load.spec.ts')),
          exclude,
          // Another test file hashing or rendering on the same 2 cores would be measured too.
          fileParallelism: false,
          sequence: { groupOrder: 1 },
        },
      },
    ],
  },
});
