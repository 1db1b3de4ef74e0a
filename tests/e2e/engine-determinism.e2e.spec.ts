/**
 * The engine's promise that a card and a seed always give the same drill must hold across
 * runtimes: a seed link opened in the browser has to show exactly the drill the server printed.
 * The engine is bundled for Chromium and its JSON compared byte for byte with Node's.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as engine from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { bundleForBrowser, launchChromium } from '../support/browser';

/** Seeds of different shapes: words, digits, spaces, punctuation and non-ASCII text. */
const SEEDS = ['lesson-12', '1', '90210', 'Larkspur Rhythm School', 'ghost-notes/7', 'Ünïcødé ♩'];

interface EngineBundle {
  parseRuleCard(input: unknown): unknown;
  generateDrill(card: unknown, seed: string): unknown;
}

declare global {
  interface Window {
    __bundle: EngineBundle;
  }
}

/** Drills for every preset and seed, as `JSON.stringify` text, in the order given. */
function generateInNode(cards: readonly unknown[], seeds: readonly string[]): string[] {
  return cards.flatMap((raw) => {
    const card = engine.parseRuleCard(raw);
    return seeds.map((seed) => JSON.stringify(engine.generateDrill(card, seed)));
  });
}

function generateInBrowser(
  page: Page,
  cards: readonly unknown[],
  seeds: readonly string[],
): Promise<string[]> {
  return page.evaluate(
    ({ cards, seeds }) => {
      const { parseRuleCard, generateDrill } = window.__bundle;
      return cards.flatMap((raw) => {
        const card = parseRuleCard(raw);
        return seeds.map((seed) => JSON.stringify(generateDrill(card, seed)));
      });
    },
    { cards, seeds },
  );
}

describe('engine output is identical in Node and Chromium', () => {
  let browser: Browser;
  let page: Page;

  beforeAll(async () => {
    const code = await bundleForBrowser('shared/generator/index.ts');
    browser = await launchChromium();
    page = await browser.newPage();
    // A blank document is enough: the engine is pure and needs no server.
    await page.setContent('<!doctype html><title>engine</title>');
    await page.addScriptTag({ content: code });
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('ships several built-in presets to compare', () => {
    expect(BUILT_IN_PRESETS.length).toBeGreaterThanOrEqual(3);
  });

  it('the bundle exposes the engine entry in the page', async () => {
    const exported = await page.evaluate(() =>
      ['parseRuleCard', 'generateDrill', 'measureTension'].map(
        (name) => typeof (window.__bundle as unknown as Record<string, unknown>)[name],
      ),
    );
    expect(exported).toEqual(['function', 'function', 'function']);
  });

  it.each(BUILT_IN_PRESETS.map((preset) => [preset.id, preset]))(
    'preset %s gives byte-identical drills for every seed',
    async (_id, preset) => {
      const inNode = generateInNode([preset.card], SEEDS);
      const inBrowser = await generateInBrowser(page, [preset.card], SEEDS);
      expect(inBrowser).toHaveLength(SEEDS.length);
      for (const [index, json] of inNode.entries()) {
        expect(inBrowser[index], `seed ${JSON.stringify(SEEDS[index])}`).toBe(json);
      }
    },
  );

  it('seeds change the drill for some preset, so the comparison is not vacuous', () => {
    const distinctPerPreset = BUILT_IN_PRESETS.map(
      (preset) => new Set(generateInNode([preset.card], SEEDS)).size,
    );
    expect(Math.max(...distinctPerPreset)).toBeGreaterThan(1);
  });

  it('records the engine version and the seed in each drill', async () => {
    const [json] = await generateInBrowser(page, [BUILT_IN_PRESETS[0]?.card], ['lesson-12']);
    const drill = JSON.parse(json ?? '{}') as { engine?: unknown; seed?: unknown };
    expect(drill.engine).toBe(engine.ENGINE_VERSION);
    expect(drill.seed).toBe('lesson-12');
  });
});
