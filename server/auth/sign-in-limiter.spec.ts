import { afterEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { SIGN_IN_ATTEMPTS_TABLE, SignInLimiter, addressKey } from './sign-in-limiter';

let t: TestApp | undefined;
afterEach(async () => {
  await t?.close();
  t = undefined;
});

const limits = {
  perAddress: { attempts: 4, windowSeconds: 60 },
  perAccount: { attempts: 2, windowSeconds: 30 },
};

describe('SignInLimiter', () => {
  it('allows the limit of attempts per address and e-mail, then says how long to wait', async () => {
    t = await createTestApp({ seed: false });
    const limiter = new SignInLimiter(t.db, limits);
    expect(await limiter.begin('198.51.100.1', 'a@larkspur.test')).toEqual({ allowed: true });
    expect(await limiter.begin('198.51.100.1', 'a@larkspur.test')).toEqual({ allowed: true });
    const refused = await limiter.begin('198.51.100.1', 'a@larkspur.test');
    expect(refused.allowed).toBe(false);
    expect(!refused.allowed && refused.retryAfterMs).toBeGreaterThan(25_000);
    expect(!refused.allowed && refused.retryAfterMs).toBeLessThanOrEqual(30_000);
    // Other e-mails and other addresses are not locked by it.
    expect(await limiter.begin('198.51.100.1', 'b@larkspur.test')).toEqual({ allowed: true });
    expect(await limiter.begin('198.51.100.2', 'a@larkspur.test')).toEqual({ allowed: true });
  });

  it('clears the account lock after a success, and gives the address its attempt back', async () => {
    t = await createTestApp({ seed: false });
    const limiter = new SignInLimiter(t.db, limits);
    await limiter.begin('198.51.100.1', 'a@larkspur.test');
    await limiter.begin('198.51.100.1', 'a@larkspur.test');
    await limiter.succeeded('198.51.100.1', 'a@larkspur.test');
    const rows = (await t.db(SIGN_IN_ATTEMPTS_TABLE).orderBy('key')) as {
      key: string;
      points: number;
    }[];
    // One failure and one success: the address keeps one point, the account none.
    expect(rows.map((row) => [row.key, Number(row.points)])).toEqual([['address:198.51.100.1', 1]]);
  });

  it('keeps its counts in the database, shared by every limiter on it', async () => {
    t = await createTestApp({ seed: false });
    const one = new SignInLimiter(t.db, limits);
    const other = new SignInLimiter(t.db, limits);
    await one.begin('198.51.100.1', 'a@larkspur.test');
    await other.begin('198.51.100.1', 'a@larkspur.test');
    expect((await one.begin('198.51.100.1', 'a@larkspur.test')).allowed).toBe(false);
  });

  it('sweeps counters whose window ended over an hour ago', async () => {
    t = await createTestApp({ seed: false });
    const limiter = new SignInLimiter(t.db, limits);
    await limiter.begin('198.51.100.1', 'a@larkspur.test');
    expect(await limiter.sweep(Date.now())).toBe(0);
    expect(await limiter.sweep(Date.now() + 60_000 + 3_600_000 + 1)).toBe(2);
  });
});

describe('addressKey', () => {
  it.each([
    ['203.0.113.9', '203.0.113.9'],
    ['::ffff:203.0.113.9', '203.0.113.9'],
    ['2001:db8:1:2:3:4:5:6', '2001:db8:1:2::/64'],
    ['2001:db8:1:2::9', '2001:db8:1:2::/64'],
    ['2001:0DB8:0001:0002:ffff:ffff:ffff:ffff', '2001:db8:1:2::/64'],
    ['2001:db8::1', '2001:db8:0:0::/64'],
    ['::1', '0:0:0:0::/64'],
    ['fe80::1%eth0', 'fe80:0:0:0::/64'],
    ['64:ff9b::198.51.100.1', '64:ff9b:0:0::/64'],
    ['a:b:c:d:e:f:198.51.100.1', 'a:b:c:d::/64'],
    [undefined, 'unknown'],
  ])('counts %s as %s', (ip, key) => {
    expect(addressKey(ip)).toBe(key);
  });
});
