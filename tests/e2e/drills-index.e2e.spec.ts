/**
 * The drills index (`/drills`) in a real browser against the real server: a teacher's recently
 * opened drills come back newest first and reopen exactly (same address, same seed, same drill),
 * the "Open a drill" form opens any built-in card with a typed seed, and clearing the list asks
 * first. Students see their recent drills but get no form to pick cards or seeds.
 */
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS, type BuiltInPreset } from '../../shared/generator/presets/index';
import { recordForeignRequests, signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_STUDENTS, DEMO_TEACHERS } from '../support/demo-accounts';

function preset(id: string): BuiltInPreset {
  const found = BUILT_IN_PRESETS.find((p) => p.id === id);
  if (!found) throw new Error(`built-in preset "${id}" is missing`);
  return found;
}

// Three cards with distinct titles, none a prefix of another (the select's options are matched
// by their title).
const EARLY_BACKBEAT = preset('early-backbeat');
const LINEAR_SIXTEENTHS = preset('linear-sixteenths');
const KICK_OFF_THE_ONE = preset('kick-off-the-one');

const SCORE_NOTE = 'tensile-drill-score svg .tensile-note';

/**
 * A locator's text as a screen reader reads it, piece by piece: `aria-hidden` parts (icon
 * ligatures) left out, and a space between neighbouring elements' texts.
 */
function spokenText(locator: Locator): Promise<string> {
  return locator.evaluate((element) => {
    const pieces: string[] = [];
    const walker = document.createTreeWalker(element, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      if (node.parentElement?.closest('[aria-hidden="true"]')) continue;
      pieces.push(node.textContent ?? '');
    }
    return pieces.join(' ').replace(/\s+/g, ' ').trim();
  });
}

function recentRegion(page: Page): Locator {
  return page.getByRole('region', { name: 'Recent drills' });
}

/** The recent-drill links, each as it is read out ("Title Seed seed Opened just now"). */
async function recentEntries(page: Page): Promise<string[]> {
  const links = recentRegion(page).getByRole('listitem').getByRole('link');
  const texts: string[] = [];
  for (const link of await links.all()) texts.push(await spokenText(link));
  return texts;
}

function entryPattern(card: BuiltInPreset, seed: string): RegExp {
  const escape = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`^${escape(card.title)} Seed ${escape(seed)} Opened `);
}

/**
 * Which instruments each engraved note strikes, in score order: a fingerprint of the drill that
 * does not depend on how the notation is laid out.
 */
async function drillFingerprint(page: Page): Promise<string[]> {
  await page.locator(SCORE_NOTE).first().waitFor();
  return page
    .locator(SCORE_NOTE)
    .evaluateAll((notes) => notes.map((n) => n.getAttribute('data-instruments') ?? ''));
}

/** Waits for a drill page showing `card` with `seed`: address, heading, seed field, notation. */
async function expectDrillPage(page: Page, card: BuiltInPreset, seed: string): Promise<void> {
  await page.waitForURL(
    (url) => url.pathname === `/drills/${card.id}` && url.searchParams.get('seed') === seed,
  );
  await page.getByRole('heading', { level: 1, name: card.title, exact: true }).waitFor();
  await expect.poll(() => page.getByLabel('Seed').inputValue()).toBe(seed);
  await page.locator(SCORE_NOTE).first().waitFor();
}

/** Opens a drill the way a shared seed link does, and returns its fingerprint. */
async function openDrillLink(
  page: Page,
  baseUrl: string,
  card: BuiltInPreset,
  seed: string,
): Promise<string[]> {
  await page.goto(
    `${baseUrl}/drills/${encodeURIComponent(card.id)}?seed=${encodeURIComponent(seed)}`,
  );
  await expectDrillPage(page, card, seed);
  return drillFingerprint(page);
}

/** Goes to `/drills` through the main navigation and waits for the recent list to settle. */
async function goToDrillsFromNavigation(page: Page): Promise<void> {
  await page
    .getByRole('navigation', { name: 'Main' })
    .getByRole('link', { name: 'Drills' })
    .click();
  await page.waitForURL((url) => url.pathname === '/drills');
  await page.getByRole('heading', { level: 1, name: 'Drills', exact: true }).waitFor();
  await recentRegion(page).waitFor();
}

