/**
 * A drill page opened cold names its code, its score fonts and its first API requests in its
 * HTML, so the browser fetches them at once instead of in waves. These checks hold the server's
 * list to what the page really loads: every script the score needs was named up front, and every
 * preloaded request was taken by the page's own `fetch` (no second request, no "preloaded but
 * not used" warning).
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readMetafile } from '../../server/web/route-preloads';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const DRILL = '/drills/early-backbeat?seed=harbor-spark-21';
const SCORE = 'tensile-drill-score svg .tensile-bar';
/**
 * The `@defer (on idle)` blocks of the drill page (export menu, save button, playback panel, seed
 * form) and of the shell (its toolbar's theme tooltip and account menu). They are
 * not on the score's path, but the browser may fall idle while the score's requests are out, so
 * on a busy machine they can start before the score is drawn.
 */
const DEFERRED_ENTRIES = [
  'src/app/exports/export-menu.ts',
  'src/app/saved-drills/save-drill-button.ts',
  'src/app/drills/playback/playback-panel.ts',
  'src/app/drills/seed-form.ts',
  'src/app/shell/toolbar-actions.ts',
  // The notation toggles.
  'node_modules/@angular/material/fesm2022/slide-toggle.mjs',
];

/**
 * What the deferred blocks import: a block's loader fetches a small chunk of no source of its
 * own that re-exports these, and may run before the score is drawn on a busy machine.
 */
const DEFERRED_EXPORTS = new Set([
  'ExportMenu',
  'SaveDrillButton',
  'PlaybackPanel',
  'SeedForm',
  'ToolbarActions',
  'MatSlideToggle',
]);

/** The served paths of the deferred blocks' chunks, from the build's metafile. */
function deferredChunks(): string[] {
  const stats = fileURLToPath(new URL('../../dist/tensile/stats.json', import.meta.url));
  const metafile = readMetafile(stats);
  expect(metafile, 'the build writes stats.json').not.toBeNull();
  const outputs = metafile!.outputs;
  // A build with merged chunks names no lazy entry points: the chunk holding the source stands in.
  const holds = (file: string, entry: string): boolean =>
    outputs[file]!.entryPoint === entry ||
    (outputs[file]!.entryPoint === undefined && entry in (outputs[file]!.inputs ?? {}));
  for (const entry of DEFERRED_ENTRIES) {
    expect(
      Object.keys(outputs).some((file) => holds(file, entry)),
      entry,
    ).toBe(true);
  }
  const loader = (file: string): boolean => {
    const output = outputs[file]!;
    const exports = output.exports ?? [];
    return (
      Object.keys(output.inputs ?? {}).length === 0 &&
      exports.length > 0 &&
      exports.every((name) => DEFERRED_EXPORTS.has(name))
    );
  };
  const queue = Object.keys(outputs).filter(
    (file) => DEFERRED_ENTRIES.some((entry) => holds(file, entry)) || loader(file),
  );
  // With what they import: a chunk the score also needs is named by the HTML anyway.
  const files = new Set<string>();
  for (let file = queue.shift(); file !== undefined; file = queue.shift()) {
    if (files.has(file)) continue;
    files.add(file);
    for (const imported of outputs[file]?.imports ?? [])
      if (imported.kind === 'import-statement' && imported.path.endsWith('.js'))
        queue.push(imported.path);
  }
  return [...files].map((file) => `/${file.split('/').pop()}`);
}

/** Chromium warns of an unused preload a few seconds after the load event. */
const UNUSED_PRELOAD_WARNING_MS = 4_000;

describe('drill page preloads', () => {
  const suite = useServerAndBrowser();

  it('fetches the score path in one wave and uses every preload', async () => {
    const login = await suite.browser.newContext();
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(await login.newPage(), suite.server.url, teacher.email, teacher.password);
    const storageState = await login.storageState();
    await login.close();

    const context = await suite.browser.newContext({ storageState });
    try {
      const page = await context.newPage();
      const warnings: string[] = [];
      page.on('console', (message) => {
        if (/preload/i.test(message.text())) warnings.push(message.text());
      });
      await page.addInitScript((selector: string) => {
        const observer = new MutationObserver(() => {
          if (!document.querySelector(selector)) return;
          (window as { __drawnAt?: number }).__drawnAt = performance.now();
          observer.disconnect();
        });
        document.addEventListener('DOMContentLoaded', () =>
          observer.observe(document.body, { childList: true, subtree: true }),
        );
      }, SCORE);
      await page.goto(`${suite.server.url}${DRILL}`);
      await page.locator(SCORE).first().waitFor();
      await page.waitForTimeout(UNUSED_PRELOAD_WARNING_MS);

      const seen = await page.evaluate((selector) => {
        const named = [...document.querySelectorAll<HTMLLinkElement>('link[rel$="preload"]')].map(
          (link) => ({
            rel: link.rel,
            as: link.as,
            path: new URL(link.href).pathname + new URL(link.href).search,
          }),
        );
        const drawnAt = (window as { __drawnAt?: number }).__drawnAt ?? Infinity;
        const loaded = performance
          .getEntriesByType('resource')
          .map((entry) => entry as PerformanceResourceTiming)
          .filter((entry) => entry.startTime < drawnAt)
          .map((entry) => ({
            path: new URL(entry.name).pathname + new URL(entry.name).search,
            initiator: entry.initiatorType,
          }));
        return {
          named,
          loaded,
          drawn: drawnAt < Infinity && document.querySelector(selector) !== null,
        };
      }, SCORE);

      expect(seen.drawn).toBe(true);
      const fetches = seen.named.filter((link) => link.as === 'fetch').map((link) => link.path);
      expect(fetches).toEqual([
        '/api/auth/me',
        '/api/presets/early-backbeat/drill?seed=harbor-spark-21',
        '/api/presets/early-backbeat',
      ]);
      // One request each, made by the link: the page's fetch took the preloaded answer.
      for (const url of fetches) {
        expect(seen.loaded.filter((entry) => entry.path === url)).toEqual([
          { path: url, initiator: 'link' },
        ]);
      }
      const fonts = seen.named.filter((link) => link.as === 'font').map((link) => link.path);
      expect(fonts.some((font) => /\/media\/tensile-music-[A-Z0-9]+\.woff2$/.test(font))).toBe(
        true,
      );
      // No script the score waited for was found only by importing: the HTML named them all.
      const scripts = seen.named.filter((link) => link.rel === 'modulepreload').map((l) => l.path);
      const imported = seen.loaded.filter(
        (entry) => entry.path.endsWith('.js') && entry.initiator === 'script',
      );
      expect(scripts.length).toBeGreaterThan(10);
      const deferred = deferredChunks();
      expect(
        imported.filter(
          (entry) => !entry.path.startsWith('/main-') && !deferred.includes(entry.path),
        ),
      ).toEqual([]);
      expect(warnings).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
