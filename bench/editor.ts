/**
 * Prints how long the rule-card editor takes from a change to the preview showing the new drill,
 * for a 16-bar, 4-voice card with every rule kind: a field change (the tempo typed in, which
 * leaves the bars as they were) and a new seed (every bar new), interleaved; in headless
 * Chromium against the real server; and how long the page's main thread was blocked meanwhile
 * (typing waits for it): the longest main-thread task from a Chromium performance trace, and the
 * longest gap between animation frames.
 * Run: npm run bench:editor (builds the app first); EDITOR_ROOT=<another checkout, built> npx tsx
 * bench/editor.ts runs the same script against that checkout's server and build.
 */
import { writeFile } from 'node:fs/promises';
import { cpus, loadavg } from 'node:os';
import { longestTasks } from './trace-tasks';
import { launchChromium, signIn, startServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';
import { EDITOR_BENCH_CARD } from './editor-card';

const WARM_UP = 3;
/** Chromium's top-level task events ("RunTask") and the page's performance marks. */
const TRACE_CATEGORIES = ['disabled-by-default-devtools.timeline', 'blink.user_timing'];
const RUNS = 20;

function quantile(sorted: readonly number[], q: number): number {
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[index] ?? NaN;
}

// EDITOR_ROOT=<checkout>: that checkout's server and build (each built), for A/B runs alternated
// with this one's in the same minutes.
const root = process.env['EDITOR_ROOT'];
const server = await startServer(root ? { root } : {});
const browser = await launchChromium();
try {
  const page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
  // tsx keeps function names with a helper the page does not have; give the page a no-op one.
  await page.addInitScript('window.__name = (f) => f;');
  const teacher = DEMO_TEACHERS[0]!;
  await signIn(page, server.url, teacher.email, teacher.password);
  const id = await page.evaluate(async (card) => {
    const response = await fetch('/api/rule-cards', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ title: 'Editor bench card', card }),
    });
    if (!response.ok) throw new Error(`creating the card answered ${response.status}`);
    return ((await response.json()) as { ruleCard: { id: number } }).ruleCard.id;
  }, EDITOR_BENCH_CARD);
  await page.goto(`${server.url}/rule-cards/${id}`);
  await page.locator('tensile-card-preview .canvas svg').waitFor({ timeout: 60_000 });

  // One change, then the time until the preview's score is replaced, and the longest gap between
  // animation frames from the change to then. A tempo typed in (the drill's bars stay as they
  // were: only the mark above the score changes), or a new seed (every bar changes).
  const change = (what: { tempo: number } | 'seed', mark: string) =>
    page.evaluate(
      ({ what, mark }) =>
        new Promise<{ latency: number; whole: number; longestFrame: number }>((resolve, reject) => {
          const canvas = document.querySelector('tensile-card-preview .canvas');
          const input = [...document.querySelectorAll('tensile-card-basics input')].find(
            (el) =>
              el.closest('mat-form-field')?.querySelector('mat-label')?.textContent?.trim() ===
              'Tempo (BPM)',
          ) as HTMLInputElement | undefined;
          const reseed = [...document.querySelectorAll('tensile-card-preview button')].find((el) =>
            el.textContent?.includes('New seed'),
          ) as HTMLButtonElement | undefined;
          if (!canvas || !input || !reseed)
            return reject(new Error('the editor is not on the page'));
          performance.mark(`${mark}-start`);
          let last = performance.now();
          let longest = 0;
          let watching = true;
          const frame = (now: number) => {
            longest = Math.max(longest, now - last);
            last = now;
            if (watching) requestAnimationFrame(frame);
          };
          requestAnimationFrame(frame);
          const start = performance.now();
          const score = canvas.closest('tensile-drill-score')!;
          let latency = 0;
          // Whole once the score's last systems are up too (it is busy until then); the trace's
          // span (longest task) and the frame gaps run till then.
          const whole = () => {
            if (score.getAttribute('aria-busy') === 'true') {
              requestAnimationFrame(() => setTimeout(whole));
              return;
            }
            watching = false;
            performance.mark(`${mark}-end`);
            resolve({ latency, whole: performance.now() - start, longestFrame: longest });
          };
          const observer = new MutationObserver(() => {
            observer.disconnect();
            // Shown once the frame that paints the new score is done: its animation frame, then
            // a message, which runs after that frame's style, layout and paint.
            requestAnimationFrame((now) => {
              longest = Math.max(longest, now - last);
              last = now;
              const channel = new MessageChannel();
              channel.port1.onmessage = () => {
                latency = performance.now() - start;
                performance.mark(`${mark}-shown`);
                whole();
              };
              channel.port2.postMessage(null);
            });
          });
          observer.observe(canvas, { childList: true, subtree: true });
          if (what === 'seed') {
            reseed.click();
          } else {
            input.value = String(what.tempo);
            input.dispatchEvent(new Event('input', { bubbles: true }));
          }
          setTimeout(() => reject(new Error('the preview did not update in 30 s')), 30_000);
        }),
      { what, mark },
    );

  for (let i = 0; i < WARM_UP; i++) await change({ tempo: 90 - i }, `edit-${-1 - i}`);
  const tempo = [];
  const seed = [];
  // EDITOR_TRACE_DETAIL=1: the trace also holds what each task did (script, style, layout).
  const detail = process.env['EDITOR_TRACE_DETAIL'] ? ['devtools.timeline', 'v8.execute'] : [];
  await browser.startTracing(page, { categories: [...TRACE_CATEGORIES, ...detail] });
  // Interleaved, so both series see the same load.
  for (let i = 0; i < RUNS; i++) {
    tempo.push(await change({ tempo: 80 - i }, `edit-${i}`));
    seed.push(await change('seed', `seed-${i}`));
  }
  const raw = await browser.stopTracing();
  // EDITOR_TRACE=<file> keeps the trace for a closer look (chrome://tracing, Perfetto).
  if (process.env['EDITOR_TRACE']) await writeFile(process.env['EDITOR_TRACE'], raw);
  const trace = JSON.parse(raw.toString('utf8'));
  const report = (
    results: readonly { latency: number; whole: number; longestFrame: number }[],
    prefix: string,
    what: string,
  ) => {
    const tasks = longestTasks(trace, prefix);
    const engine = [...longestTasks(trace, prefix, 'DedicatedWorker thread').values()].sort(
      (a, b) => a - b,
    );
    const latencies = results.map((r) => r.latency).sort((a, b) => a - b);
    const frames = results.map((r) => r.longestFrame).sort((a, b) => a - b);
    const wholes = results.map((r) => r.whole).sort((a, b) => a - b);
    const longest = [...tasks.values()].sort((a, b) => a - b);
    console.log(
      `Editor: ${what} to the new drill shown, 16 bars, 4 voices, every rule kind: median ` +
        `${quantile(latencies, 0.5).toFixed(0)} ms (p90 ${quantile(latencies, 0.9).toFixed(0)} ms). ` +
        `Every system up: median ${quantile(wholes, 0.5).toFixed(0)} ms. ` +
        `Longest main-thread task per change: median ${quantile(longest, 0.5).toFixed(0)} ms, ` +
        `worst ${longest.at(-1)!.toFixed(0)} ms (${longest.length} changes traced). The engine's ` +
        `run in the worker (its longest task): median ${quantile(engine, 0.5).toFixed(0)} ms. ` +
        `Longest gap ` +
        `between frames: median ${quantile(frames, 0.5).toFixed(0)} ms, worst ` +
        `${frames.at(-1)!.toFixed(0)} ms (${RUNS} runs, headless Chromium; goal: median ≤ 50 ms, ` +
        `nothing blocking over one 60 Hz frame, 17 ms).`,
    );
  };
  report(tempo, 'edit-', 'a tempo typed in (the bars unchanged)');
  report(seed, 'seed-', 'a new seed (every bar new)');
  console.log(`Load average at the end: ${loadavg()[0]!.toFixed(1)} on ${cpus().length} cores.`);
} finally {
  await browser.close();
  await server.stop();
}
