/**
 * Keyboard only: a teacher signs in, opens a new rule card, names it, changes its tempo and saves
 * it without touching the mouse.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

/**
 * What the focused element is, as a person hears it: its label, field label or text. Nothing is
 * focused when the document itself holds focus: the page's whole text (every label on it) must
 * not pass for the name of a control, or keys typed "into" it would go nowhere.
 */
function focusedName(page: Page): Promise<string> {
  return page.evaluate(() => {
    const active = document.activeElement as HTMLElement | null;
    if (!active || active === document.body || active === document.documentElement) return '';
    const field = active.closest('mat-form-field')?.querySelector('mat-label')?.textContent;
    return (active.getAttribute('aria-label') ?? field ?? active.textContent ?? '')
      .replace(/\s+/g, ' ')
      .trim();
  });
}

/** Presses Tab until the focused element's name matches (at most `limit` presses). */
async function tabTo(page: Page, name: RegExp, limit = 80): Promise<void> {
  for (let i = 0; i < limit; i++) {
    await page.keyboard.press('Tab');
    if (name.test(await focusedName(page))) return;
  }
  throw new Error(`Tab never reached ${name}; last focus: ${await focusedName(page)}`);
}

describe('authoring journey: keyboard only', () => {
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

  it('creates and saves a rule card without the mouse', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await page.goto(`${suite.server.url}/sign-in`);
    // The route is lazy and guarded: the form appears after the session check, not at "load".
    const email = page.getByLabel(/e-?mail/i);
    const password = page.getByLabel(/password/i);
    await email.waitFor();
    await tabTo(page, /e-?mail/i);
    await page.keyboard.type(teacher.email);
    await tabTo(page, /password/i);
    await page.keyboard.type(teacher.password);
    // What the keys typed landed where they should before the form is sent.
    expect(await email.inputValue()).toBe(teacher.email);
    expect(await password.inputValue()).toBe(teacher.password);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/rule-cards');

    await page.getByRole('link', { name: /New rule card/ }).waitFor();
    await tabTo(page, /New rule card/);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/rule-cards/new');
    await page.getByLabel(/^Card title$/).waitFor();

    await tabTo(page, /^Card title$/);
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('Keyboard groove');
    await tabTo(page, /^Tempo \(BPM\)$/);
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('104');
    await page
      .locator('tensile-card-preview svg .tensile-note')
      .first()
      .waitFor({ state: 'visible', timeout: 20_000 });

    // Back to the toolbar: Shift+Tab until the save button.
    for (let i = 0; i < 80 && !/Save card/.test(await focusedName(page)); i++) {
      await page.keyboard.press('Shift+Tab');
    }
    expect(await focusedName(page)).toMatch(/Save card/);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => /^\/rule-cards\/\d+$/.test(url.pathname));

    // The saved card is in the table with its title and tempo.
    await page.goto(`${suite.server.url}/rule-cards`);
    const row = page.getByRole('row', { name: /Keyboard groove/ });
    await row.waitFor();
    expect(await row.innerText()).toContain('104');
  }, 120_000);
});
