/**
 * Looking after rule cards and drills in a real browser against the real server: rename,
 * duplicate, export and import (a JSON file), archive a card that saved drills use; undo and
 * redo in the editor, and the prompt before leaving unsaved changes; a drill saved from the
 * drill page, shared, then deleted, after which its link says the drill was withdrawn.
 */
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

/** A busy machine may take seconds for a request or an engraving. */
const POLL = { timeout: 30_000 };

describe('authoring journey: managing cards and drills', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;
  let files: string;

  beforeAll(async () => {
    files = await mkdtemp(path.join(os.tmpdir(), 'tensile-manage-'));
    context = await suite.browser.newContext({
      viewport: { width: 1400, height: 1000 },
      acceptDownloads: true,
    });
    page = await context.newPage();
    const teacher = DEMO_TEACHERS[1]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
  });

  afterAll(async () => {
    await context?.close();
    await rm(files, { recursive: true, force: true });
  });

  /** The card table's row for a title, found through the table's own search. */
  async function cardRow(title: string) {
    const search = page.getByLabel('Search titles');
    if ((await search.inputValue()) !== title) {
      // Wait for the debounced search's own answer: a row found before it lands is re-rendered
      // (and an open menu on it closed) when the filtered list arrives.
      const searched = page.waitForResponse(
        (res) =>
          new URL(res.url()).pathname === '/api/rule-cards' &&
          new URL(res.url()).searchParams.get('q') === title,
        POLL,
      );
      await search.fill(title);
      await searched;
    }
    // The row whose title link is exactly this title (a copy's title starts the same).
    const row = page
      .getByRole('table', { name: 'Your rule cards' })
      .getByRole('row')
      .filter({ has: page.getByRole('link', { name: title, exact: true }) });
    await row.first().waitFor(POLL);
    return row.first();
  }

  async function cardAction(title: string, action: string): Promise<void> {
    await (await cardRow(title)).getByRole('button', { name: `Actions for ${title}` }).click();
    await page.getByRole('menuitem', { name: action }).click();
  }

  async function snack(text: string | RegExp): Promise<void> {
    await page.locator('mat-snack-bar-container').filter({ hasText: text }).waitFor(POLL);
  }

  it('renames, duplicates, exports, imports and archives rule cards', async () => {
    // The card and a drill that uses it are made over the API with the teacher's session.
    const made = await page.request.post(`${suite.server.url}/api/rule-cards`, {
      data: { title: 'Heron groove', card: BUILT_IN_PRESETS[0]!.card },
    });
    expect(made.status()).toBe(201);
    const cardId = ((await made.json()) as { ruleCard: { id: number } }).ruleCard.id;
    const drill = await page.request.post(`${suite.server.url}/api/drills`, {
      data: {
        ruleCardId: cardId,
        title: 'Heron lesson',
        card: BUILT_IN_PRESETS[0]!.card,
        seed: 'h1',
      },
    });
    expect(drill.status()).toBe(201);

    await page.goto(`${suite.server.url}/rule-cards`);
    await cardAction('Heron groove', 'Rename');
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Title').fill('Heron groove, renamed');
    await dialog.getByRole('button', { name: 'Rename' }).click();
    await snack('Renamed to "Heron groove, renamed".');
    await cardRow('Heron groove, renamed');

    await cardAction('Heron groove, renamed', 'Duplicate');
    await snack('Made "Heron groove, renamed (copy)".');
    await cardRow('Heron groove, renamed (copy)');

    // Export: the browser downloads Tensile's envelope with the card as saved.
    await page.getByLabel('Search titles').fill('');
    const [download] = await Promise.all([
      page.waitForEvent('download', POLL),
      cardAction('Heron groove, renamed', 'Export JSON'),
    ]);
    expect(download.suggestedFilename()).toBe('heron-groove-renamed.tensile.json');
    const exported = JSON.parse(await readFile((await download.path())!, 'utf8')) as Record<
      string,
      unknown
    >;
    expect(exported).toMatchObject({
      format: 'tensile.rule-card',
      version: 1,
      title: 'Heron groove, renamed',
      card: BUILT_IN_PRESETS[0]!.card,
    });

    // Import the same file under another title: a new card with that title.
    const good = path.join(files, 'heron-imported.tensile.json');
    await writeFile(good, JSON.stringify({ ...exported, title: 'Heron imported' }));
    const [chooser] = await Promise.all([
      page.waitForEvent('filechooser', POLL),
      page.getByRole('button', { name: 'Import JSON' }).click(),
    ]);
    await chooser.setFiles(good);
    await snack('Imported "Heron imported".');
    await cardRow('Heron imported');

    // A file of another version is refused with the server's words, and nothing is added.
    const bad = path.join(files, 'heron-future.tensile.json');
    await writeFile(bad, JSON.stringify({ ...exported, title: 'Heron future', version: 99 }));
    const [again] = await Promise.all([
      page.waitForEvent('filechooser', POLL),
      page.getByRole('button', { name: 'Import JSON' }).click(),
    ]);
    await again.setFiles(bad);
    await snack(/version/i);
    await page.getByLabel('Search titles').fill('Heron future');
    await page.getByRole('heading', { name: 'No card matches these filters' }).waitFor(POLL);

    // Deleting a card that a saved drill uses archives it: out of the list, under "Archived".
    await cardAction('Heron groove, renamed', 'Delete');
    const confirm = page.getByRole('dialog');
    await confirm.getByText(/archived rather than destroyed/).waitFor();
    await confirm.getByRole('button', { name: 'Archive' }).click();
    await snack('"Heron groove, renamed" is archived: saved drills still use it.');
    await page.getByLabel('Search titles').fill('Heron groove, renamed');
    const table = page.getByRole('table', { name: 'Your rule cards' });
    const original = table
      .getByRole('row')
      .filter({ has: page.getByRole('link', { name: 'Heron groove, renamed', exact: true }) });
    await expect.poll(() => original.count(), POLL).toBe(0);
    await page.getByRole('switch', { name: 'Archived' }).click();
    await original.first().waitFor(POLL);
    expect(await original.first().innerText()).toContain('(archived)');
  }, 180_000);

  it('undoes and redoes an edit, and asks before leaving unsaved changes', async () => {
    await page.goto(`${suite.server.url}/rule-cards/new`);
    // The card's tempo (the playback panel of the preview has a tempo field of its own).
    const tempo = page
      .getByRole('region', { name: 'Meter, grid, tempo and voices' })
      .getByLabel('Tempo (BPM)', { exact: true });
    await tempo.waitFor(POLL);
    const before = await tempo.inputValue();
    await tempo.fill('133');
    await tempo.blur();
    const undo = page.getByRole('button', { name: 'Undo', exact: true });
    const redo = page.getByRole('button', { name: 'Redo', exact: true });
    await expect.poll(() => undo.isEnabled(), POLL).toBe(true);
    await undo.click();
    await expect.poll(() => tempo.inputValue(), POLL).toBe(before);
    await expect.poll(() => redo.isEnabled(), POLL).toBe(true);
    await redo.click();
    await expect.poll(() => tempo.inputValue(), POLL).toBe('133');

    // Leaving asks; "Stay" keeps the page and the edit, "Leave without saving" goes.
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Drills' })
      .click();
    const ask = page.getByRole('dialog');
    await ask.getByText('Leave without saving?').waitFor(POLL);
    await ask.getByRole('button', { name: 'Stay' }).click();
    await ask.waitFor({ state: 'detached' });
    expect(new URL(page.url()).pathname).toBe('/rule-cards/new');
    expect(await tempo.inputValue()).toBe('133');
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Drills' })
      .click();
    await page.getByRole('dialog').getByRole('button', { name: 'Leave without saving' }).click();
    await page.waitForURL((url) => url.pathname === '/drills', POLL);
  }, 120_000);

  it('saves a drill from the drill page, shares it, deletes it: the link says withdrawn', async () => {
    const preset = BUILT_IN_PRESETS[0]!;
    await page.goto(`${suite.server.url}/drills/${preset.id}?seed=kestrel-7`);
    await page.locator('tensile-drill-score svg .tensile-note').first().waitFor(POLL);
    await page.getByRole('button', { name: 'Save drill' }).click();
    const dialog = page.getByRole('dialog');
    const title = dialog.getByLabel('Title');
    expect(await title.inputValue()).toBe(`${preset.title} · kestrel-7`);
    await title.fill('Kestrel lesson');
    await dialog.getByLabel('Notes').fill('Slow first.');
    await dialog.getByRole('button', { name: 'Save drill' }).click();
    const saved = page
      .locator('mat-snack-bar-container')
      .filter({ hasText: 'Drill "Kestrel lesson" saved.' });
    await saved.waitFor(POLL);
    await saved.getByRole('button', { name: 'Open' }).click();
    await page.waitForURL((url) => /^\/saved-drills\/\d+$/.test(url.pathname), POLL);
    expect(await page.getByLabel('Notes').inputValue()).toBe('Slow first.');
    await page
      .getByRole('heading', { name: /Kestrel lesson/ })
      .first()
      .waitFor(POLL);

    await page.getByRole('button', { name: 'Share a link' }).click();
    const link = page.getByTestId('seed-link');
    await link.waitFor(POLL);
    const url = await link.innerText();

    await page.getByRole('button', { name: 'Delete drill' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Delete' }).click();
    await page.waitForURL((target) => target.pathname === '/drills', POLL);

    const visitorContext = await suite.browser.newContext();
    try {
      const visitor = await visitorContext.newPage();
      const answer = await visitor.request.get(
        `${suite.server.url}/api/seed-links/${url.split('/s/')[1]}`,
      );
      expect(answer.status()).toBe(410);
      await visitor.goto(url);
      await visitor.getByRole('heading', { name: 'This drill was withdrawn' }).waitFor(POLL);
    } finally {
      await visitorContext.close();
    }
  }, 120_000);
});
