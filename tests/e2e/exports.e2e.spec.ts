/**
 * A teacher downloads a drill as MIDI and as MusicXML from the drill page's export menu, and a
 * saved drill from its own page; the files are read back and compared with the drill the engine
 * gives for the same card and seed.
 */
import { readFile } from 'node:fs/promises';
import type { BrowserContext, Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Midi } from '../../shared/formats/tonejs-midi';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { readScore } from '../formats/musicxml-reading';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const CARD = 'quintuplets-hihat-1-3-4';
const SEED = 'export-five';

/** Every hit as "tick:key" at 1680 ticks a quarter, from the drill by exact fractions. */
function expectedTicks(drill: Drill): string[] {
  const keys: Record<string, number> = { kick: 36, snare: 38, hihat: 42 };
  const { beats, unit } = drill.card.meter;
  return drill.bars
    .flatMap((bar, index) =>
      bar.hits.map((hit) => {
        const slots = bar.beats[hit.beat - 1]!;
        const tick =
          (1680 * 4 * ((index * beats + hit.beat - 1) * slots + hit.slot)) / (unit * slots);
        return `${tick}:${keys[hit.voice]}`;
      }),
    )
    .sort();
}

async function exportFrom(page: Page, item: RegExp): Promise<Download> {
  await page.getByRole('button', { name: 'Export', exact: true }).click();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('menuitem', { name: item }).click(),
  ]);
  return download;
}

async function bytesOf(download: Download): Promise<Buffer> {
  const file = await download.path();
  return readFile(file);
}

describe('exports from the browser', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;
  const drill = generateDrill(parseRuleCard(findBuiltInPreset(CARD)!.card), SEED);

  beforeAll(async () => {
    context = await suite.browser.newContext({ acceptDownloads: true });
    page = await context.newPage();
    const teacher = DEMO_TEACHERS[1]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
  });
  afterAll(async () => {
    await context?.close();
  });

  it('downloads the drill page’s drill as a MIDI file with every hit on its tick', async () => {
    await page.goto(`${suite.server.url}/drills/${CARD}?seed=${SEED}`);
    await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
    const download = await exportFrom(page, /MIDI/);
    expect(download.suggestedFilename()).toBe(`quintuplets-hi-hat-on-1-3-and-4-${SEED}.mid`);
    const midi = new Midi(await bytesOf(download));
    expect(midi.header.ppq).toBe(1680);
    const track = midi.tracks[0]!;
    expect(track.channel).toBe(9);
    expect(track.notes.map((n) => `${n.ticks}:${n.midi}`).sort()).toEqual(expectedTicks(drill));
  });

  it('downloads the same drill as a MusicXML score with its quintuplets', async () => {
    const download = await exportFrom(page, /MusicXML/);
    expect(download.suggestedFilename()).toBe(`quintuplets-hi-hat-on-1-3-and-4-${SEED}.musicxml`);
    const xml = (await bytesOf(download)).toString('utf8');
    const score = readScore(xml);
    expect(score.doc.getElementsByTagName('work-title')[0]?.textContent).toBe(
      'Quintuplets, hi-hat on 1, 3 and 4',
    );
    expect(score.notes.filter((n) => !n.rest)).toHaveLength(
      drill.bars.reduce((n, bar) => n + bar.hits.length, 0),
    );
    const actual = [...score.doc.getElementsByTagName('actual-notes')].map((e) => e.textContent);
    expect(actual.length).toBeGreaterThan(0);
    expect(new Set(actual)).toEqual(new Set(['5']));
  });

  it('exports a saved drill from the saved-drill page', async () => {
    const saved = await page.request.post(`${suite.server.url}/api/drills`, {
      data: { title: 'Fives for Wren', card: findBuiltInPreset(CARD)!.card, seed: SEED },
      headers: { Origin: suite.server.url },
    });
    expect(saved.status()).toBe(201);
    const { drill: row } = (await saved.json()) as { drill: { id: number } };
    await page.goto(`${suite.server.url}/saved-drills/${row.id}`);
    await page.getByRole('heading', { level: 1, name: 'Fives for Wren' }).waitFor();
    const download = await exportFrom(page, /MIDI/);
    expect(download.suggestedFilename()).toBe('fives-for-wren.mid');
    const midi = new Midi(await bytesOf(download));
    expect(midi.header.name).toBe('Fives for Wren');
    expect(midi.tracks[0]!.notes.map((n) => `${n.ticks}:${n.midi}`).sort()).toEqual(
      expectedTicks(drill),
    );
  });
});
