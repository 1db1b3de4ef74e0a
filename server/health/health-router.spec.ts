import { readFile } from 'node:fs/promises';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp | undefined;
afterEach(async () => {
  await t?.close().catch(() => undefined);
  t = undefined;
});

async function packageVersion(): Promise<string> {
  const text = await readFile(new URL('../../package.json', import.meta.url), 'utf8');
  return (JSON.parse(text) as { version: string }).version;
}

describe('GET /api/health (anyone)', () => {
  it('reports ok with the package version', async () => {
    t = await createTestApp({ seed: false });
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok', version: await packageVersion() });
  });

  it('answers 503 with db "error" when the database is unreachable, signed in or not', async () => {
    t = await createTestApp();
    const signedIn = await t.signIn('teacher');
    await t.db.destroy();
    for (const res of [
      await request(t.app).get('/api/health'),
      await signedIn.get('/api/health'),
    ]) {
      expect(res.status).toBe(503);
      expect(res.body).toMatchObject({ status: 'error', db: 'error' });
    }
  });
});
