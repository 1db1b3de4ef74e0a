import type { Knex } from 'knex';
import { isoTime, isoTimeOrNull } from '../rows';

/** A row of the `seed_links` table. */
interface SeedLinkRow {
  id: number;
  drill_id: number;
  code: string;
  views: number | string;
  created_at: Date | number | string;
  revoked_at: Date | number | string | null;
}

/** A share link as the API shows it. */
export interface SeedLink {
  readonly code: string;
  readonly url: string;
  readonly views: number;
  readonly createdAt: string;
  readonly revokedAt: string | null;
}

/** A link with the drill it opens. */
export interface StoredSeedLink extends SeedLink {
  readonly drillId: number;
}

/** Reads and writes `seed_links`. */
export class SeedLinksRepository {
  constructor(private readonly db: Knex) {}

  /** The drill's newest link, live or revoked. */
  async latestFor(drillId: number): Promise<SeedLink | undefined> {
    const row = await this.db<SeedLinkRow>('seed_links')
      .where({ drill_id: drillId })
      .orderBy('id', 'desc')
      .first();
    return row ? toLink(row) : undefined;
  }

  async liveFor(drillId: number): Promise<SeedLink | undefined> {
    const row = await this.db<SeedLinkRow>('seed_links')
      .where({ drill_id: drillId })
      .whereNull('revoked_at')
      .orderBy('id', 'desc')
      .first();
    return row ? toLink(row) : undefined;
  }

  async insert(drillId: number, code: string): Promise<void> {
    await this.db('seed_links').insert({
      drill_id: drillId,
      code,
      views: 0,
      created_at: new Date(),
    });
  }

  /** Revokes the drill's live links; returns how many there were. */
  async revokeAll(drillId: number): Promise<number> {
    return this.db('seed_links')
      .where({ drill_id: drillId })
      .whereNull('revoked_at')
      .update({ revoked_at: new Date() });
  }

  /**
   * Keeps the codes of the drill's links as withdrawn before the drill (and, by cascade, its
   * links) is deleted, so an old link answers 410 afterwards.
   */
  async keepAsWithdrawn(drillId: number): Promise<void> {
    const codes = await this.db<SeedLinkRow>('seed_links')
      .where({ drill_id: drillId })
      .pluck('code');
    if (codes.length === 0) return;
    const now = new Date();
    await this.db('withdrawn_seed_links')
      .insert(codes.map((code: string) => ({ code, withdrawn_at: now })))
      .onConflict('code')
      .ignore();
  }

  /** True when the code belonged to a link of a drill since deleted. */
  async wasWithdrawn(code: string): Promise<boolean> {
    return (await this.db('withdrawn_seed_links').where({ code }).first()) !== undefined;
  }

  async findByCode(code: string): Promise<StoredSeedLink | undefined> {
    const row = await this.db<SeedLinkRow>('seed_links').where({ code }).first();
    return row ? { ...toLink(row), drillId: Number(row.drill_id) } : undefined;
  }

  /** Counts one view of a live link (in SQL, so simultaneous views are all counted). */
  async countView(code: string): Promise<void> {
    await this.db('seed_links').where({ code }).whereNull('revoked_at').increment('views', 1);
  }
}

function toLink(row: SeedLinkRow): SeedLink {
  return {
    code: row.code,
    url: `/s/${row.code}`,
    views: Number(row.views),
    createdAt: isoTime(row.created_at),
    revokedAt: isoTimeOrNull(row.revoked_at),
  };
}
