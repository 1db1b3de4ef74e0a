import { setTimeout as sleep } from 'node:timers/promises';
import Database from 'better-sqlite3';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import request from 'supertest';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SQLITE_BUSY_TIMEOUT_MS } from './db';
import { HttpError } from './http-error';
import { createLogger } from './logger';
import {
  SESSION_COOKIE,
  SESSION_REFRESH_MS,
  SafeSessionStore,
  createSessionStore,
} from './session';
import { postgresForTests } from './testing/postgres-scratch';
import { AGE_SESSIONS, createTestApp, findAccount, type TestApp } from './testing/test-app';

let t: TestApp | undefined;
afterEach(async () => {
  vi.restoreAllMocks();
  await t?.close();
  t = undefined;
});

/** Makes every stored session look saved an hour ago, so its next request renews it. */
async function ageSessions(app: TestApp): Promise<void> {
  if (app.db.client.config.client !== 'pg') {
    await app.db.raw(AGE_SESSIONS);
    return;
  }
  await app.db.raw(
    "update sessions set sess = jsonb_set(sess::jsonb, '{cookie,expires}', to_jsonb(to_char(" +
      "(now() at time zone 'utc') - interval '1 hour' + interval '7 days', " +
      '\'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"\')))::json',
  );
}

function sqliteFile(app: TestApp): string {
  if (app.config.database.client !== 'better-sqlite3') throw new Error('SQLite only');
  return app.config.database.filename;
}

function sessionCookie(res: request.Response): string | undefined {
  const cookies = (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];
  return cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
}

describe('session expiry writes', () => {
  it('writes nothing for signed-in requests while the session is fresh', async () => {
    t = await createTestApp();
    const agent = await t.signIn('teacher');
    const writes = vi.spyOn(ConnectSessionKnexStore.prototype, 'set');
    const touches = vi.spyOn(ConnectSessionKnexStore.prototype, 'touch');
    for (let i = 0; i < 5; i++) expect((await agent.get('/api/presets')).status).toBe(200);
    expect(writes).not.toHaveBeenCalled();
    expect(touches).not.toHaveBeenCalled();
  });

  it(`renews the expiry and the cookie once the last refresh is ${SESSION_REFRESH_MS / 60_000} minutes old`, async () => {
    t = await createTestApp();
    const agent = await t.signIn('teacher');
    await ageSessions(t);
    const writes = vi.spyOn(ConnectSessionKnexStore.prototype, 'set');
    const renewed = await agent.get('/api/presets');
    expect(renewed.status).toBe(200);
    expect(writes).toHaveBeenCalledTimes(1);
    const cookie = sessionCookie(renewed);
    expect(cookie).toBeDefined();
    const expires = Date.parse(/Expires=([^;]+)/.exec(cookie!)![1]!);
    expect(expires - Date.now()).toBeGreaterThan(6.9 * 24 * 3600_000);
    // Fresh again: the next requests write nothing.
    expect((await agent.get('/api/presets')).status).toBe(200);
    expect(writes).toHaveBeenCalledTimes(1);
  });

  it('leaves express-session no touch to call', async () => {
    t = await createTestApp({ seed: false });
    const store = createSessionStore(t.db, createLogger('silent'), 0);
    await store.inner.ready;
    expect((store as { touch?: unknown }).touch).toBeUndefined();
  });
});

describe.skipIf(postgresForTests())('a session store that fails', () => {
  it('answers 503 while another process holds the SQLite write lock, and serves again after', async () => {
    t = await createTestApp();
    const agent = await t.signIn('teacher');
    await ageSessions(t);

    // A second connection, as the sqlite3 shell or another server process would hold it.
    const other = new Database(sqliteFile(t));
    other.exec('BEGIN IMMEDIATE');
    other.prepare('UPDATE users SET name = name WHERE id = -1').run();
    const releaseAt = Date.now() + 3_000;
    let msTo503 = 0;
    try {
      // Reads go on under the lock (WAL).
      expect((await request(t.app).get('/api/health')).status).toBe(200);
      // This signed-in request is due a session refresh, a write: it waits, then gives up.
      const started = performance.now();
      const res = await agent.get('/api/presets');
      msTo503 = performance.now() - started;
      expect(res.status).toBe(503);
      expect(res.body).toEqual({
        error: { code: 'service_unavailable', message: expect.stringMatching(/try again/) },
      });
      expect(res.headers['retry-after']).toBe('5');
      // A sign-in writes too (its attempt is counted): the same 503, from the limiter's store.
      const teacher = findAccount('teacher');
      const signIn = await request(t.app)
        .post('/api/auth/sign-in')
        .send({ email: teacher.email, password: teacher.password });
      expect(signIn.status).toBe(503);
      expect(signIn.body.error.code).toBe('service_unavailable');
      // Held for several seconds in all.
      await sleep(Math.max(0, releaseAt - Date.now()));
    } finally {
      other.exec('ROLLBACK');
      other.close();
    }
    console.info(`held write lock: 503 after ${msTo503.toFixed(0)} ms`);
    expect(msTo503).toBeGreaterThanOrEqual(SQLITE_BUSY_TIMEOUT_MS - 50);
    expect(t.logLines.join('\n')).toContain('Session store failed');

    // The app is still here and the refresh that failed now goes through.
    const after = await agent.get('/api/presets');
    expect(after.status).toBe(200);
    expect(sessionCookie(after)).toBeDefined();
  });

  it.each(['get', 'set', 'destroy'] as const)(
    'turns a failed %s into a 503 error for the request, never an unhandled rejection',
    async (operation) => {
      const unhandled: unknown[] = [];
      const onUnhandled = (reason: unknown) => unhandled.push(reason);
      process.on('unhandledRejection', onUnhandled);
      try {
        const inner = {
          ready: Promise.resolve(),
          [operation]: (...args: unknown[]) => {
            const error = Object.assign(new Error('database is locked'), { code: 'SQLITE_BUSY' });
            // As connect-session-knex does: call back (when given a callback) and reject as well.
            const callback = args.at(-1);
            if (typeof callback === 'function') callback(error);
            return Promise.reject(error);
          },
        } as unknown as ConnectSessionKnexStore;
        const lines: string[] = [];
        const store = new SafeSessionStore(
          inner,
          createLogger('info', (line) => lines.push(line)),
        );
        const error = await new Promise<unknown>((resolve) => {
          if (operation === 'get') store.get('sid', resolve);
          else if (operation === 'set') store.set('sid', {} as SessionData, resolve);
          else store.destroy('sid', resolve);
        });
        expect(error).toBeInstanceOf(HttpError);
        expect((error as HttpError).status).toBe(503);
        expect(lines.join('\n')).toContain('database is locked');
        await sleep(20);
        expect(unhandled).toEqual([]);
      } finally {
        process.off('unhandledRejection', onUnhandled);
      }
    },
  );
});
