import { afterEach, describe, expect, it } from 'vitest';
import { PasswordHasher } from '../auth/passwords';
import { createTestApp, type TestApp } from '../testing/test-app';
import { DEMO_ACCOUNTS, seedDemo } from './seed-demo';

const hasher = new PasswordHasher(10);
let t: TestApp | undefined;
afterEach(async () => {
  await t?.close();
  t = undefined;
});

describe('seedDemo', () => {
  it('adds the Larkspur Rhythm School accounts to an empty database, passwords hashed', async () => {
    t = await createTestApp({ seed: false });
    expect(await seedDemo(t.db, hasher)).toBe(DEMO_ACCOUNTS.length);
    const rows = (await t.db('users').select('email', 'role', 'password_hash')) as {
      email: string;
      role: string;
      password_hash: string;
    }[];
    expect(rows.map((r) => r.role).sort()).toEqual([
      'admin',
      'student',
      'student',
      'student',
      'student',
      'teacher',
      'teacher',
    ]);
    for (const account of DEMO_ACCOUNTS) {
      const row = rows.find((r) => r.email === account.email)!;
      expect(account.email).toMatch(/\.test$/);
      expect(row.password_hash).not.toContain(account.password);
      expect(row.password_hash).toMatch(/^\$scrypt\$ln=10,r=8,p=1\$/);
      expect(await hasher.verify(account.password, row.password_hash)).toBe(true);
    }
    // Same password, different salt.
    const teachers = rows.filter((r) => r.role === 'teacher');
    expect(teachers[0]!.password_hash).not.toBe(teachers[1]!.password_hash);
  });

  it('does nothing once any account exists', async () => {
    t = await createTestApp({ seed: false });
    await t
      .db('users')
      .insert({ email: 'solo@larkspur.test', name: 'Solo', role: 'admin', password_hash: 'x' });
    expect(await seedDemo(t.db, hasher)).toBe(0);
    expect(await seedDemo(t.db, hasher)).toBe(0);
    expect(Number((await t.db('users').count({ n: '*' }))[0]!['n'])).toBe(1);
  });
});
