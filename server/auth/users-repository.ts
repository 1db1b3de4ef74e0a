import type { Knex } from 'knex';
import type { PublicUser, Role } from './roles';

/** A row of the `users` table. */
export interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  created_at: string | Date;
  disabled_at: string | Date | null;
}

/** Fields needed to create an account. */
export interface NewUser {
  email: string;
  name: string;
  role: Role;
  passwordHash: string;
}

const PUBLIC_COLUMNS = ['id', 'email', 'name', 'role'] as const;

/** Reads and writes accounts. E-mail addresses are compared lower-case. */
export class UsersRepository {
  constructor(private readonly db: Knex) {}

  /** The account with this e-mail (any case), disabled or not. */
  async findByEmail(email: string): Promise<UserRow | undefined> {
    return this.db<UserRow>('users')
      .where({ email: normaliseEmail(email) })
      .first();
  }

  /** Accounts with one of these e-mails or holding `role`, stored hash included. */
  async listWithPasswordHashes(filter: {
    emails: readonly string[];
    role: Role;
  }): Promise<UserRow[]> {
    return this.db<UserRow>('users')
      .whereIn('email', filter.emails.map(normaliseEmail))
      .orWhere({ role: filter.role })
      .orderBy('id');
  }

  /** The active (not disabled) account with this id. */
  async findActiveById(id: number): Promise<PublicUser | undefined> {
    const row = await this.db<UserRow>('users')
      .select(...PUBLIC_COLUMNS)
      .where({ id })
      .whereNull('disabled_at')
      .first();
    return row ? toPublicUser(row) : undefined;
  }

  /** Every account, ordered by role then name, as the admin's users page lists them. */
  async listAll(): Promise<PublicUser[]> {
    const rows = await this.db<UserRow>('users')
      .select(...PUBLIC_COLUMNS)
      .orderByRaw("case role when 'admin' then 0 when 'teacher' then 1 else 2 end")
      .orderBy('name')
      .orderBy('id');
    return rows.map(toPublicUser);
  }

  /** Every active (not disabled) account holding `role`, in no particular order. */
  async listActiveByRole(role: Role): Promise<PublicUser[]> {
    const rows = await this.db<UserRow>('users')
      .select(...PUBLIC_COLUMNS)
      .where({ role })
      .whereNull('disabled_at');
    return rows.map(toPublicUser);
  }

  /** Stores a new password hash for the account. */
  async updatePasswordHash(id: number, passwordHash: string): Promise<void> {
    await this.db('users').where({ id }).update({ password_hash: passwordHash });
  }

  /** Any account with this id, disabled or not. */
  async findById(id: number): Promise<UserRow | undefined> {
    return this.db<UserRow>('users').where({ id }).first();
  }

  /**
   * Adds one account and returns its id; `disabled` accounts cannot sign in (an invited person
   * until they choose a password).
   */
  async insertOne(user: NewUser & { disabled: boolean }): Promise<number> {
    const [row] = (await this.db('users')
      .insert({
        email: normaliseEmail(user.email),
        name: user.name,
        role: user.role,
        password_hash: user.passwordHash,
        disabled_at: user.disabled ? new Date() : null,
      })
      .returning('id')) as ({ id: number } | number)[];
    return typeof row === 'object' ? Number(row.id) : Number(row);
  }

  /** Disables (sign-in refused, sessions dropped on their next request) or enables an account. */
  async setDisabled(id: number, disabled: boolean): Promise<void> {
    await this.db('users')
      .where({ id })
      .update({ disabled_at: disabled ? new Date() : null });
  }

  async setRole(id: number, role: Role): Promise<void> {
    await this.db('users').where({ id }).update({ role });
  }

  /** How many active admins there are. */
  async countActiveAdmins(): Promise<number> {
    const result = await this.db('users')
      .where({ role: 'admin' })
      .whereNull('disabled_at')
      .count<{ count: number | string }[]>({ count: '*' });
    return Number(result[0]?.count ?? 0);
  }

  async count(): Promise<number> {
    const result = await this.db('users').count<{ count: number | string }[]>({ count: '*' });
    return Number(result[0]?.count ?? 0);
  }

  /** Inserts accounts; returns how many were written. */
  async insertMany(users: readonly NewUser[]): Promise<number> {
    if (users.length === 0) return 0;
    await this.db('users').insert(
      users.map((user) => ({
        email: normaliseEmail(user.email),
        name: user.name,
        role: user.role,
        password_hash: user.passwordHash,
      })),
    );
    return users.length;
  }
}

/** E-mail addresses are matched without regard to case or surrounding spaces. */
export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** Strips a row to what the API may show. */
export function toPublicUser(row: Pick<UserRow, 'id' | 'email' | 'name' | 'role'>): PublicUser {
  return { id: Number(row.id), email: row.email, name: row.name, role: row.role };
}
