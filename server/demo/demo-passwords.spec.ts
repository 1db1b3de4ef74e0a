import { afterEach, describe, expect, it } from 'vitest';
import { PasswordHasher } from '../auth/passwords';
import { UsersRepository } from '../auth/users-repository';
import { createTestApp, type TestApp } from '../testing/test-app';
import {
  DemoPasswordsError,
  findDemoPasswordAccounts,
  refuseDemoPasswords,
} from './demo-passwords';
import { DEMO_ACCOUNTS } from './seed-demo';

const hasher = new PasswordHasher(10);
let t: TestApp | undefined;
afterEach(async () => {
  await t?.close();
  t = undefined;
});

async function setPassword(db: TestApp['db'], email: string, password: string): Promise<void> {
  await db('users')
    .where({ email })
    .update({ password_hash: await hasher.hash(password) });
}

describe('the production start check for demo passwords', () => {
  it('finds every demo account while it keeps its published password', async () => {
    t = await createTestApp();
    const found = await findDemoPasswordAccounts(new UsersRepository(t.db), hasher);
    expect(found.map((user) => user.email).sort()).toEqual(
      DEMO_ACCOUNTS.map((account) => account.email).sort(),
    );
    await expect(refuseDemoPasswords(new UsersRepository(t.db), hasher)).rejects.toThrow(
      DemoPasswordsError,
    );
  });

  it('finds a demo account given another demo password, and an admin with a new e-mail', async () => {
    t = await createTestApp();
    for (const account of DEMO_ACCOUNTS) await setPassword(t.db, account.email, 'ch4nged-by-admin');
    await setPassword(t.db, 'wren.okoye@larkspur.test', 'larkspur-teacher');
    await t.db('users').insert({
      email: 'head@school.example',
      name: 'Head of School',
      role: 'admin',
      password_hash: await hasher.hash('larkspur-admin'),
    });
    const found = await findDemoPasswordAccounts(new UsersRepository(t.db), hasher);
    expect(found.map((user) => user.email).sort()).toEqual([
      'head@school.example',
      'wren.okoye@larkspur.test',
    ]);
    const refusal = refuseDemoPasswords(new UsersRepository(t.db), hasher);
    await expect(refusal).rejects.toThrow(/wren\.okoye@larkspur\.test \(student\)/);
    await expect(refusal).rejects.toThrow(/head@school\.example \(admin\)/);
  });

  it('lets the start go on once no account accepts a demo password', async () => {
    t = await createTestApp();
    for (const account of DEMO_ACCOUNTS) await setPassword(t.db, account.email, 'ch4nged-by-admin');
    await expect(refuseDemoPasswords(new UsersRepository(t.db), hasher)).resolves.toBeUndefined();
  });
});
