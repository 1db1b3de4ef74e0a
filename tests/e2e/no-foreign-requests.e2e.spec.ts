/**
 * Tensile must work on a school network with no internet: while the app loads, signs in and
 * opens each role's pages (the drill page too, with its music font and audio), the browser may
 * talk to no host but the app's own server.
 */
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { navigationLabels, signOut, expectOnSignInPage } from '../support/app-pages';
import { recordForeignRequests, signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import {
  DEMO_ADMIN,
  DEMO_STUDENTS,
  DEMO_TEACHERS,
  type DemoAccount,
} from '../support/demo-accounts';

/** Lazy chunks, fonts and API calls have all settled once the network stays idle. */
async function settle(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
}

/**
 * Loads that the page's Content-Security-Policy refused: they never reach the network, so the
 * request recorder cannot see them, yet each one is a font, script or call the app expected.
 */
function recordPolicyRefusals(page: Page): string[] {
  const refused: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) refused.push(message.text());
  });
  return refused;
}

/** Visits every page in the role's navigation, so each lazy chunk loads at least once. */
async function visitNavigation(page: Page): Promise<void> {
  const labels = await navigationLabels(page);
  const nav = page.getByRole('navigation', { name: 'Main' });
  for (const label of labels) {
    await nav.getByRole('link', { name: label, exact: true }).click();
    await settle(page);
  }
}

describe('the app talks only to its own server', () => {
  const suite = useServerAndBrowser();

  it('the recorder notices foreign requests and WebSockets but spares data: and blob:', async () => {
    const context = await suite.browser.newContext();
    const page = await context.newPage();
    const foreign = recordForeignRequests(page);
    // Answered locally, so the check needs no network of its own.
    await page.route('https://fonts.example.invalid/**', (route) =>
      route.fulfill({ status: 200, body: 'x' }),
    );
    // A blank page: the app's own Content-Security-Policy would stop these before the network.
    await page.setContent('<!doctype html><title>recorder check</title>');
    await page.evaluate(async () => {
      const attempt = (url: string) => fetch(url, { mode: 'no-cors' }).catch(() => undefined);
      await attempt('https://fonts.example.invalid/roboto.css');
      await attempt('data:text/plain,local');
      await attempt(URL.createObjectURL(new Blob(['local'])));
      const socket = new WebSocket('wss://socket.example.invalid/live');
      socket.onerror = () => socket.close();
    });
    await expect
      .poll(() => [...foreign].sort())
      .toEqual(['https://fonts.example.invalid/roboto.css', 'wss://socket.example.invalid/live']);
    await context.close();
  });

  it("the refusal recorder notices a foreign load blocked by the app's policy", async () => {
    const context = await suite.browser.newContext();
    const page = await context.newPage();
    const refused = recordPolicyRefusals(page);
    await page.goto(`${suite.server.url}/sign-in`);
    await page.evaluate(() => fetch('https://fonts.example.invalid/x').catch(() => undefined));
    await expect.poll(() => refused.length).toBeGreaterThan(0);
    await context.close();
  });

  const accounts: readonly DemoAccount[] = [DEMO_ADMIN, DEMO_TEACHERS[0]!, DEMO_STUDENTS[0]!];

  it.each(accounts.map((account) => [account.role, account]))(
    'loading, signing in and browsing as the %s stays on localhost',
    async (_role, account) => {
      const context = await suite.browser.newContext();
      const page = await context.newPage();
      const foreign = recordForeignRequests(page);
      const refused = recordPolicyRefusals(page);

      await page.goto(suite.server.url);
      await expectOnSignInPage(page);
      await settle(page);
      await signIn(page, suite.server.url, account.email, account.password);
      await settle(page);
      await visitNavigation(page);
      const preset = BUILT_IN_PRESETS[0];
      if (preset) {
        await page.goto(`${suite.server.url}/drills/${preset.id}?seed=lesson-12`);
        await settle(page);
      }
      await signOut(page);
      await expectOnSignInPage(page);
      await settle(page);

      expect(foreign).toEqual([]);
      expect(refused).toEqual([]);
      await context.close();
    },
  );
});
