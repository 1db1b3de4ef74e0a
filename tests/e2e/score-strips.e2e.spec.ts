/**
 * The score's later strips (one a system) show their system through a `<use>` copy only when
 * near the screen, so a new drawing does not rebuild copies nobody sees; a scroll fills a strip
 * before it shows, and every filled strip points at its own system.
 */
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const CARD = 'early-backbeat';
const SEED = 'harbor-spark-21';
const POLL = { timeout: 15_000 };

/** Each later strip's system and where its copy points (null: the strip is empty). */
function strips(page: Page): Promise<{ system: string; href: string | null }[]> {
  return page.locator('tensile-drill-score .band[data-system]').evaluateAll((bands) =>
    bands.map((band) => ({
      system: band.getAttribute('data-system') ?? '',
      href: band.querySelector('.echo use')?.getAttribute('href') ?? null,
    })),
  );
}

describe('the score strips on a short phone screen', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    // Short, so the last lines of a four-bar score (a bar a line) lie more than a screen away.
    context = await suite.browser.newContext({ viewport: { width: 390, height: 300 } });
    page = await context.newPage();
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
  });

  afterAll(async () => {
    await context?.close();
  });

  it('fills a far strip only when it scrolls near, with its own system', async () => {
    await page.goto(`${suite.server.url}/drills/${CARD}?seed=${SEED}`);
    await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
    await page.evaluate(() => window.scrollTo(0, 0));
    const before = await strips(page);
    expect(before.length, 'later strips on a phone').toBeGreaterThanOrEqual(2);
    const last = before.at(-1)!;
    await expect.poll(async () => (await strips(page)).at(-1)?.href, POLL).toBeNull();

    await page
      .locator(`tensile-drill-score .band[data-system="${last.system}"]`)
      .scrollIntoViewIfNeeded();
    await expect
      .poll(async () => (await strips(page)).at(-1)?.href, POLL)
      .toMatch(new RegExp(`-system-${last.system}$`));
    for (const strip of await strips(page)) {
      if (strip.href !== null) expect(strip.href).toMatch(new RegExp(`-system-${strip.system}$`));
    }
  });
});

/** A card of eight bars with a polyrhythm (its brackets span the systems); invented. */
const EIGHT_BARS = {
  meter: { beats: 4, unit: 4 },
  bars: 8,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'tomHigh'],
  ostinato: { voice: 'hihat', slots: [2], dynamic: 'normal' },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'polyrhythm', voices: ['tomHigh'], against: 4, span: 3 },
  ],
};

describe("the editor's preview after a new seed", () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    context = await suite.browser.newContext({ viewport: { width: 1400, height: 1000 } });
    page = await context.newPage();
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
  });

  afterAll(async () => {
    await context?.close();
  });

  it('goes up a few systems at a time and ends as a drawing made at once', async () => {
    const id = await page.evaluate(async (card) => {
      const response = await fetch('/api/rule-cards', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ title: 'Eight bars', card }),
      });
      return ((await response.json()) as { ruleCard: { id: number } }).ruleCard.id;
    }, EIGHT_BARS);
    await page.goto(`${suite.server.url}/rule-cards/${id}`);
    const score = page.locator('tensile-card-preview tensile-drill-score');
    await score.locator('svg .tensile-bar').first().waitFor();
    // The first drill all up and settled before the watch starts.
    await expect.poll(() => drawing(score), POLL).toMatch(/-system-7"/);
    await expect.poll(() => score.getAttribute('aria-busy'), POLL).toBeNull();
    // Counted in the page: changes to the score while it said it was busy. The records are
    // read in order, each with the value it replaced, since a callback may come only after the
    // score is no longer busy.
    await score.evaluate((host) => {
      const seen = { busy: 0, dimmed: 0, settled: false };
      (window as unknown as { seen: typeof seen }).seen = seen;
      let busy = host.getAttribute('aria-busy') === 'true';
      new MutationObserver((records) => {
        records.forEach((record, i) => {
          if (record.target === host && record.attributeName === 'aria-busy') {
            const next = records
              .slice(i + 1)
              .find((r) => r.target === host && r.attributeName === 'aria-busy');
            const now = (next ? next.oldValue : host.getAttribute('aria-busy')) === 'true';
            if (busy && !now) seen.settled = true;
            busy = now;
            return;
          }
          if (!busy) return;
          seen.busy++;
          // Old systems on the page beside new ones are dimmed meanwhile.
          const target = record.target as Element;
          const stale =
            record.attributeName === 'class' &&
            (record.oldValue?.split(' ').includes('stale') || target.classList.contains('stale'));
          if (stale || host.querySelector('.band.stale')) seen.dimmed++;
        });
      }).observe(host, {
        subtree: true,
        childList: true,
        attributes: true,
        attributeOldValue: true,
      });
    });
    const seed = await page.getByTestId('preview-seed').textContent();
    await page.getByRole('button', { name: 'New seed' }).click();
    await expect.poll(() => page.getByTestId('preview-seed').textContent(), POLL).not.toBe(seed);
    // Busy, then settled again: the new drill is all up.
    await expect
      .poll(
        () =>
          page.evaluate(() => (window as unknown as { seen: { settled: boolean } }).seen.settled),
        POLL,
      )
      .toBe(true);
    expect(await score.getAttribute('aria-busy')).toBeNull();
    const seen = await page.evaluate(
      () => (window as unknown as { seen: { busy: number; dimmed: number } }).seen,
    );
    expect(seen.busy, 'changes while the later systems went up').toBeGreaterThan(0);
    expect(seen.dimmed, 'changes while old systems showed dimmed').toBeGreaterThan(0);
    expect(await score.locator('.band.stale').count()).toBe(0);
    const updated = await drawing(score);
    expect(updated).toMatch(/-system-7"/);
    // Another width and back: this width's drawing is then put up whole, not updated in place.
    await page.setViewportSize({ width: 1100, height: 1000 });
    await expect.poll(() => drawing(score), POLL).not.toBe(updated);
    await page.setViewportSize({ width: 1400, height: 1000 });
    await expect.poll(() => drawing(score), POLL).toBe(updated);
  });
});

/**
 * The score's drawing as text, without VexFlow's running element numbers and the page's own
 * number for its score (both count every drawing).
 */
function drawing(score: Locator): Promise<string> {
  return score
    .locator('.canvas svg')
    .evaluate((svg) =>
      svg.outerHTML.replace(/ id="vf-[^"]*"/g, '').replace(/tensile-score-\d+/g, 'score'),
    );
}
