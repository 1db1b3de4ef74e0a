/**
 * Curated presets in a real browser against the real server: the admin renames, tags and
 * publishes a preset; a teacher finds it in the gallery by that tag, starts a card from it and
 * gets a drill from the copy in the editor. The admin also promotes a teacher's card found in the
 * list of teachers' cards, without knowing its number.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_ADMIN, DEMO_TEACHERS } from '../support/demo-accounts';

/** The first engraving of a thumbnail may take seconds on a busy machine. */
const POLL = { timeout: 30_000 };

const NEW_TITLE = 'Larkspur groove primer';

describe('authoring journey: curated presets', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    context = await suite.browser.newContext({ viewport: { width: 1400, height: 1000 } });
    page = await context.newPage();
  });

  afterAll(async () => {
    await context?.close();
  });

  it('the admin edits and publishes a preset; a teacher filters, starts from it, drills', async () => {
    const preset = BUILT_IN_PRESETS[0]!;
    await signIn(page, suite.server.url, DEMO_ADMIN.email, DEMO_ADMIN.password);
    await page.goto(`${suite.server.url}/presets`);
    await page.getByRole('button', { name: `Edit ${preset.title}` }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Title').fill(NEW_TITLE);
    await dialog.getByLabel('Tags (comma-separated)').fill('primer, backbeat');
    await dialog.getByLabel('Published in the gallery').uncheck();
    await dialog.getByRole('button', { name: 'Save preset' }).click();
    const toggle = page.getByRole('switch', { name: `Publish ${NEW_TITLE}` });
    await expect.poll(() => toggle.getAttribute('aria-checked'), POLL).toBe('false');
    await toggle.click();
    await expect.poll(() => toggle.getAttribute('aria-checked'), POLL).toBe('true');

    await context.clearCookies();
    const teacher = DEMO_TEACHERS[1]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await page.goto(`${suite.server.url}/gallery`);
    await page.getByRole('list', { name: 'Presets' }).getByRole('listitem').first().waitFor();
    await page.getByLabel('Tag', { exact: true }).fill('primer');
    const cards = page.getByRole('list', { name: 'Presets' }).getByRole('listitem');
    await expect.poll(() => cards.count(), POLL).toBe(1);
    expect(await cards.first().getByRole('heading').innerText()).toBe(NEW_TITLE);
    const thumbnail = cards.first().locator('img.thumbnail');
    await expect
      .poll(
        () => thumbnail.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth),
        POLL,
      )
      .toBeGreaterThan(0);

    await cards
      .first()
      .getByRole('button', { name: `Start from ${NEW_TITLE}` })
      .click();
    await page.waitForURL((url) => /^\/rule-cards\/\d+$/.test(url.pathname));
    await page
      .locator('tensile-card-preview svg .tensile-note')
      .first()
      .waitFor({ state: 'visible', timeout: 20_000 });
    expect(await page.locator('tensile-card-preview .problem').count()).toBe(0);
  }, 120_000);

  it('the admin finds a teacher’s card in the list and promotes it to a credited preset', async () => {
    // A context of its own: the gallery's thumbnails may still hold the other one's connections.
    const own = await suite.browser.newContext({ viewport: { width: 1400, height: 1000 } });
    const page = await own.newPage();
    const context = own;
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    const title = 'Wombat shuffle study';
    // The teacher's card is made over the API with the teacher's session: this journey is the
    // admin's (writing a card in the editor is the other journeys' part).
    const made = await page.request.post(`${suite.server.url}/api/rule-cards`, {
      data: { title, card: BUILT_IN_PRESETS[1]!.card, level: 'intermediate' },
    });
    expect(made.status()).toBe(201);

    await context.clearCookies();
    await signIn(page, suite.server.url, DEMO_ADMIN.email, DEMO_ADMIN.password);
    await page.goto(`${suite.server.url}/presets`);
    const candidates = page.getByRole('table', { name: "Teachers' rule cards" });
    await candidates.getByRole('row').nth(1).waitFor();
    await page.getByLabel('Search title or teacher').fill('wombat');
    await expect.poll(() => candidates.getByRole('row').count(), POLL).toBe(2);
    const row = candidates.getByRole('row', { name: new RegExp(title) });
    expect(await row.innerText()).toContain('Tomasz Reyes');
    await row.getByRole('button', { name: `Promote ${title} by Tomasz Reyes to a preset` }).click();
    await page.getByText(`"${title}" by Tomasz Reyes is a new preset`).waitFor(POLL);

    // In the presets table: credited, and withdrawn until the admin publishes it.
    const presets = page.getByRole('table', { name: 'All presets' });
    const promoted = presets.getByRole('row', { name: new RegExp(title) });
    await promoted.waitFor(POLL);
    expect(await promoted.innerText()).toContain('Tomasz Reyes');
    const toggle = page.getByRole('switch', { name: `Publish ${title}` });
    expect(await toggle.getAttribute('aria-checked')).toBe('false');
    await own.close();
  }, 120_000);
});
