/**
 * Each role's first minute in the app, in a real browser against the real server: sign in
 * through the form, land on the role's home with the role's navigation, sign out again; plus the
 * ways in that must fail (a wrong password, a student opening a teacher's page).
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { signIn, fillSignInForm } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import {
  DEMO_ADMIN,
  DEMO_STUDENTS,
  DEMO_TEACHERS,
  type DemoAccount,
} from '../support/demo-accounts';
import { expectOnSignInPage, navigationLabels, signOut } from '../support/app-pages';

interface RoleHome {
  readonly account: DemoAccount;
  readonly path: string;
  readonly heading: RegExp;
  /** The role's own navigation entries, in order. */
  readonly navigation: readonly string[];
}

const HOMES: readonly RoleHome[] = [
  {
    account: DEMO_ADMIN,
    path: '/presets',
    heading: /presets/i,
    navigation: ['Presets', 'Users'],
  },
  {
    account: DEMO_TEACHERS[0]!,
    path: '/rule-cards',
    heading: /rule cards/i,
    navigation: [
      'Rule cards',
      'Gallery',
      'Drills',
      'Worksheets',
      'Import groove',
      'Studio',
      'Print settings',
    ],
  },
  {
    account: DEMO_STUDENTS[0]!,
    path: '/assignments',
    heading: /assignments/i,
    navigation: ['Assignments', 'Practice', 'Gallery'],
  },
];

describe('role journeys in the browser', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;

  beforeEach(async () => {
    context = await suite.browser.newContext();
    page = await context.newPage();
  });

  afterEach(async () => {
    await context?.close();
  });

  it.each(HOMES.map((home) => [home.account.role, home]))(
    'the demo %s signs in, lands on their home and signs out',
    async (_role, home) => {
      await signIn(page, suite.server.url, home.account.email, home.account.password);
      await page.waitForURL((url) => url.pathname === home.path);
      await expect
        .poll(() => page.getByRole('heading', { level: 1 }).first().innerText())
        .toMatch(home.heading);
      expect(await navigationLabels(page)).toEqual(home.navigation);

      await signOut(page);
      await expectOnSignInPage(page);
      // The session is gone, not just the page: the home now sends the visitor to sign-in.
      await page.goto(`${suite.server.url}${home.path}`);
      await expectOnSignInPage(page);
    },
  );

  it("the teacher's home lists every built-in rule card", async () => {
    const teacher = DEMO_TEACHERS[1]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await page.waitForURL((url) => url.pathname === '/rule-cards');
    expect(BUILT_IN_PRESETS.length).toBeGreaterThan(0);
    for (const preset of BUILT_IN_PRESETS) {
      const card = page.getByRole('heading', { name: preset.title, exact: true });
      await card.first().waitFor({ state: 'visible' });
    }
  });

  it('a wrong password keeps the visitor on sign-in with a readable error', async () => {
    await page.goto(`${suite.server.url}/sign-in`);
    await fillSignInForm(page, DEMO_TEACHERS[0]!.email, 'not-the-password');
    const alert = page.getByRole('alert').filter({ hasText: /password|e-?mail|sign/i });
    await alert.first().waitFor({ state: 'visible' });
    expect(await alert.first().innerText()).toMatch(
      /not correct|wrong|incorrect|invalid|did ?n.t match/i,
    );
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });

  it("a student who types a teacher's address is sent to their own home", async () => {
    const student = DEMO_STUDENTS[1]!;
    await signIn(page, suite.server.url, student.email, student.password);
    await page.goto(`${suite.server.url}/rule-cards`);
    await page.waitForURL((url) => url.pathname === '/assignments');
    await page.getByText('That page is for teachers.').waitFor({ state: 'visible' });
    expect(await navigationLabels(page)).toEqual(['Assignments', 'Practice', 'Gallery']);
  });

  it('a signed-out visitor opening a private page goes to sign-in and then back there', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await page.goto(`${suite.server.url}/studio`);
    await expectOnSignInPage(page);
    expect(new URL(page.url()).searchParams.get('returnUrl')).toBe('/studio');
    await fillSignInForm(page, teacher.email, teacher.password);
    await page.waitForURL((url) => url.pathname === '/studio');
  });
});
