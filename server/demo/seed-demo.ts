import type { Knex } from 'knex';
import type { PasswordHasher } from '../auth/passwords';
import type { Role } from '../auth/roles';
import { UsersRepository } from '../auth/users-repository';

/** One invented demo account of the Larkspur Rhythm School. */
export interface DemoAccount {
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  /** A local-only demo password, shown on the sign-in page of a demo installation. */
  readonly password: string;
}

/** The invented school's accounts: one admin, two teachers, four students. */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  {
    email: 'imogen.vale@larkspur.test',
    name: 'Imogen Vale',
    role: 'admin',
    password: 'larkspur-admin',
  },
  {
    email: 'tomasz.reyes@larkspur.test',
    name: 'Tomasz Reyes',
    role: 'teacher',
    password: 'larkspur-teacher',
  },
  {
    email: 'hana.lindqvist@larkspur.test',
    name: 'Hana Lindqvist',
    role: 'teacher',
    password: 'larkspur-teacher',
  },
  {
    email: 'juno.marsh@larkspur.test',
    name: 'Juno Marsh',
    role: 'student',
    password: 'larkspur-student',
  },
  {
    email: 'felix.abara@larkspur.test',
    name: 'Felix Abara',
    role: 'student',
    password: 'larkspur-student',
  },
  {
    email: 'noor.castellan@larkspur.test',
    name: 'Noor Castellan',
    role: 'student',
    password: 'larkspur-student',
  },
  {
    email: 'wren.okoye@larkspur.test',
    name: 'Wren Okoye',
    role: 'student',
    password: 'larkspur-student',
  },
];

/**
 * Adds the demo accounts when the database has no accounts at all (first start), so a
 * restart never re-creates accounts an admin removed or changed. Returns how many were added.
 */
export async function seedDemo(db: Knex, passwords: PasswordHasher): Promise<number> {
  const users = new UsersRepository(db);
  if ((await users.count()) > 0) return 0;
  const hashed = await Promise.all(
    DEMO_ACCOUNTS.map(async (account) => ({
      email: account.email,
      name: account.name,
      role: account.role,
      passwordHash: await passwords.hash(account.password),
    })),
  );
  // Checked again inside the transaction: another process may have seeded meanwhile.
  return db.transaction(async (trx) => {
    const inTransaction = new UsersRepository(trx);
    if ((await inTransaction.count()) > 0) return 0;
    return inTransaction.insertMany(hashed);
  });
}
