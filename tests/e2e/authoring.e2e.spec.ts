/**
 * The teacher's authoring journey in a real browser against the real server, from a fresh
 * database: a card with a 4:3 polyrhythm and a dragged tension curve, an inline conflict message
 * that goes away once the contradictory rule is removed, a pinned bar that survives a new seed, a
 * saved drill shared as a seed link that a signed-out browser sees note for note, then revoked.
 */
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

/** The first engraving of a thumbnail or a preview may take seconds on a busy machine. */
const POLL = { timeout: 30_000 };

const NOTE = 'tensile-drill-score svg .tensile-note';

/**
 * Every drawn note of the score, in document order, as where it sits: bar, beat, slot, the
 * instruments and their staff places. The two pages lay the score out at different widths, so
 * pixel x positions differ while the notes' places on the staff may not.
 */
async function notePlaces(page: Page, scope = 'tensile-drill-score'): Promise<string[]> {
  await page.locator(NOTE).first().waitFor({ state: 'visible' });
  return page
    .locator(`${scope} svg .tensile-note`)
    .evaluateAll((notes) =>
      notes.map((note) =>
        [
          note.closest('[data-bar]')?.getAttribute('data-bar'),
          ...['data-beat', 'data-slot', 'data-instruments', 'data-positions'].map((name) =>
            note.getAttribute(name),
          ),
        ].join('|'),
      ),
    );
}

/**
 * What bar `bar` of the preview plays, note by note: beat, slot, instruments and staff places
 * (spacing may shift when the other bars change, the music may not).
 */
async function barNotes(page: Page, bar: number): Promise<string[]> {
  const places = await notePlaces(page, 'tensile-card-preview');
  return places.filter((place) => place.startsWith(`${bar}|`));
}

function rule(page: Page, name: RegExp): Locator {
  return page.getByRole('article', { name });
}

/** Waits until the preview shows a current drill (no refusal, nothing out of date). */
async function previewSettled(page: Page): Promise<void> {
  try {
    await waitSettled(page);
  } catch (error) {
    const problem = await page.locator('tensile-card-preview .problem').allInnerTexts();
    throw new Error(`The preview did not settle: ${problem.join(' / ') || 'no message'}`, {
      cause: error,
    });
  }
}

function waitSettled(page: Page) {
  return page.waitForFunction(
    () =>
      !document.querySelector('tensile-card-preview .problem') &&
      !document.querySelector('tensile-card-preview .stale-note') &&
      !!document.querySelector('tensile-card-preview svg .tensile-note'),
    undefined,
    { timeout: 15_000 },
  );
}

