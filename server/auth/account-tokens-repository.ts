import type { Knex } from 'knex';

/** The two tables of single-use link tokens. */
export type TokenTable = 'invitations' | 'password_resets';

interface TokenRow {
  id: number;
  user_id: number;
  token_hash: string;
  expires_at: Date | number | string;
  used_at: Date | number | string | null;
}

/** A stored token, found by its hash. */
export interface StoredToken {
  readonly id: number;
  readonly userId: number;
  readonly expiresAt: Date;
  readonly used: boolean;
}

/** Reads and writes invitation and password-reset tokens (hashes only). */
export class AccountTokensRepository {
  constructor(
    private readonly db: Knex,
    private readonly table: TokenTable,
  ) {}

  async insert(entry: {
    userId: number;
    hash: string;
    expiresAt: Date;
    invitedBy?: number | null;
  }): Promise<void> {
    const row: Record<string, unknown> = {
      user_id: entry.userId,
      token_hash: entry.hash,
      expires_at: entry.expiresAt,
      created_at: new Date(),
    };
    if (this.table === 'invitations') row['invited_by'] = entry.invitedBy ?? null;
    await this.db(this.table).insert(row);
  }

  async findByHash(hash: string): Promise<StoredToken | undefined> {
    const row = await this.db<TokenRow>(this.table).where({ token_hash: hash }).first();
    if (!row) return undefined;
    return {
      id: Number(row.id),
      userId: Number(row.user_id),
      expiresAt: toDate(row.expires_at),
      used: row.used_at !== null,
    };
  }

  /**
   * Marks the token used, only if it still is not: returns false when another request used it
   * first, so a link works once even under parallel clicks.
   */
  async markUsed(id: number): Promise<boolean> {
    const changed = await this.db(this.table)
      .where({ id })
      .whereNull('used_at')
      .update({ used_at: new Date() });
    return Number(changed) === 1;
  }

  /** Retires every unused token of an account (a newer link replaces older ones). */
  async retireAll(userId: number): Promise<void> {
    await this.db(this.table)
      .where({ user_id: userId })
      .whereNull('used_at')
      .update({ used_at: new Date() });
  }

  /** Whether the account has an invitation not yet used (it has not chosen a password). */
  async hasOpen(userId: number): Promise<boolean> {
    const row = await this.db(this.table).where({ user_id: userId }).whereNull('used_at').first();
    return row !== undefined;
  }
}

function toDate(value: Date | number | string): Date {
  return new Date(typeof value === 'string' && /^\d+$/.test(value) ? Number(value) : value);
}
