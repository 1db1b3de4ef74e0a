import { mkdir, mkdtemp, rm, utimes, writeFile } from 'node:fs/promises';
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
  await writeFile(path.join(dist, 'chunk-02xAIvIv.js'), 'console.log(2);');
  await writeFile(path.join(dist, 'notes-fallback.txt'), 'plain');
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

  it.each(['/main-2YQ7VRZL.js', '/chunk-02xAIvIv.js'])(
    'caches content-hashed %s for a year',
    async (url) => {
      const res = await request(t.app).get(url);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    },
  );

  it.each(['/favicon.ico', '/notes-fallback.txt'])(
    'revalidates %s, which has no hash',
    async (url) => {
      const res = await request(t.app).get(url);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-cache');
    },
  );

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

describe('a drill page with the build metafile beside the app', () => {
  const PAGE =
    '<!doctype html><html><head><meta charset="utf-8"><base href="/"><link rel="stylesheet" href="styles-CCCCCCCC.css"></head>' +
    '<body><tensile-root></tensile-root>' +
    '<script src="main-AAAAAAAA.js" type="module"></script></body></html>';
  const STATS = {
    outputs: {
      'main-AAAAAAAA.js': { entryPoint: 'src/main.ts', imports: [] },
      'chunk-PAGE0001.js': {
        entryPoint: 'src/app/drills/drill-page.ts',
        inputs: { 'src/app/drills/drill-page.ts': {}, 'src/app/drills/score/music-fonts.ts': {} },
        imports: [
          { path: 'chunk-MATL0001.js', kind: 'import-statement' },
          { path: 'media/bravura-BBBBBBBB.woff2', kind: 'file-loader' },
        ],
      },
      'chunk-MATL0001.js': { imports: [] },
    },
  };
  let root: string;
  let app: TestApp;
  beforeAll(async () => {
    root = await mkdtemp(path.join(os.tmpdir(), 'tensile-build-'));
    await mkdir(path.join(root, 'browser'));
    await writeFile(path.join(root, 'browser', 'index.html'), PAGE);
    await writeFile(path.join(root, 'stats.json'), JSON.stringify(STATS));
    app = await createTestApp({ seed: false, deps: { browserDist: path.join(root, 'browser') } });
  });
  afterAll(async () => {
    await app.close();
    await rm(root, { recursive: true, force: true });
  });

  it('names the API requests, the main script and the score font in the head, the page chunks after the main script', async () => {
    const res = await request(app.app).get('/drills/early-backbeat?seed=harbor-spark-21');
    expect(res.status).toBe(200);
    expect(res.type).toBe('text/html');
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).toBe(
      '<!doctype html><html><head><meta charset="utf-8">' +
        // The API requests first: the server takes longest over them.
        '<link rel="preload" as="fetch" crossorigin href="/api/auth/me">' +
        '<link rel="preload" as="fetch" crossorigin href="/api/presets/early-backbeat/drill?seed=harbor-spark-21">' +
        '<link rel="preload" as="fetch" crossorigin href="/api/presets/early-backbeat">' +
        // Then the main script (Angular writes it at the end of the body), after the base URL
        // it is resolved against.
        '<base href="/">' +
        '<link rel="modulepreload" href="main-AAAAAAAA.js">' +
        '<link rel="stylesheet" href="styles-CCCCCCCC.css">' +
        // The fonts before every script, not queued behind them.
        '<link rel="preload" as="font" type="font/woff2" crossorigin href="media/bravura-BBBBBBBB.woff2">' +
        '</head><body><tensile-root></tensile-root>' +
        '<script src="main-AAAAAAAA.js" type="module"></script>' +
        '<link rel="modulepreload" href="chunk-PAGE0001.js">' +
        '<link rel="modulepreload" href="chunk-MATL0001.js">' +
        '</body></html>',
    );
  });

  it('asks for the drill at the seed as the page does: trimmed, cut to 64 characters, escaped', async () => {
    const seed = `  ${'x'.repeat(70)}  `;
    const res = await request(app.app).get(
      `/drills/a%20card?seed=${encodeURIComponent(seed)}&other=1`,
    );
    expect(res.text).toContain(`href="/api/presets/a%20card/drill?seed=${'x'.repeat(64)}"`);
    const bare = await request(app.app).get('/drills/a%20card?seed=%20%20');
    expect(bare.text).not.toContain('/drill?');
    expect(bare.text).toContain('href="/api/presets/a%20card"');
  });

  it('keeps what the URL carries out of the markup', async () => {
    const res = await request(app.app).get(
      '/drills/x?seed=%22%3E%3Cscript%3Ealert(1)%3C%2Fscript%3E',
    );
    expect(res.text).not.toContain('<script>alert');
    expect(res.text).toContain('seed=%22%3E%3Cscript%3Ealert(1)%3C%2Fscript%3E"');
  });

  it('answers a repeated request with 304 when the page has not changed', async () => {
    const first = await request(app.app).get('/drills/early-backbeat');
    const again = await request(app.app)
      .get('/drills/early-backbeat')
      .set('If-None-Match', first.headers['etag'] as string);
    expect(again.status).toBe(304);
  });

  it.each(['/', '//', '//drills?seed=1', '/drills', '/drills/a/b', '/rule-cards/x'])(
    'leaves %s as built',
    async (url) => {
      const res = await request(app.app).get(url);
      expect(res.status).toBe(200);
      expect(res.text).toBe(PAGE);
    },
  );

  it('follows a rebuild', async () => {
    const rebuilt = structuredClone(STATS);
    rebuilt.outputs['chunk-PAGE0001.js'].imports = [];
    await writeFile(path.join(root, 'stats.json'), JSON.stringify(rebuilt));
    // A rebuild within the file system's time resolution still changes the time given here.
    const later = new Date(Date.now() + 5_000);
    await utimes(path.join(root, 'stats.json'), later, later);
    const res = await request(app.app).get('/drills/early-backbeat');
    expect(res.text).toContain('href="chunk-PAGE0001.js"');
    expect(res.text).not.toContain('chunk-MATL0001.js');
    expect(res.text).not.toContain('woff2');
    expect(res.text).toContain('href="/api/auth/me"');
  });
});
