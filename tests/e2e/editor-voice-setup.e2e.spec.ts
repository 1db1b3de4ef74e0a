/**
 * The editor's "Grouping, roles and layers" section in a real browser: a teacher sets an uneven
 * beat grouping, gives the snare the time role and adds a second time-keeping layer, and after
 * each change the live preview's notation follows.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

/** A written note of the preview: its beat, grid slot and the voices it strikes. */
interface ShownNote {
  readonly bar: number;
  readonly beat: number;
  readonly slot: number;
  readonly voices: readonly string[];
}

/** The preview's score as drawn: its notes and the grouping written over the time signature. */
function preview(page: Page): Promise<{ notes: ShownNote[]; grouping: string | null }> {
  return page.evaluate(() => {
    const svg = document.querySelector('tensile-card-preview svg.tensile-notation');
    const notes = [...(svg?.querySelectorAll('.tensile-note') ?? [])].map((note) => ({
      bar: Number(note.closest('.tensile-bar')?.getAttribute('data-bar')),
      beat: Number(note.getAttribute('data-beat')),
      slot: Number(note.getAttribute('data-slot')),
      voices: (note.getAttribute('data-instruments') ?? '').split(' '),
    }));
    const grouping = svg?.querySelector('.tensile-grouping')?.textContent?.trim() ?? null;
    return { notes, grouping };
  });
}

function selectText(page: Page, name: string): Promise<string> {
  return page
    .getByRole('combobox', { name })
    .evaluate((select) => select.textContent?.trim() ?? '');
}

describe('editor journey: grouping, voice roles and time layers', () => {
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

  it('sets a grouping, a role and a second time layer, and the preview follows each', async () => {
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
    await page.goto(`${suite.server.url}/rule-cards/new`);
    // A new card: 4/4 in sixteenths, kick, snare and hi-hat, the hi-hat's ostinato, a backbeat.
    await expect
      .poll(async () => (await preview(page)).notes.length, { timeout: 60_000 })
      .toBeGreaterThan(0);
    expect((await preview(page)).grouping).toBeNull();
    // The default roles are named as the engine gives them (the ostinato's voice keeps time).
    expect(await selectText(page, 'Kick role')).toBe('Default (anchor)');
    expect(await selectText(page, 'Snare role')).toBe('Default (embellishment)');
    expect(await selectText(page, 'Hi-hat role')).toBe('Default (time)');

    // An uneven grouping is written over the time signature.
    const grouping = page.getByLabel('Beat grouping');
    await grouping.fill('3+1');
    await grouping.press('Tab');
    await expect.poll(async () => (await preview(page)).grouping, { timeout: 30_000 }).toBe('3+1');

    // The snare keeps time: it plays its backbeat and nothing else.
    await page.getByRole('combobox', { name: 'Snare role' }).click();
    await page.getByRole('option', { name: 'Time (keeps its pattern)' }).click();
    // Polled: the closing panel's options stay inside the select for its animation.
    await expect.poll(() => selectText(page, 'Snare role')).toBe('Time (keeps its pattern)');
    const offBackbeat = (notes: readonly ShownNote[]) =>
      notes.filter((n) => n.voices.includes('snare') && !(n.slot === 0 && [2, 4].includes(n.beat)));
    await expect
      .poll(async () => offBackbeat((await preview(page)).notes).length, { timeout: 30_000 })
      .toBe(0);
    const snares = (await preview(page)).notes.filter((n) => n.voices.includes('snare'));
    expect(snares.length).toBe(4 * 2);

    // A second time layer: the kick on 2 and 4 in every bar (the first free voice of the card).
    await page.getByRole('button', { name: 'Add a layer' }).click();
    expect(await selectText(page, 'Layer 1 voice')).toBe('Kick');
    expect(await page.getByLabel('Layer 1 beats').inputValue()).toBe('2, 4');
    // The kick now keeps time, and its default role says so.
    expect(await selectText(page, 'Kick role')).toBe('Default (time)');
    const kickOn = (notes: readonly ShownNote[], beat: number) =>
      new Set(
        notes
          .filter((n) => n.voices.includes('kick') && n.beat === beat && n.slot === 0)
          .map((n) => n.bar),
      ).size;
    await expect
      .poll(
        async () => {
          const { notes } = await preview(page);
          return [kickOn(notes, 2), kickOn(notes, 4)];
        },
        { timeout: 30_000 },
      )
      .toEqual([4, 4]);
    // The earlier changes still hold in the new drill.
    const now = await preview(page);
    expect(now.grouping).toBe('3+1');
    expect(offBackbeat(now.notes)).toEqual([]);
    expect(await page.locator('tensile-card-preview .stale-note').count()).toBe(0);
  });
});
