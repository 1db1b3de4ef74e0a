import { defineConfig } from 'vitest/config';

// Engine, server and cross-cutting tests run in Node. Angular unit tests run through `ng test`;
// browser journeys have their own config under tests/e2e.
export default defineConfig({
  test: {
    include: ['shared/**/*.spec.ts', 'server/**/*.spec.ts', 'tests/**/*.spec.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**', 'dist/**'],
    environment: 'node',
    testTimeout: 30_000,
    pool: 'forks',
  },
});
