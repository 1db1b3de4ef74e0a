import type { PasswordHasher } from '../auth/passwords';
import type { PublicUser } from '../auth/roles';
import { toPublicUser, type UsersRepository } from '../auth/users-repository';
import { DEMO_ACCOUNTS } from './seed-demo';

/** Raised at start in production while an account still accepts a published demo password. */
export class DemoPasswordsError extends Error {
  override readonly name = 'DemoPasswordsError';
}

const DEMO_PASSWORDS = [...new Set(DEMO_ACCOUNTS.map((account) => account.password))];

/**
 * The accounts that still accept a demo password (the README publishes them). Checked: every
 * account with a demo e-mail, and every admin (an admin who only changed the demo e-mail would
 * still hold the published password). Each costs one hash per demo password, so the other
 * accounts, whose e-mails were never published, are left out to keep the start quick.
 */
export async function findDemoPasswordAccounts(
  users: UsersRepository,
  passwords: PasswordHasher,
): Promise<PublicUser[]> {
  const rows = await users.listWithPasswordHashes({
    emails: DEMO_ACCOUNTS.map((account) => account.email),
    role: 'admin',
  });
  const found = await Promise.all(
    rows.map(async (row) => {
      const checks = DEMO_PASSWORDS.map((password) =>
        passwords.verify(password, row.password_hash),
      );
      return (await Promise.all(checks)).some(Boolean) ? toPublicUser(row) : undefined;
    }),
  );
  return found.filter((user) => user !== undefined);
}

/** Throws {@link DemoPasswordsError}, naming the accounts, while any accepts a demo password. */
export async function refuseDemoPasswords(
  users: UsersRepository,
  passwords: PasswordHasher,
): Promise<void> {
  const found = await findDemoPasswordAccounts(users, passwords);
  if (found.length === 0) return;
  const names = found.map((user) => `${user.email} (${user.role})`).join(', ');
  throw new DemoPasswordsError(
    `This is a production start (NODE_ENV=production or an https PUBLIC_URL), and these ` +
      `accounts still accept a published demo password: ${names}. Delete them or give them new ` +
      `passwords, or set SEED_DEMO=true to run a public demo on purpose.`,
  );
}
