import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// Browser journeys: Debian Chromium against the real server and the built app. One file at a time
// in one fork, so Chromium, the server and the test runner do not fight over two cores.
export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    include: ['tests/e2e/**/*.e2e.spec.ts'],
    environment: 'node',
    globalSetup: ['tests/e2e/global-setup.ts'],
    pool: 'forks',
    maxWorkers: 1,
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 120_000,
    teardownTimeout: 30_000,
  },
});
