import { mkdirSync } from 'node:fs';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import type { Config } from './config';
import { MIGRATIONS_DIR, MIGRATION_EXTENSIONS, ProjectMigrationSource } from './migration-source';

type DbConfig = Pick<Config, 'database'>;

/**
 * How long a write waits for another process's SQLite write lock before failing with
 * SQLITE_BUSY (answered 503). better-sqlite3 waits on the main thread, so every request waits
 * with it: long enough for another process's short write, short enough that a stuck lock stalls
 * the server for half a second per write instead of seconds.
 */
export const SQLITE_BUSY_TIMEOUT_MS = 500;

/** better-sqlite3's connection object, as far as `afterCreate` needs it. */
interface SqliteConnection {
  pragma(source: string): unknown;
}

/**
 * The Knex settings for the configured database. Also used by knexfile.ts for the knex CLI,
 * which reads migrations straight from the directory.
 */
export function knexConfig(config: DbConfig): Knex.Config {
  const migrations = { directory: MIGRATIONS_DIR, loadExtensions: [...MIGRATION_EXTENSIONS] };
  const { database } = config;
  if (database.client === 'pg') {
    return { client: 'pg', connection: database.connectionString, migrations };
  }
  return {
    client: 'better-sqlite3',
    connection: { filename: database.filename },
    useNullAsDefault: true,
    migrations,
    pool: {
      // SQLite allows one writer at a time; one pooled connection avoids SQLITE_BUSY between
      // our own connections, and WAL keeps readers from blocking that writer.
      min: 1,
      max: 1,
      afterCreate(connection: SqliteConnection, done: (error: Error | null, c: unknown) => void) {
        try {
          // Set here rather than trusted to build defaults; docs/security.md says what each
          // means (synchronous = NORMAL: a power cut may lose the last commits, never the file).
          connection.pragma('journal_mode = WAL');
          connection.pragma('synchronous = NORMAL');
          connection.pragma('foreign_keys = ON');
          connection.pragma(`busy_timeout = ${SQLITE_BUSY_TIMEOUT_MS}`);
          done(null, connection);
        } catch (error) {
          done(error as Error, connection);
        }
      },
    },
  };
}

/** Opens the configured database (creating the SQLite file's folder when needed). */
export function createDb(config: DbConfig): Knex {
  const { database } = config;
  if (database.client === 'better-sqlite3' && database.filename !== ':memory:') {
    mkdirSync(path.dirname(database.filename), { recursive: true });
  }
  return knex(knexConfig(config));
}

/** Brings the schema up to date; returns the names of the migrations it ran. */
export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, ran] = (await db.migrate.latest({ migrationSource: new ProjectMigrationSource() })) as [
    number,
    string[],
  ];
  return ran;
}

/** Undoes every migration (used by the migration round-trip test). */
export async function rollbackAll(db: Knex): Promise<void> {
  await db.migrate.rollback({ migrationSource: new ProjectMigrationSource() }, true);
}
