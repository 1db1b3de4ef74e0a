/**
 * The worksheet builder in a real browser against the real server: the demo teacher builds a
 * worksheet of three drills (two saved drills and a preset at a seed), reorders it by dragging
 * with the mouse and by the arrow keys, saves, reloads and finds the order kept, then lays the
 * worksheet out as a PDF in the print preview and downloads it.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const PUSHED = 'Pushed backbeat for Juno';
const SEVEN = '7/8 warm-up';
const PRESET = 'Four over three (seed wren-1)';

/** The titles of the worksheet's drills, in their order on the page. */
function itemTitles(page: Page): Promise<string[]> {
  return page
    .locator('li.item .item-title')
    .evaluateAll((titles) =>
      titles.map((t) => (t.textContent ?? '').replace(/^\s*\d+\.\s*/, '').trim()),
    );
}

function handle(page: Page, title: string): Locator {
  return page.getByRole('button', { name: new RegExp(`^Drill \\d of \\d: ${escape(title)}\\.`) });
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

async function addSavedDrill(page: Page, title: string): Promise<void> {
  await page.getByRole('button', { name: 'Add a drill' }).click();
  const dialog = page.getByRole('dialog', { name: 'Add a drill' });
  await dialog.getByRole('button', { name: new RegExp(`^${escape(title)}`) }).click();
  await dialog.waitFor({ state: 'detached' });
}

/** Drags with the mouse in small steps, as a person would (the drag starts after a few px). */
async function drag(page: Page, from: Locator, to: Locator): Promise<void> {
  const start = (await from.boundingBox())!;
  const end = (await to.boundingBox())!;
  await page.mouse.move(start.x + start.width / 2, start.y + start.height / 2);
  await page.mouse.down();
  await page.mouse.move(start.x + start.width / 2, start.y + start.height / 2 - 10, { steps: 5 });
  await page.mouse.move(end.x + end.width / 2, end.y + 4, { steps: 20 });
  await page.mouse.up();
}

describe('the worksheet builder', () => {
  const suite = useServerAndBrowser();

  it(
    'builds a worksheet of three drills, reorders it by mouse and keyboard, saves and prints it',
    { timeout: 180_000 },
    async () => {
      const context = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
      const dir = mkdtempSync(join(tmpdir(), 'tensile-worksheet-'));
      try {
        const page = await context.newPage();
        const teacher = DEMO_TEACHERS[0]!;
        await signIn(page, suite.server.url, teacher.email, teacher.password);

        await page.goto(`${suite.server.url}/worksheets`);
        // The demo worksheet is listed.
        await page.getByRole('link', { name: 'Juno, week 3: leaning on the backbeat' }).waitFor();
        await page.getByRole('link', { name: 'New worksheet' }).click();
        await page.getByRole('heading', { level: 1, name: 'New worksheet' }).waitFor();
        await page.getByRole('textbox', { name: 'Title', exact: true }).fill('Wren, week 1');

        await addSavedDrill(page, PUSHED);
        await addSavedDrill(page, SEVEN);
        await page.getByRole('button', { name: 'Add a drill' }).click();
        const dialog = page.getByRole('dialog', { name: 'Add a drill' });
        await dialog.getByRole('tab', { name: 'Preset at a seed' }).click();
        await dialog.getByRole('combobox', { name: 'Preset' }).click();
        await page.getByRole('option', { name: 'Four over three', exact: true }).click();
        await dialog.getByRole('textbox', { name: 'Seed' }).fill('wren-1');
        await dialog.getByRole('button', { name: 'Add this preset' }).click();
        await dialog.waitFor({ state: 'detached' });
        expect(await itemTitles(page)).toEqual([PUSHED, SEVEN, PRESET]);

        // Mouse: the preset dragged by its handle to the top.
        await drag(page, handle(page, PRESET), page.locator('li.item').first());
        await expect.poll(() => itemTitles(page)).toEqual([PRESET, PUSHED, SEVEN]);

        // Keyboard: the 7/8 drill's handle focused, moved up one with the arrow key.
        await handle(page, SEVEN).focus();
        await page.keyboard.press('ArrowUp');
        await expect.poll(() => itemTitles(page)).toEqual([PRESET, SEVEN, PUSHED]);
        // The move is announced, and the focus stays on the moved drill's handle.
        await expect
          .poll(() => page.locator('.cdk-live-announcer-element').textContent())
          .toBe(`"${SEVEN}" moved to position 2 of 3.`);
        expect(
          await handle(page, SEVEN).evaluate((element) => element === document.activeElement),
        ).toBe(true);

        await page.getByRole('button', { name: 'Save worksheet' }).click();
        await page.getByText('Saved "Wren, week 1".').waitFor();
        await page.waitForURL((url) => /^\/worksheets\/\d+$/.test(url.pathname));

        await page.reload();
        await page.getByRole('heading', { level: 1, name: 'Wren, week 1' }).waitFor();
        await page.locator('li.item').first().waitFor();
        expect(await itemTitles(page)).toEqual([PRESET, SEVEN, PUSHED]);

        await page.getByRole('link', { name: 'Print preview' }).click();
        const pages = page.locator('iframe.pages');
        await pages.waitFor({ timeout: 120_000 });
        // The preview is the PDF the page fetched from the server, shown by the browser's own
        // PDF viewer (which opens as a frame inside the preview's frame).
        expect(await pages.getAttribute('src')).toMatch(/^blob:/);
        const frame = await (await pages.elementHandle())!.contentFrame();
        await expect
          .poll(() => frame!.childFrames().length, { timeout: 30_000 })
          .toBeGreaterThan(0);

        const [download] = await Promise.all([
          page.waitForEvent('download'),
          page.getByRole('button', { name: 'Download PDF' }).click(),
        ]);
        expect(download.suggestedFilename()).toBe('wren-week-1.pdf');
        const file = join(dir, 'worksheet.pdf');
        await download.saveAs(file);
        expect(readFileSync(file).subarray(0, 5).toString('latin1')).toBe('%PDF-');
        const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(
          /\s+/g,
          ' ',
        );
        expect(text).toContain('Wren, week 1');
        for (const title of [PRESET, SEVEN, PUSHED]) expect(text).toContain(title);
        // Printed in the order the teacher set.
        const at = [PRESET, SEVEN, PUSHED].map((title) => text.indexOf(title));
        expect([...at].sort((a, b) => a - b)).toEqual(at);
      } finally {
        await context.close();
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
