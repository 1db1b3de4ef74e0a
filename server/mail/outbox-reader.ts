import type { Knex } from 'knex';

/** A message stored in the outbox, as tests read it. */
export interface StoredMail {
  readonly id: number;
  readonly to: string;
  readonly subject: string;
  readonly text: string;
  readonly html: string;
}

/** The newest outbox message to `to`, for tests that follow e-mailed links. */
export async function latestMailTo(db: Knex, to: string): Promise<StoredMail | undefined> {
  return db<StoredMail>('outbox').where({ to: to.toLowerCase() }).orderBy('id', 'desc').first();
}

/** The token of the first link to `/<path>/<token>` in a message's text part. */
export function linkToken(mail: StoredMail | undefined, path: string): string {
  const match = new RegExp(`/${path}/([A-Za-z0-9_-]+)`).exec(mail?.text ?? '');
  if (!match) throw new Error(`No /${path}/ link in the message "${mail?.subject ?? '(none)'}"`);
  return match[1]!;
}
