import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';

const INDEX = '<!doctype html><html><body><tensile-root></tensile-root></body></html>';

let dist: string;
let t: TestApp;
let bare: TestApp;
beforeAll(async () => {
  dist = await mkdtemp(path.join(os.tmpdir(), 'tensile-dist-'));
  await writeFile(path.join(dist, 'index.html'), INDEX);
  await writeFile(path.join(dist, 'main-2YQ7VRZL.js'), 'console.log(1);');
  await writeFile(path.join(dist, 'favicon.ico'), 'icon');
  t = await createTestApp({ seed: false, deps: { browserDist: dist } });
  bare = await createTestApp({ seed: false });
});
afterAll(async () => {
  await t.close();
  await bare.close();
  await rm(dist, { recursive: true, force: true });
});

describe('serving the built app', () => {
  it.each(['/', '/drills/x', '/drills/groove-1?seed=lesson-12', '/admin/users'])(
    'returns index.html, revalidated on each use, for %s',
    async (url) => {
      const res = await request(t.app).get(url).set('Accept', 'text/html');
      expect(res.status).toBe(200);
      expect(res.type).toBe('text/html');
      expect(res.text).toBe(INDEX);
      expect(res.headers['cache-control']).toBe('no-cache');
    },
  );

  it('caches content-hashed files for a year', async () => {
    const res = await request(t.app).get('/main-2YQ7VRZL.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('revalidates files without a hash', async () => {
    const res = await request(t.app).get('/favicon.ico');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('answers a missing asset with 404, not the app shell', async () => {
    const res = await request(t.app).get('/main-MISSING1.js');
    expect(res.status).toBe(404);
    expect(res.text).not.toBe(INDEX);
  });

  it('never answers /api paths with the app shell', async () => {
    const res = await request(t.app).get('/api/no-such-area/x').set('Accept', 'text/html');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('says to run the build when there is none', async () => {
    const res = await request(bare.app).get('/drills/x');
    expect(res.status).toBe(503);
    expect(res.type).toBe('text/html');
    expect(res.text).toContain('npm run build');
  });
});
