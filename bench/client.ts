/**
 * Client cold load: how long a drill page takes, in a fresh browser context (empty cache) on
 * loopback, from navigation to a drawn score, and what it downloads. Also prints the initial
 * bundle (what index.html loads before any route). Needs a build: run `npm run bench:client`.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { BUILT_APP_DIR, launchChromium, signIn, startServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';

const RUNS = Number(process.env['BENCH_RUNS'] ?? 15);
const DRILL = '/drills/early-backbeat?seed=harbor-spark-21';
const SCORE = 'tensile-drill-score svg .tensile-bar';

if (!existsSync(join(BUILT_APP_DIR, 'index.html'))) {
  console.error('No build found in dist/tensile/browser: run `npm run build` first.');
  process.exit(1);
}

/** index.html's scripts, stylesheets and module preloads, and the chunks they import statically. */
function initialFiles(): string[] {
  const html = readFileSync(join(BUILT_APP_DIR, 'index.html'), 'utf8');
  const queue = [
    ...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g),
    ...html.matchAll(/<link[^>]*rel="(?:stylesheet|modulepreload)"[^>]*href="([^"]+)"/g),
  ].map((m) => m[1] as string);
  const seen = new Set<string>();
  while (queue.length > 0) {
    const file = queue.pop() as string;
    if (seen.has(file)) continue;
    seen.add(file);
    if (!file.endsWith('.js')) continue;
    const code = readFileSync(join(BUILT_APP_DIR, file), 'utf8');
    const imports = code.matchAll(
      /(?:^|[;\s}])(?:import|export)\s*(?:[\w*{}\s,$]+from\s*)?["']\.\/([^"']+\.js)["']/g,
    );
    queue.push(...[...imports].map((m) => m[1] as string));
  }
  return [...seen];
}

function sizes(files: readonly string[]): { raw: number; gzip: number } {
  return files.reduce(
    (sum, file) => {
      const bytes = readFileSync(join(BUILT_APP_DIR, file));
      return { raw: sum.raw + bytes.length, gzip: sum.gzip + gzipSync(bytes, { level: 9 }).length };
    },
    { raw: 0, gzip: 0 },
  );
}

const kB = (bytes: number): string => `${(bytes / 1024).toFixed(1)} kB`;

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

declare global {
  interface Window {
    __scoreDrawnAt?: number;
    __lcp?: number;
  }
}

const server = await startServer();
const browser = await launchChromium();
try {
  // Signed in once; every run reuses the cookie in a fresh context with an empty cache.
  const login = await browser.newContext();
  const teacher = DEMO_TEACHERS[0]!;
  await signIn(await login.newPage(), server.url, teacher.email, teacher.password);
  const storageState = await login.storageState();
  await login.close();

  const drawn: number[] = [];
  const lcp: number[] = [];
  let scriptsBeforeScore: string[] = [];
  let foundByImport = 0;
  for (let run = 0; run < RUNS; run++) {
    const context = await browser.newContext({
      storageState,
      viewport: { width: 1280, height: 900 },
    });
    const page = await context.newPage();
    await page.addInitScript((selector: string) => {
      new PerformanceObserver((list) => {
        for (const entry of list.getEntries()) window.__lcp = entry.startTime;
      }).observe({ type: 'largest-contentful-paint', buffered: true });
      const observer = new MutationObserver(() => {
        if (document.querySelector(selector)) {
          window.__scoreDrawnAt = performance.now();
          observer.disconnect();
        }
      });
      document.addEventListener('DOMContentLoaded', () =>
        observer.observe(document.body, { childList: true, subtree: true }),
      );
    }, SCORE);
    await page.goto(`${server.url}${DRILL}`);
    await page.waitForFunction(() => window.__scoreDrawnAt !== undefined, null, {
      timeout: 30_000,
    });
    // Let the paint of the score land before reading the largest contentful paint.
    await page.waitForTimeout(300);
    const times = await page.evaluate(() => {
      const drawn = window.__scoreDrawnAt!;
      // Scripts whose fetch began before the score was drawn: what the score's path needed.
      const entries = performance
        .getEntriesByType('resource')
        .filter((entry) => entry.name.endsWith('.js') && entry.startTime < drawn)
        .map((entry) => entry as PerformanceResourceTiming);
      const scripts = entries.map((entry) => new URL(entry.name).pathname.slice(1));
      // Found only when a module importing them ran: a wave the page's HTML did not name ahead.
      const imported = entries.filter((entry) => entry.initiatorType === 'script').length;
      return { drawn, lcp: window.__lcp, scripts, imported };
    });
    drawn.push(times.drawn);
    if (times.lcp !== undefined) lcp.push(times.lcp);
    if (run === 0) {
      scriptsBeforeScore = times.scripts;
      foundByImport = times.imported;
    }
    await context.close();
  }

  const initial = initialFiles();
  const initialSize = sizes(initial);
  const routeScripts = scriptsBeforeScore.filter((file) => existsSync(join(BUILT_APP_DIR, file)));
  const routeSize = sizes(routeScripts);
  const sorted = [...drawn].sort((a, b) => a - b);
  console.log(
    `Initial bundle: ${initial.length} files, ${kB(initialSize.raw)} raw, ${kB(initialSize.gzip)} gzip`,
  );
  console.log(
    `Scripts loaded by ${DRILL} before its score is drawn: ${routeScripts.length} files, ` +
      `${kB(routeSize.raw)} raw, ${kB(routeSize.gzip)} gzip; ${foundByImport} of them found only ` +
      `by importing (main included), the rest named by the page's HTML`,
  );
  const audio = routeScripts.filter((file) =>
    readFileSync(join(BUILT_APP_DIR, file), 'utf8').includes('ToneAudioNode'),
  );
  console.log(
    audio.length === 0
      ? 'Tone.js: not loaded before Play'
      : `Tone.js loaded early: ${audio.join(', ')}`,
  );
  // The server generates the page's drill: the engine (and zod with it) has no place on the path.
  const zod = routeScripts.filter((file) =>
    readFileSync(join(BUILT_APP_DIR, file), 'utf8').includes('_zod'),
  );
  console.log(
    zod.length === 0
      ? 'Engine and zod: not loaded before the score'
      : `zod loaded before the score: ${zod.join(', ')}`,
  );
  console.log(
    `Client cold load: navigation to drawn score median ${median(drawn).toFixed(0)} ms ` +
      `(min ${sorted[0]!.toFixed(0)}, max ${sorted[sorted.length - 1]!.toFixed(0)}; ` +
      `largest contentful paint median ${lcp.length ? median(lcp).toFixed(0) : 'n/a'} ms; ` +
      `${RUNS} fresh contexts, headless Chromium, loopback)`,
  );
} finally {
  await browser.close();
  await server.stop();
}
