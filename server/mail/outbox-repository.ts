import type { Knex } from 'knex';
import { countRows, type Page } from '../paging';
import { isoTime } from '../rows';

interface OutboxRow {
  id: number;
  to: string;
  subject: string;
  text: string;
  html: string;
  created_at: Date | number | string;
}

/** A message as the outbox list shows it. */
export interface OutboxSummary {
  readonly id: number;
  readonly to: string;
  readonly subject: string;
  readonly createdAt: string;
}

/** A stored message with both its parts. */
export interface OutboxMessage extends OutboxSummary {
  readonly text: string;
  readonly html: string;
}

export interface NewOutboxMessage {
  readonly to: string;
  readonly subject: string;
  readonly text: string;
  readonly html: string;
}

/** The `outbox` table: every message the app would have sent, when no SMTP server is set. */
export class OutboxRepository {
  constructor(private readonly db: Knex) {}

  async insert(message: NewOutboxMessage): Promise<number> {
    const [row] = (await this.db('outbox')
      .insert({ ...message, created_at: new Date() })
      .returning('id')) as ({ id: number } | number)[];
    return typeof row === 'object' ? Number(row.id) : Number(row);
  }

  /** Newest first; `to` filters by recipient (exact, lower-case). */
  async list(query: {
    page: number;
    pageSize: number;
    to?: string | undefined;
  }): Promise<Page<OutboxSummary>> {
    const rows = this.db<OutboxRow>('outbox').select('id', 'to', 'subject', 'created_at');
    if (query.to) rows.where('to', query.to.toLowerCase());
    const total = await countRows(rows);
    const page = (await rows
      .orderBy('id', 'desc')
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as OutboxRow[];
    return {
      items: page.map((row) => ({
        id: Number(row.id),
        to: row.to,
        subject: row.subject,
        createdAt: isoTime(row.created_at),
      })),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }

  async find(id: number): Promise<OutboxMessage | undefined> {
    const row = await this.db<OutboxRow>('outbox').where({ id }).first();
    if (!row) return undefined;
    return {
      id: Number(row.id),
      to: row.to,
      subject: row.subject,
      text: row.text,
      html: row.html,
      createdAt: isoTime(row.created_at),
    };
  }
}
