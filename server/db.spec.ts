import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { SQLITE_BUSY_TIMEOUT_MS, createDb, migrateLatest, rollbackAll } from './db';
import { ProjectMigrationSource } from './migration-source';

let dir: string;
let db: Knex;
beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'tensile-db-'));
  db = createDb({
    database: { client: 'better-sqlite3', filename: path.join(dir, 'nested', 'db.sqlite') },
  });
});
afterEach(async () => {
  await db.destroy();
  await rm(dir, { recursive: true, force: true });
});

const user = { email: 'a@larkspur.test', name: 'A', role: 'student', password_hash: 'x' };

describe('createDb and migrations', () => {
  it('creates the data folder, turns on WAL and foreign keys', async () => {
    await migrateLatest(db);
    const journal = (await db.raw('pragma journal_mode')) as { journal_mode: string }[];
    const foreignKeys = (await db.raw('pragma foreign_keys')) as { foreign_keys: number }[];
    expect(journal[0]?.journal_mode).toBe('wal');
    expect(foreignKeys[0]?.foreign_keys).toBe(1);
  });

  it('sets synchronous = NORMAL and a short busy timeout, as docs/security.md states', async () => {
    const synchronous = (await db.raw('pragma synchronous')) as { synchronous: number }[];
    const timeout = (await db.raw('pragma busy_timeout')) as { timeout: number }[];
    expect(synchronous[0]?.synchronous).toBe(1); // 0 OFF, 1 NORMAL, 2 FULL, 3 EXTRA
    expect(timeout[0]?.timeout).toBe(SQLITE_BUSY_TIMEOUT_MS);
    expect(SQLITE_BUSY_TIMEOUT_MS).toBe(500);
  });

  it('runs every migration file once, in timestamp order', async () => {
    const files = await new ProjectMigrationSource().getMigrations();
    expect(files.length).toBeGreaterThanOrEqual(2);
    expect(await migrateLatest(db)).toEqual(files);
    expect(await migrateLatest(db)).toEqual([]);
  });

  it('rolls back to an empty schema and migrates again', async () => {
    await migrateLatest(db);
    await rollbackAll(db);
    expect(await db.schema.hasTable('users')).toBe(false);
    expect(await db.schema.hasTable('sessions')).toBe(false);
    await migrateLatest(db);
    expect(await db.schema.hasTable('users')).toBe(true);
  });

  it('keeps e-mails unique and lower-case, and roles to admin, teacher or student', async () => {
    await migrateLatest(db);
    await db('users').insert(user);
    await expect(db('users').insert(user)).rejects.toThrow(/UNIQUE/);
    await expect(db('users').insert({ ...user, email: 'B@larkspur.test' })).rejects.toThrow(
      /CHECK/,
    );
    await expect(
      db('users').insert({ ...user, email: 'c@larkspur.test', role: 'owner' }),
    ).rejects.toThrow(/CHECK/);
    const row = (await db('users').first()) as { created_at: unknown; disabled_at: unknown };
    expect(row.created_at).toBeTruthy();
    expect(row.disabled_at).toBeNull();
  });
});
