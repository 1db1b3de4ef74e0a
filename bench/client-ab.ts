/**
 * Client cold load, A/B: two checkouts' servers (each with its own build) side by side, fresh
 * headless-Chromium contexts alternating between them in the same minutes, so the machine's load
 * falls on both alike. Besides the time to a drawn score it counts what does not depend on load:
 * requests and bytes before the score, long tasks. Usage:
 * `CLIENT_AB=/path/to/a,/path/to/b BENCH_RUNS=12 tsx bench/client-ab.ts`.
 */
import { launchChromium, signIn, startServer, type RunningServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';

const RUNS = Number(process.env['BENCH_RUNS'] ?? 12);
const ROOTS = (process.env['CLIENT_AB'] ?? '').split(',').filter(Boolean);
const DRILL = '/drills/early-backbeat?seed=harbor-spark-21';
const SCORE = 'tensile-drill-score svg .tensile-bar';
if (ROOTS.length !== 2) {
  console.error('Set CLIENT_AB=<checkout A>,<checkout B>, each built.');
  process.exit(1);
}

declare global {
  interface Window {
    __scoreDrawnAt?: number;
    __lcp?: number;
    __longTasks?: number[];
  }
}

interface Run {
  drawn: number;
  lcp: number;
  requests: number;
  kB: number;
  lastFile: number;
  longTasks: number;
  longTaskMs: number;
}

const median = (values: readonly number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

const servers: RunningServer[] = [];
for (const root of ROOTS) servers.push(await startServer({ root }));
const browser = await launchChromium();
try {
  const states = [];
  for (const server of servers) {
    const login = await browser.newContext();
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(await login.newPage(), server.url, teacher.email, teacher.password);
    states.push(await login.storageState());
    await login.close();
  }
  const runs: Run[][] = [[], []];
  for (let run = 0; run < RUNS; run++) {
    // Alternate which side goes first, so neither always meets the other's leftovers.
    for (const side of run % 2 ? [1, 0] : [0, 1]) {
      const context = await browser.newContext({
        storageState: states[side],
        viewport: { width: 1280, height: 900 },
      });
      const page = await context.newPage();
      await page.addInitScript((selector: string) => {
        window.__longTasks = [];
        new PerformanceObserver((list) => {
          for (const entry of list.getEntries()) window.__lcp = entry.startTime;
        }).observe({ type: 'largest-contentful-paint', buffered: true });
        new PerformanceObserver((list) => {
          for (const entry of list.getEntries()) {
            if (window.__scoreDrawnAt === undefined) window.__longTasks!.push(entry.duration);
          }
        }).observe({ type: 'longtask', buffered: true });
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
      await page.goto(`${servers[side]!.url}${DRILL}`);
      await page.waitForFunction(() => window.__scoreDrawnAt !== undefined, null, {
        timeout: 30_000,
      });
      await page.waitForTimeout(300);
      const result = await page.evaluate(() => {
        const drawn = window.__scoreDrawnAt!;
        const entries = performance
          .getEntriesByType('resource')
          .map((entry) => entry as PerformanceResourceTiming)
          .filter((entry) => entry.startTime < drawn);
        const nav = performance.getEntriesByType('navigation')[0] as PerformanceResourceTiming;
        const files = entries.filter((entry) => !entry.name.includes('/api/'));
        return {
          drawn,
          lcp: window.__lcp ?? NaN,
          requests: entries.length + 1,
          kB:
            (entries.reduce((sum, entry) => sum + entry.transferSize, 0) + nav.transferSize) / 1024,
          lastFile: Math.max(...files.map((entry) => entry.responseEnd)),
          longTasks: window.__longTasks!.length,
          longTaskMs: window.__longTasks!.reduce((sum, ms) => sum + ms, 0),
        };
      });
      runs[side]!.push(result);
      await context.close();
    }
  }
  ROOTS.forEach((root, side) => {
    const r = runs[side]!;
    const pick = (key: keyof Run): number[] => r.map((run) => run[key]);
    const drawn = pick('drawn');
    console.log(
      `${root}: drawn score median ${median(drawn).toFixed(0)} ms ` +
        `(${Math.min(...drawn).toFixed(0)}–${Math.max(...drawn).toFixed(0)}), ` +
        `LCP ${median(pick('lcp')).toFixed(0)} ms, last file ${median(pick('lastFile')).toFixed(0)} ms, ` +
        `${median(pick('requests'))} requests, ${median(pick('kB')).toFixed(0)} kB transferred, ` +
        `${median(pick('longTasks'))} long tasks (${median(pick('longTaskMs')).toFixed(0)} ms) before the score; ` +
        `${r.length} contexts`,
    );
  });
} finally {
  await browser.close();
  for (const server of servers) await server.stop();
}
