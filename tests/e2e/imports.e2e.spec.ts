/**
 * MIDI groove import in a real browser against the real server: a file that is not MIDI is
 * refused with its reason; a rock groove comes up on the drum staff with its timing in words, is
 * saved as a drill that shows the same notes, and becomes a rule card whose editor preview
 * generates a variation.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rockGroove } from '../../shared/formats/midi-import/testing/groove-file';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

/** The first engraving may take seconds on a busy machine. */
const SLOW = { timeout: 30_000 };

/** Every drawn note of a score as where it sits: bar, beat, slot, instruments, staff places. */
async function notePlaces(page: Page, scope: string): Promise<string[]> {
  await page
    .locator(`${scope} svg .tensile-note`)
    .first()
    .waitFor({ state: 'visible', ...SLOW });
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

async function upload(page: Page, name: string, bytes: Uint8Array): Promise<void> {
  await page.getByTestId('midi-file').setInputFiles({
    name,
    mimeType: 'audio/midi',
    buffer: Buffer.from(bytes),
  });
}

describe('MIDI groove import journey', () => {
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

  it('refuses a bad file, shows a groove, saves it as a drill and makes a rule card', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: /Import groove/ })
      .click();
    await page.waitForURL((url) => url.pathname === '/imports');
    await page.getByRole('heading', { level: 1, name: 'Import a groove' }).waitFor();

    // Not a MIDI file: the server's reason, nothing drawn.
    await upload(page, 'notes.mid', new TextEncoder().encode('These are my lesson notes.'));
    await page.getByRole('alert').waitFor(SLOW);
    expect(await page.getByTestId('import-problem').innerText()).toMatch(
      /not a Standard MIDI File/,
    );
    expect(await page.locator('tensile-drill-score').count()).toBe(0);

    // A two-bar rock groove: eighth hi-hats, kick on 1 and the "&" of 3, snare on 2 and 4 and a
    // ghost note on the last sixteenth.
    await upload(page, 'rock-groove.mid', rockGroove(2, 100));
    const imported = await notePlaces(page, 'tensile-import-page tensile-drill-score');
    expect(await page.getByRole('alert').count()).toBe(0);
    const barOne = imported.filter((n) => n.startsWith('1|'));
    // Nine instants for the hands (hi-hat, snare) and two kicks, at least.
    expect(barOne.length).toBeGreaterThanOrEqual(9);
    expect(imported.filter((n) => n.startsWith('2|'))).toHaveLength(barOne.length);
    expect(await page.getByTestId('import-facts').innerText()).toBe(
      '4/4, 100 beats a minute, 2 bars; card grid: sixteenths.',
    );
    expect(await page.getByTestId('residual-summary').innerText()).toBe(
      'Every note sat on its slot (within 1 ms).',
    );
    await page.getByRole('button', { name: /Play/ }).first().waitFor();

    // Save as drill: it stays on the page and links the saved drill.
    await page.getByLabel('Title').fill('Imported rock groove');
    await page.getByRole('button', { name: /Save as drill/ }).click();
    const saved = page.getByTestId('import-saved');
    await saved.waitFor(SLOW);
    const href = await saved.getByRole('link').getAttribute('href');
    expect(href).toMatch(/^\/saved-drills\/\d+$/);

    // Make a rule card: the editor opens on it and its preview generates a variation.
    await page.getByRole('button', { name: /Make a rule card/ }).click();
    await page.waitForURL((url) => /^\/rule-cards\/\d+$/.test(url.pathname), SLOW);
    expect(await page.getByLabel('Card title').inputValue()).toBe('Imported rock groove (card)');
    const preview = await notePlaces(page, 'tensile-card-preview');
    expect(preview.length).toBeGreaterThan(0);
    const seed = await page.getByTestId('preview-seed').innerText();
    await page
      .locator('tensile-card-preview')
      .getByRole('button', { name: /seed/i })
      .first()
      .click();
    await expect.poll(() => page.getByTestId('preview-seed').innerText(), SLOW).not.toBe(seed);
    expect((await notePlaces(page, 'tensile-card-preview')).length).toBeGreaterThan(0);

    // The saved drill shows exactly the imported notes.
    await page.goto(`${suite.server.url}${href}`);
    await page.getByRole('heading', { level: 1, name: 'Imported rock groove' }).waitFor(SLOW);
    expect(await notePlaces(page, 'tensile-saved-drill-page tensile-drill-score')).toEqual(
      imported,
    );
  });
});