describe('the drills index in the browser', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;
  let foreign: string[];

  beforeEach(async () => {
    // Wide enough that the side navigation is always shown (no menu button to press first).
    context = await suite.browser.newContext({ viewport: { width: 1366, height: 1000 } });
    page = await context.newPage();
    foreign = recordForeignRequests(page);
  });

  afterEach(async () => {
    await context?.close();
  });

  it('lists recent drills newest first, reopens one exactly and opens a new one from the form', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);

    const older = await openDrillLink(page, suite.server.url, EARLY_BACKBEAT, 'larkspur-week-3');
    const newer = await openDrillLink(page, suite.server.url, LINEAR_SIXTEENTHS, 'lesson 12b');
    expect(older.length).toBeGreaterThan(0);
    expect(newer.length).toBeGreaterThan(0);

    await goToDrillsFromNavigation(page);
    const nav = page.getByRole('navigation', { name: 'Main' });
    expect(await nav.getByRole('link', { name: 'Drills' }).getAttribute('aria-current')).toBe(
      'page',
    );
    // Only the page being shown is marked current.
    expect(await nav.locator('a[aria-current]').count()).toBe(1);

    await expect.poll(() => recentEntries(page)).toHaveLength(2);
    const [first, second] = await recentEntries(page);
    expect(first).toMatch(entryPattern(LINEAR_SIXTEENTHS, 'lesson 12b'));
    expect(second).toMatch(entryPattern(EARLY_BACKBEAT, 'larkspur-week-3'));

    // Reopening the older drill: same address, same seed, the very same drill.
    await recentRegion(page)
      .getByRole('link', { name: new RegExp(`^${EARLY_BACKBEAT.title}`) })
      .click();
    await expectDrillPage(page, EARLY_BACKBEAT, 'larkspur-week-3');
    expect(await drillFingerprint(page)).toEqual(older);

    // Reopened, it is now the most recent.
    await goToDrillsFromNavigation(page);
    await expect
      .poll(async () => (await recentEntries(page))[0] ?? '')
      .toMatch(entryPattern(EARLY_BACKBEAT, 'larkspur-week-3'));
    expect(await recentEntries(page)).toHaveLength(2);

    // "Open a drill": pick a card, type a seed, Open.
    const form = page.getByRole('region', { name: 'Open a drill' });
    await form.getByRole('combobox', { name: 'Rule card' }).click();
    await page.getByRole('option', { name: new RegExp(`^${KICK_OFF_THE_ONE.title} ·`) }).click();
    await expect
      .poll(() => spokenText(form.getByRole('combobox', { name: 'Rule card' })))
      .toContain(KICK_OFF_THE_ONE.title);
    await form.getByLabel('Seed').fill('recital-warmup');
    await form.getByRole('button', { name: 'Open', exact: true }).click();
    await expectDrillPage(page, KICK_OFF_THE_ONE, 'recital-warmup');

    await goToDrillsFromNavigation(page);
    await expect.poll(() => recentEntries(page)).toHaveLength(3);
    expect((await recentEntries(page))[0]).toMatch(
      entryPattern(KICK_OFF_THE_ONE, 'recital-warmup'),
    );
    expect(foreign).toEqual([]);
  });

  it('asks before clearing: keeping leaves the list, clearing empties it for good', async () => {
    const teacher = DEMO_TEACHERS[1]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await openDrillLink(page, suite.server.url, EARLY_BACKBEAT, 'clear-me-1');
    await openDrillLink(page, suite.server.url, KICK_OFF_THE_ONE, 'clear-me-2');
    await goToDrillsFromNavigation(page);
    await expect.poll(() => recentEntries(page)).toHaveLength(2);

    const clear = recentRegion(page).getByRole('button', { name: 'Clear recent drills' });
    const question = recentRegion(page)
      .getByRole('group')
      .filter({ hasText: /^\s*Clear all 2/ });
    const keep = recentRegion(page).getByRole('button', { name: 'Keep them' });

    await clear.click();
    await question.waitFor();
    expect(await spokenText(question)).toMatch(/Clear all 2 recent drills from this browser\?/);
    // The safe answer has the focus, so a stray Enter does not wipe the list.
    await expect
      .poll(() => keep.evaluate((button) => button === document.activeElement))
      .toBe(true);
    await keep.click();
    await question.waitFor({ state: 'detached' });
    await clear.waitFor();
    expect(await recentEntries(page)).toHaveLength(2);

    await clear.click();
    await recentRegion(page).getByRole('button', { name: 'Clear list' }).click();
    const empty = recentRegion(page).getByRole('status').filter({ hasText: 'No recent drills' });
    await empty.waitFor();
    expect(await recentRegion(page).getByRole('listitem').count()).toBe(0);
    expect(await clear.count()).toBe(0);

    // The list is gone from the browser, not just from the page.
    await page.reload();
    await recentRegion(page).getByRole('status').filter({ hasText: 'No recent drills' }).waitFor();
    expect(await recentRegion(page).getByRole('listitem').count()).toBe(0);
  });

  it('shows a student their recent drills but no form to open a card with a seed', async () => {
    const student = DEMO_STUDENTS[2]!;
    await signIn(page, suite.server.url, student.email, student.password);
    const card = LINEAR_SIXTEENTHS;
    await page.goto(`${suite.server.url}/drills/${card.id}?seed=homework-4`);
    await page.getByRole('heading', { level: 1, name: card.title, exact: true }).waitFor();
    await page.locator(SCORE_NOTE).first().waitFor();

    await page.goto(`${suite.server.url}/drills`);
    await page.getByRole('heading', { level: 1, name: 'Drills', exact: true }).waitFor();
    await expect.poll(() => recentEntries(page)).toHaveLength(1);
    expect((await recentEntries(page))[0]).toMatch(entryPattern(card, 'homework-4'));

    expect(await page.getByRole('heading', { name: 'Open a drill' }).count()).toBe(0);
    expect(await page.getByRole('combobox', { name: 'Rule card' }).count()).toBe(0);
    expect(await page.getByLabel('Seed').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Open', exact: true }).count()).toBe(0);
  });
});
