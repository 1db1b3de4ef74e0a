/**
 * Prints how long the rule-card editor takes from a field change (the tempo typed in) to the
 * redrawn preview, for a 16-bar, 4-voice card with every rule kind, in headless Chromium against
 * the real server, and the longest gap between animation frames while it works (how long typing
 * is blocked). The preview waits PREVIEW_DEBOUNCE_MS after the last keystroke by design; the
 * figures are printed with and without that wait.
 * Run: npm run bench:editor (builds the app first)
 */
import { PREVIEW_DEBOUNCE_MS } from '../src/app/rule-card-editor/preview-timing';
import { launchChromium, signIn, startServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';
import { EDITOR_BENCH_CARD } from './editor-card';

const WARM_UP = 3;
const RUNS = 20;

function quantile(sorted: readonly number[], q: number): number {
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[index] ?? NaN;
}

const server = await startServer();
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

  // One change: type a tempo, then time until the preview's score is replaced, and the longest
  // gap between animation frames from the keystroke to then.
  const change = (tempo: number) =>
    page.evaluate(
      (value) =>
        new Promise<{ latency: number; longestFrame: number }>((resolve, reject) => {
          const canvas = document.querySelector('tensile-card-preview .canvas');
          const input = [...document.querySelectorAll('tensile-card-basics input')].find(
            (el) =>
              el.closest('mat-form-field')?.querySelector('mat-label')?.textContent?.trim() ===
              'Tempo (BPM)',
          ) as HTMLInputElement | undefined;
          if (!canvas || !input) return reject(new Error('the editor is not on the page'));
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
          const observer = new MutationObserver(() => {
            const latency = performance.now() - start;
            observer.disconnect();
            // One more frame, so a block at the very end of the work is counted too.
            requestAnimationFrame((now) => {
              longest = Math.max(longest, now - last);
              watching = false;
              resolve({ latency, longestFrame: longest });
            });
          });
          observer.observe(canvas, { childList: true, subtree: true });
          input.value = String(value);
          input.dispatchEvent(new Event('input', { bubbles: true }));
          setTimeout(() => reject(new Error('the preview did not update in 30 s')), 30_000);
        }),
      tempo,
    );

  for (let i = 0; i < WARM_UP; i++) await change(90 - i);
  const results = [];
  for (let i = 0; i < RUNS; i++) results.push(await change(80 - i));
  const latencies = results.map((r) => r.latency).sort((a, b) => a - b);
  const frames = results.map((r) => r.longestFrame).sort((a, b) => a - b);
  const median = quantile(latencies, 0.5);
  console.log(
    `Editor: field change to redrawn preview, 16 bars, 4 voices, every rule kind: median ` +
      `${median.toFixed(0)} ms (p90 ${quantile(latencies, 0.9).toFixed(0)} ms), of which ` +
      `${PREVIEW_DEBOUNCE_MS} ms is the typing pause; after the pause median ` +
      `${(median - PREVIEW_DEBOUNCE_MS).toFixed(0)} ms. Longest frame while working: median ` +
      `${quantile(frames, 0.5).toFixed(0)} ms, worst ${frames.at(-1)!.toFixed(0)} ms ` +
      `(${RUNS} runs, headless Chromium, goal: median ≤ 50 ms, no frame over 17 ms).`,
  );
} finally {
  await browser.close();
  await server.stop();
}
