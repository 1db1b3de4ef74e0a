import { setTimeout } from 'node:timers/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { DEFAULT_HASH_COST } from './passwords';

// Issue 7: with the password hash on the main thread, 4 concurrent sign-ins with made-up e-mails
// took /api/health from ~4 ms to ~1 s. Hashing on the thread pool must keep it quick.

const CONCURRENT_SIGN_INS = 8;
const SIGN_INS_EACH = 2;
const HEALTH_P99_BUDGET_MS = 50;

let t: TestApp;
let base: string;
beforeAll(async () => {
  t = await createTestApp({
    seed: false,
    // The production cost, so each made-up e-mail costs a real scrypt (the dummy-hash defence).
    env: { PASSWORD_HASH_COST: String(DEFAULT_HASH_COST) },
  });
  base = await t.listen();
});
afterAll(async () => {
  await t?.close();
});

async function timedHealth(): Promise<number> {
  const start = performance.now();
  const res = await fetch(`${base}/api/health`);
  await res.arrayBuffer();
  expect(res.status).toBe(200);
  return performance.now() - start;
}

async function signInWithMadeUpEmail(worker: number, attempt: number): Promise<number> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: `nobody-${worker}-${attempt}@larkspur.test`, password: 'guess' }),
  });
  await res.arrayBuffer();
  return res.status;
}

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

describe('a sign-in flood', () => {
  // Retried because other work on a shared machine can slow any one run; a hash on the main thread
  // (the fault this guards against) put p99 near 1 s, and fails every try.
  it(
    `keeps /api/health p99 under ${HEALTH_P99_BUDGET_MS} ms during ${CONCURRENT_SIGN_INS} concurrent sign-ins`,
    { retry: 2, timeout: 60_000 },
    async () => {
      // Warm up: connections, the dummy hash, the first queries.
      await timedHealth();
      expect(await signInWithMadeUpEmail(-1, 0)).toBe(401);

      let flooding = true;
      const flood = Promise.all(
        Array.from({ length: CONCURRENT_SIGN_INS }, async (_, worker) => {
          const statuses: number[] = [];
          for (let attempt = 0; attempt < SIGN_INS_EACH; attempt++) {
            statuses.push(await signInWithMadeUpEmail(worker, attempt));
          }
          return statuses;
        }),
      ).finally(() => (flooding = false));

      const latencies: number[] = [];
      // Bounded: the flood ends on its own, and the sampler sends at most 10,000 requests.
      while (flooding && latencies.length < 10_000) {
        latencies.push(await timedHealth());
        await setTimeout(2);
      }
      const statuses = (await flood).flat();

      // Every attempt was really checked (401), none turned away early by the limiter (429).
      expect(statuses).toEqual(Array(CONCURRENT_SIGN_INS * SIGN_INS_EACH).fill(401));
      expect(latencies.length).toBeGreaterThanOrEqual(50);
      const sorted = [...latencies].sort((a, b) => a - b);
      const p99 = percentile(sorted, 99);
      console.info(
        `health during the flood: n=${sorted.length} p50=${percentile(sorted, 50).toFixed(1)} ms ` +
          `p99=${p99.toFixed(1)} ms max=${sorted.at(-1)!.toFixed(1)} ms`,
      );
      expect(p99).toBeLessThan(HEALTH_P99_BUDGET_MS);
    },
  );
});