describe('authoring journey: card, conflict, pinned bar, saved drill, seed link', () => {
  const suite = useServerAndBrowser();
  let teacherContext: BrowserContext;
  let visitorContext: BrowserContext;
  let page: Page;
  let visitor: Page;

  beforeAll(async () => {
    teacherContext = await suite.browser.newContext({ viewport: { width: 1400, height: 1000 } });
    visitorContext = await suite.browser.newContext({ viewport: { width: 1400, height: 1000 } });
    page = await teacherContext.newPage();
    visitor = await visitorContext.newPage();
  });

  afterAll(async () => {
    await teacherContext?.close();
    await visitorContext?.close();
  });

  it('builds, saves, shares and revokes', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await page.goto(`${suite.server.url}/rule-cards/new`);
    await page.getByLabel('Card title').fill('Four over three study');
    await previewSettled(page);

    // A 4:3 polyrhythm: 4 even hits over 3 beats, a hit every three sixteenths (common practice).
    await page.getByRole('button', { name: 'Add a rule' }).click();
    await page.getByRole('menuitem', { name: 'Polyrhythm' }).click();
    const poly = rule(page, /Polyrhythm/);
    await poly.getByLabel('Hits (against)').fill('4');
    await poly.getByLabel('Over (beats)').click();
    await page.getByRole('option', { name: /^4:3 over 3 beats$/ }).click();
    await previewSettled(page);

    // A tension curve, its second point dragged down with the mouse: bar 2 the calm one.
    await page.getByRole('button', { name: 'Add a rule' }).click();
    await page.getByRole('menuitem', { name: 'Tension curve' }).click();
    const curve = rule(page, /Tension curve/);
    const field = curve.getByLabel('Bar 2', { exact: true });
    await previewSettled(page);
    const before = Number(await field.inputValue());
    const point = curve.locator('circle[data-bar="2"]');
    await point.scrollIntoViewIfNeeded();
    // The preview may still be growing as its strips come into view, which moves the rules
    // below it: start each drag only where a hit test finds the point, and drag again if the
    // page moved under the pointer before the button went down.
    const dragDown = async (): Promise<number> => {
      const box = (await point.boundingBox())!;
      const x = box.x + box.width / 2;
      const y = box.y + box.height / 2;
      const onPoint = await page.evaluate(
        ([px, py]) => document.elementFromPoint(px!, py!)?.getAttribute('data-bar') === '2',
        [x, y],
      );
      if (onPoint) {
        await page.mouse.move(x, y);
        await page.mouse.down();
        await page.mouse.move(x, y + 40, { steps: 5 });
        await page.mouse.up();
      }
      return Number(await field.inputValue());
    };
    await expect.poll(dragDown, { timeout: 10_000 }).toBeLessThan(before);
    await previewSettled(page);

    // A linear rule cannot hold with a backbeat on the ostinato's slots (drill contract): the
    // message sits on the linear rule; removing that rule clears it.
    await page.getByRole('button', { name: 'Add a rule' }).click();
    await page.getByRole('menuitem', { name: /^Linear/ }).click();
    const linear = rule(page, /Linear/);
    const conflict = linear.getByRole('alert');
    await conflict.first().waitFor({ state: 'visible', timeout: 15_000 });
    expect(await conflict.first().innerText()).toMatch(/\S/);
    await expect.poll(() => page.locator('tensile-card-preview .stale-note').count(), POLL).toBe(1);
    const linearName = (await linear.getAttribute('aria-label'))!;
    const linearNumber = /Rule (\d+)/.exec(linearName)![1];
    await page.getByRole('button', { name: `Remove rule ${linearNumber}` }).click();
    await previewSettled(page);
    expect(await page.getByRole('article', { name: /Linear/ }).count()).toBe(0);

    // Pin bar 1, regenerate the rest: the seed changes, bar 1 stays note for note.
    const seedBefore = await page.getByTestId('preview-seed').innerText();
    const barOne = await barNotes(page, 1);
    expect(barOne.length).toBeGreaterThan(0);
    await page.getByRole('button', { name: 'Pin bar 1' }).click();
    await page.getByRole('button', { name: 'Regenerate the other bars' }).click();
    await expect
      .poll(() => page.getByTestId('preview-seed').innerText(), POLL)
      .not.toBe(seedBefore);
    await previewSettled(page);
    expect(await barNotes(page, 1)).toEqual(barOne);

    // Save the card, then the drill.
    await page.getByRole('button', { name: 'Save card' }).click();
    await page.waitForURL(
      (url) => /^\/rule-cards\/[^/]+$/.test(url.pathname) && !url.pathname.endsWith('/new'),
    );
    await page.getByRole('button', { name: 'Save drill' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Title').fill('4:3 study, week 1');
    await dialog.getByRole('button', { name: 'Save drill' }).click();
    await page.getByRole('button', { name: 'Open' }).click();
    await page.waitForURL((url) => url.pathname.startsWith('/saved-drills/'));
    await page.getByRole('heading', { level: 1, name: '4:3 study, week 1' }).waitFor();
    const saved = await notePlaces(page);
    expect(saved.length).toBeGreaterThan(10);

    // Share: the signed-out browser sees the same noteheads at the same places.
    await page.getByRole('button', { name: 'Share a link' }).click();
    const link = await page.getByTestId('seed-link').getAttribute('href');
    expect(link).toMatch(/\/s\/[A-Za-z0-9_-]{16,}$/);
    await visitor.goto(link!);
    await visitor.getByRole('heading', { level: 1, name: '4:3 study, week 1' }).waitFor();
    expect(await notePlaces(visitor)).toEqual(saved);
    expect(await visitor.getByRole('navigation').count()).toBe(0);

    // Revoke: the link now says the drill was withdrawn.
    await page.getByRole('button', { name: 'Revoke link' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Revoke link' }).click();
    await page.getByRole('button', { name: 'Share a link' }).waitFor();
    await visitor.reload();
    await visitor.getByRole('heading', { name: 'This drill was withdrawn' }).waitFor();
  }, 180_000);
});
