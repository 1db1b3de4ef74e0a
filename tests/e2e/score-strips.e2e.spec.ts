/**
 * The score's later strips (one a system) show their system through a `<use>` copy only when
 * near the screen, so a new drawing does not rebuild copies nobody sees; a scroll fills a strip
 * before it shows, and every filled strip points at its own system.
 */
import type { BrowserContext, Page } from 'playwright-core';
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
