import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SignInLimiter } from './auth/sign-in-limiter';
import { loadConfig } from './config';
import { createDb, migrateLatest, rollbackAll } from './db';
import { authoringJourney } from './testing/authoring-journey';
import { createTestApp, findAccount, type TestApp } from './testing/test-app';

// Runs only against a disposable PostgreSQL database named by TEST_POSTGRES_URL, e.g.
// `TEST_POSTGRES_URL=postgres://tensile@127.0.0.1:55432/tensile_test npx vitest run server`.
// Every table in that database is dropped.
const url = process.env['TEST_POSTGRES_URL'];

describe.skipIf(!url)('PostgreSQL (DATABASE_URL=postgres://…)', () => {
  let t: TestApp;
  beforeAll(async () => {
    const db = createDb(loadConfig({ DATABASE_URL: url!, SESSION_SECRET: 'x'.repeat(40) }));
    await rollbackAll(db);
    await db.destroy();
    t = await createTestApp({ env: { DATABASE_URL: url! } });
  });
  afterAll(async () => {
    await rollbackAll(t.db);
    await t.close();
  });

  it('selects the pg client and runs the same migrations', async () => {
    expect(t.db.client.config.client).toBe('pg');
    expect(await t.db.schema.hasTable('users')).toBe(true);
    expect(await t.db.schema.hasTable('sessions')).toBe(true);
    expect(await migrateLatest(t.db)).toEqual([]);
  });

  it('enforces lower-case unique e-mails and the role list', async () => {
    const row = { email: 'pg@larkspur.test', name: 'P', role: 'student', password_hash: 'x' };
    await t.db('users').insert(row);
    await expect(t.db('users').insert(row)).rejects.toThrow(/unique/i);
    await expect(t.db('users').insert({ ...row, email: 'PG2@larkspur.test' })).rejects.toThrow(
      /check/i,
    );
    await expect(
      t.db('users').insert({ ...row, email: 'pg3@larkspur.test', role: 'x' }),
    ).rejects.toThrow(/check/i);
    await t.db('users').where({ email: row.email }).delete();
  });

  it('signs in, keeps the session in PostgreSQL, and signs out', async () => {
    const admin = findAccount('admin');
    const agent = t.agent();
    const res = await agent
      .post('/api/auth/sign-in')
      .send({ email: admin.email, password: admin.password });
    expect(res.status).toBe(200);
    expect(Number((await t.db('sessions').count({ n: '*' }))[0]?.n)).toBe(1);
    expect((await agent.get('/api/auth/me')).body.user.email).toBe(admin.email);
    expect((await agent.get('/api/users')).body.users).toHaveLength(7);
    expect((await agent.post('/api/auth/sign-out')).status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    expect((await request(t.app).get('/api/health')).body.db).toBe('ok');
  });

  it('counts sign-in attempts atomically when 20 arrive at once on separate connections', async () => {
    const limiter = new SignInLimiter(t.db, {
      perAddress: { attempts: 100, windowSeconds: 60 },
      perAccount: { attempts: 3, windowSeconds: 60 },
    });
    const verdicts = await Promise.all(
      Array.from({ length: 20 }, () => limiter.begin('198.51.100.9', 'pg@larkspur.test')),
    );
    expect(verdicts.filter((verdict) => verdict.allowed)).toHaveLength(3);
    await limiter.succeeded('198.51.100.9', 'pg@larkspur.test');
    expect((await limiter.begin('198.51.100.9', 'pg@larkspur.test')).allowed).toBe(true);
    expect(await limiter.sweep(Date.now() + 2 * 3_600_000)).toBeGreaterThan(0);
  });

  authoringJourney(() => t);

  it('rolls back cleanly', async () => {
    await rollbackAll(t.db);
    expect(await t.db.schema.hasTable('users')).toBe(false);
    expect(await t.db.schema.hasTable('rule_cards')).toBe(false);
    await migrateLatest(t.db);
  });
});
