/**
 * The studio from a fresh database, in a real browser: a teacher invites a student; the student
 * follows the e-mailed link (read from the admin's outbox), chooses a password, finds the
 * assignment, drills it with playback and logs practice twice; the teacher sees both logs and the
 * chart; the teacher also assigns a worksheet, the student logs practice on one of its drills
 * from that drill's page, and the teacher sees it; an address of someone else's account is
 * refused in words under the e-mail field; the admin has a teacher's password reset by e-mail and
 * the teacher signs in with it.
 */
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_ADMIN, DEMO_TEACHERS } from '../support/demo-accounts';

const STUDENT = {
  name: 'Pim Osei',
  email: 'pim.osei@larkspur.test',
  password: 'pim-plays-paradiddles',
};
const TEACHER = DEMO_TEACHERS[0]!;
const OTHER_TEACHER = DEMO_TEACHERS[1]!;
const NEW_TEACHER_PASSWORD = 'hana-chose-a-new-one';
/** How long a page may take to show what a step waits for. */
const POLL = { timeout: 60_000 };
/** Each step signs in or hashes a password (scrypt) on a shared machine: give it room. */
const STEP_TIMEOUT_MS = 240_000;

describe('the studio journey', () => {
  const suite = useServerAndBrowser();
  const contexts: BrowserContext[] = [];
  afterAll(async () => {
    for (const context of contexts) await context.close();
  });

  async function newPage(browser: Browser): Promise<Page> {
    const context = await browser.newContext();
    contexts.push(context);
    return context.newPage();
  }

  /** Signs the admin in (once) and reads the link of the newest message with this subject. */
  let adminPage: Page | undefined;
  async function linkFromOutbox(subject: RegExp, path: string): Promise<string> {
    if (!adminPage) {
      adminPage = await newPage(suite.browser);
      await signIn(adminPage, suite.server.url, DEMO_ADMIN.email, DEMO_ADMIN.password);
    }
    await adminPage.goto(`${suite.server.url}/admin/outbox`);
    await adminPage.getByRole('button', { name: subject }).first().click();
    const text = await adminPage.locator('pre.text').innerText();
    const match = new RegExp(`https?://[^\\s]+/${path}/[A-Za-z0-9_-]+`).exec(text);
    if (!match) throw new Error(`No /${path}/ link in the message: ${text}`);
    return match[0];
  }

  async function pick(page: Page, select: Locator, option: RegExp): Promise<void> {
    await select.click();
    await page.getByRole('option', { name: option }).first().click();
    await page.keyboard.press('Escape');
  }

  let teacherPage: Page;
  let studentPage: Page;

  it(
    'a teacher invites a student from the studio',
    async () => {
      teacherPage = await newPage(suite.browser);
      await signIn(teacherPage, suite.server.url, TEACHER.email, TEACHER.password);
      await teacherPage.goto(`${suite.server.url}/studio`);
      const invite = teacherPage.locator('form.invite');
      await invite.getByLabel('Name').fill(STUDENT.name);
      await invite.getByLabel('E-mail').fill(STUDENT.email);
      await invite.getByRole('button', { name: 'Send invitation' }).click();
      await teacherPage
        .getByRole('status')
        .filter({ hasText: 'Invitation sent to Pim Osei' })
        .waitFor();
      const row = teacherPage.getByRole('row').filter({ hasText: STUDENT.name });
      await expect.poll(() => row.innerText(), POLL).toMatch(/Invited/);
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the student follows the e-mailed link, chooses a password and is signed in',
    async () => {
      const link = await linkFromOutbox(/Tomasz Reyes invited you/, 'invitations');
      studentPage = await newPage(suite.browser);
      await studentPage.goto(link);
      await studentPage.getByText(`a password for ${STUDENT.email}`).waitFor();
      await studentPage.getByLabel('New password').fill(STUDENT.password);
      await studentPage.getByLabel('Repeat the password').fill(STUDENT.password);
      await studentPage.getByRole('button', { name: 'Save password' }).click();
      await studentPage.waitForURL((url) => url.pathname === '/assignments');
      // The link works once.
      const again = await newPage(suite.browser);
      await again.goto(link);
      await again.getByRole('alert').filter({ hasText: 'already been used' }).waitFor();
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the teacher assigns a saved drill to the new student',
    async () => {
      await teacherPage.goto(`${suite.server.url}/studio`);
      const form = teacherPage.locator('tensile-assign-form form');
      await pick(teacherPage, form.getByRole('combobox', { name: 'Drill' }), /./);
      await pick(teacherPage, form.getByRole('combobox', { name: 'Students' }), /^Pim Osei$/);
      await form.getByLabel('Start tempo (BPM)').fill('60');
      await form.getByLabel('Target tempo (BPM)').fill('90');
      await form.getByLabel('Note for the students').fill('Count out loud.');
      await form.getByRole('button', { name: 'Assign' }).click();
      await form.getByRole('status').filter({ hasText: 'to 1 student' }).waitFor();
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the student finds the assignment, drills it with playback and logs practice twice',
    async () => {
      await studentPage.goto(`${suite.server.url}/assignments`);
      const row = studentPage.getByRole('row').filter({ hasText: '90 BPM' });
      await expect.poll(() => row.innerText(), POLL).toMatch(/Not started/);
      await row.getByRole('link').click();
      await studentPage.waitForURL((url) => /^\/assignments\/\d+$/.test(url.pathname));
      await studentPage.locator('tensile-drill-score svg').first().waitFor();

      const panel = studentPage.getByRole('region', { name: 'Playback' });
      const play = panel.getByRole('button', { name: /^(Play|Stop|Loading…)$/ });
      await play.click();
      // Headless Chromium may refuse audio; then the panel says so. Either way playback was tried.
      await expect
        .poll(
          async () =>
            (await play.getAttribute('aria-pressed')) === 'true' ||
            (await panel
              .getByRole('alert')
              .filter({ hasText: /blocked audio/i })
              .count()) > 0,
          POLL,
        )
        .toBe(true);
      if ((await play.getAttribute('aria-pressed')) === 'true') await play.click();

      const log = studentPage.locator('tensile-log-practice');
      await log.getByText('protect your hearing').waitFor();
      for (const [minutes, tempo] of [
        ['15', '70'],
        ['25', '82'],
      ] as const) {
        await log.getByLabel('Minutes').fill(minutes);
        await log.getByLabel('Highest clean tempo (BPM)').fill(tempo);
        // A single-choice toggle group: its toggles are radios to assistive technology.
        await log
          .getByRole('radio', { name: '4', exact: true })
          .or(log.getByRole('button', { name: '4', exact: true }))
          .click();
        await log.getByLabel('Note for your teacher').fill(`Session at ${tempo}`);
        await log.getByRole('button', { name: 'Log practice' }).click();
        await log
          .getByRole('status')
          .filter({ hasText: `Logged ${minutes} minutes at ${tempo} BPM.` })
          .waitFor();
      }
      await expect.poll(() => studentPage.locator('.best').innerText(), POLL).toBe('82 BPM');
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the teacher assigns a worksheet to the new student',
    async () => {
      await teacherPage.goto(`${suite.server.url}/studio`);
      const form = teacherPage.locator('tensile-assign-form form');
      await form
        .getByRole('radio', { name: 'A worksheet' })
        .or(form.getByRole('button', { name: 'A worksheet' }))
        .click();
      await pick(teacherPage, form.getByRole('combobox', { name: 'Worksheet' }), /Juno, week 3/);
      await pick(teacherPage, form.getByRole('combobox', { name: 'Students' }), /^Pim Osei$/);
      await form.getByLabel('Start tempo (BPM)').fill('60');
      await form.getByLabel('Target tempo (BPM)').fill('132');
      await form.getByRole('button', { name: 'Assign' }).click();
      await form.getByRole('status').filter({ hasText: 'Juno, week 3' }).waitFor();
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the student opens the worksheet, picks its second drill and logs practice on it',
    async () => {
      await studentPage.goto(`${suite.server.url}/assignments`);
      const row = studentPage.getByRole('row').filter({ hasText: 'Juno, week 3' });
      await row.getByRole('link').click();
      const sheet = studentPage.getByRole('navigation', { name: 'Drills of this worksheet' });
      const second = sheet.getByRole('listitem').nth(1);
      await second.getByRole('link').click();
      await studentPage.waitForURL((url) => /^\d+$/.test(url.searchParams.get('drill') ?? ''));
      await expect
        .poll(() => second.getByRole('link').getAttribute('aria-current'), POLL)
        .toBe('true');
      await studentPage.locator('tensile-drill-score svg').first().waitFor();

      const log = studentPage.locator('tensile-log-practice');
      await log.getByText('protect your hearing').waitFor();
      // The tempo played back pre-fills the clean tempo (the trainer raises the same figure while
      // it plays; headless audio may be blocked, so the tempo field stands in for it here).
      const playbackTempo = studentPage
        .getByRole('region', { name: 'Playback' })
        .getByLabel('Tempo (BPM)', { exact: true });
      const heard = Math.min(300, Number(await playbackTempo.inputValue()) + 7);
      await playbackTempo.fill(String(heard));
      await playbackTempo.press('Tab');
      const clean = log.getByLabel('Highest clean tempo (BPM)');
      await expect.poll(() => clean.inputValue(), POLL).toBe(String(heard));
      await log.getByLabel('Minutes').fill('12');
      await log.getByLabel('Highest clean tempo (BPM)').fill('66');
      await log.getByLabel('Note for your teacher').fill('Worksheet drill two');
      await log.getByRole('button', { name: 'Log practice' }).click();
      await log.getByRole('status').filter({ hasText: 'Logged 12 minutes at 66 BPM.' }).waitFor();
      // The snackbar confirms it too, and the drill's line counts the log.
      await studentPage
        .locator('mat-snack-bar-container')
        .filter({ hasText: 'Well played' })
        .waitFor();
      await expect.poll(() => second.innerText(), POLL).toMatch(/your best 66 BPM · 1 log/);
      await expect
        .poll(() => sheet.getByRole('listitem').first().innerText(), POLL)
        .toMatch(/0 logs/);
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'an address of someone else’s account is refused in words under the e-mail field',
    async () => {
      await teacherPage.goto(`${suite.server.url}/studio`);
      const invite = teacherPage.locator('form.invite');
      await invite.getByLabel('Name').fill('Someone Else');
      await invite.getByLabel('E-mail').fill(OTHER_TEACHER.email);
      await invite.getByRole('button', { name: 'Send invitation' }).click();
      await invite.locator('mat-error').filter({ hasText: 'someone else’s account' }).waitFor();
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the teacher sees both logs in the progress table and the chart',
    async () => {
      await teacherPage.goto(`${suite.server.url}/studio`);
      await teacherPage.getByRole('link', { name: STUDENT.name }).click();
      await teacherPage.getByRole('heading', { level: 1, name: STUDENT.name }).waitFor();
      const table = teacherPage.getByRole('table', { name: 'Practice history' });
      await expect.poll(() => table.innerText(), POLL).toMatch(/82 BPM[\s\S]*70 BPM/);
      expect(await table.innerText()).toContain('Session at 70');
      await expect
        .poll(() => table.innerText(), POLL)
        .toMatch(/Juno, week 3[\s\S]*Worksheet drill two/);
      const charts = teacherPage.locator('tensile-progress-chart canvas');
      await expect.poll(() => charts.count(), POLL).toBe(2);
      const size = await charts.first().boundingBox();
      expect(size?.height ?? 0).toBeGreaterThan(100);
    },
    STEP_TIMEOUT_MS,
  );

  it(
    'the admin has a teacher’s password reset by e-mail; the teacher signs in with the new one',
    async () => {
      if (!adminPage) throw new Error('The admin signed in earlier in this journey');
      await adminPage.goto(`${suite.server.url}/admin/users`);
      await adminPage
        .getByRole('button', { name: 'Send a password reset to Hana Lindqvist' })
        .click();
      await adminPage.getByRole('status').filter({ hasText: 'reset link was sent' }).waitFor();
      const link = await linkFromOutbox(/Reset your Tensile password/, 'reset-password');

      const page = await newPage(suite.browser);
      await page.goto(link);
      await page.getByLabel('New password').fill(NEW_TEACHER_PASSWORD);
      await page.getByLabel('Repeat the password').fill(NEW_TEACHER_PASSWORD);
      await page.getByRole('button', { name: 'Save password' }).click();
      await page.getByRole('status').filter({ hasText: 'password has been changed' }).waitFor();
      await signIn(page, suite.server.url, OTHER_TEACHER.email, NEW_TEACHER_PASSWORD);
      await page.waitForURL((url) => url.pathname === '/rule-cards');
    },
    STEP_TIMEOUT_MS,
  );
});
