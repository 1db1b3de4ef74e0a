import { randomBytes } from 'node:crypto';
import knex from 'knex';

/**
 * When `TEST_SERVER_ON_POSTGRES=1` and `TEST_POSTGRES_URL` names a PostgreSQL server, every
 * test app gets a database of its own there (files run in parallel), dropped when it closes.
 * Otherwise test apps use a temporary SQLite file.
 */
export function postgresForTests(): string | undefined {
  const url = process.env['TEST_POSTGRES_URL'];
  return process.env['TEST_SERVER_ON_POSTGRES'] === '1' && url ? url : undefined;
}

export interface ScratchDatabase {
  readonly url: string;
  drop(): Promise<void>;
}

/** Creates an empty database beside the one `serverUrl` names; `drop()` removes it. */
export async function createScratchDatabase(serverUrl: string): Promise<ScratchDatabase> {
  const name = `tensile_t_${randomBytes(6).toString('hex')}`;
  const admin = knex({ client: 'pg', connection: serverUrl, pool: { min: 0, max: 1 } });
  try {
    await admin.raw('create database ??', [name]);
  } finally {
    await admin.destroy();
  }
  const url = new URL(serverUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    async drop() {
      const dropper = knex({ client: 'pg', connection: serverUrl, pool: { min: 0, max: 1 } });
      try {
        await dropper.raw('drop database if exists ?? with (force)', [name]);
      } finally {
        await dropper.destroy();
      }
    },
  };
}
