import request from 'supertest';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createTestApp, findAccount, type TestApp } from '../testing/test-app';
import { PasswordHasher } from './passwords';
import { DEFAULT_SIGN_IN_LIMITS, type SignInLimits } from './sign-in-limiter';

// The sign-in limiter over real HTTP (issue 7, fault 2). Each test has its own app and database,
// so counters never leak between tests; every request comes from 127.0.0.1.

const teacher = findAccount('teacher');
const admin = findAccount('admin');

let t: TestApp | undefined;
afterEach(async () => {
  await t?.close();
  t = undefined;
});

function limits(perAddress: number, perAccount: number): SignInLimits {
  return {
    perAddress: { attempts: perAddress, windowSeconds: 3600 },
    perAccount: { attempts: perAccount, windowSeconds: 900 },
  };
}

function signIn(app: TestApp, email: string, password: string, forwardedFor?: string) {
  const req = request(app.app).post('/api/auth/sign-in');
  if (forwardedFor) req.set('X-Forwarded-For', forwardedFor);
  return req.send({ email, password });
}

describe('the sign-in limiter', () => {
  it('answers 429 with Retry-After once an address and e-mail fail too often', async () => {
    t = await createTestApp({ signInLimits: limits(100, 2) });
    expect((await signIn(t, teacher.email, 'wrong-1')).status).toBe(401);
    expect((await signIn(t, teacher.email, 'wrong-2')).status).toBe(401);
    // Locked: even the right password is not checked now.
    const blocked = await signIn(t, teacher.email, teacher.password);
    expect(blocked.status).toBe(429);
    expect(blocked.body).toEqual({
      error: {
        code: 'too_many_attempts',
        message: 'Too many sign-in attempts. Try again in 15 minutes.',
      },
    });
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(890);
    // Another account from the same address is not locked.
    expect((await signIn(t, admin.email, admin.password)).status).toBe(200);
  });

  it('lets at most the limit through when 40 wrong guesses at one account arrive at once', async () => {
    t = await createTestApp();
    const limit = DEFAULT_SIGN_IN_LIMITS.perAccount.attempts;
    const base = await t.listen();
    const verify = vi.spyOn(PasswordHasher.prototype, 'verify');
    try {
      const statuses = await Promise.all(
        Array.from({ length: 40 }, async (_, i) => {
          const res = await fetch(`${base}/api/auth/sign-in`, {
            method: 'POST',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ email: teacher.email, password: `guess-${i}` }),
          });
          await res.arrayBuffer();
          return res.status;
        }),
      );
      const checked = statuses.filter((status) => status === 401).length;
      expect(checked).toBeLessThanOrEqual(limit);
      expect(statuses.filter((status) => status === 429)).toHaveLength(40 - checked);
      // Refused attempts never reached the password check.
      expect(verify.mock.calls.length).toBeLessThanOrEqual(limit);
    } finally {
      verify.mockRestore();
    }
    // The account is locked for this address, the right password included.
    expect((await signIn(t, teacher.email, teacher.password)).status).toBe(429);
  });

  it('limits one address trying many accounts, whatever X-Forwarded-For claims', async () => {
    t = await createTestApp({ signInLimits: limits(5, 10) });
    const statuses: number[] = [];
    for (let i = 0; i < 8; i++) {
      // TRUST_PROXY is off by default, so a forged header changes nothing.
      const res = await signIn(t, `made-up-${i}@larkspur.test`, 'guess', `203.0.113.${i + 1}`);
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429, 429]);
    const blocked = await signIn(t, admin.email, admin.password);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.message).toBe('Too many sign-in attempts. Try again in 1 hour.');
  });

  it('gives a successful sign-in its attempt back, so only failures count against an address', async () => {
    t = await createTestApp({ signInLimits: limits(3, 10) });
    for (let i = 0; i < 5; i++) {
      expect((await signIn(t, teacher.email, teacher.password)).status).toBe(200);
    }
    expect((await signIn(t, 'made-up@larkspur.test', 'guess')).status).toBe(401);
    expect((await signIn(t, admin.email, admin.password)).status).toBe(200);
  });

  it('counts the client X-Forwarded-For names only behind a proxy TRUST_PROXY names', async () => {
    t = await createTestApp({ signInLimits: limits(2, 10), env: { TRUST_PROXY: 'loopback' } });
    expect((await signIn(t, 'a@larkspur.test', 'guess', '203.0.113.7')).status).toBe(401);
    expect((await signIn(t, 'b@larkspur.test', 'guess', '203.0.113.7')).status).toBe(401);
    expect((await signIn(t, 'c@larkspur.test', 'guess', '203.0.113.7')).status).toBe(429);
    // Another client behind the same proxy has its own count.
    expect((await signIn(t, 'c@larkspur.test', 'guess', '203.0.113.8')).status).toBe(401);
  });
});
