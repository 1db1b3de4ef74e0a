/**
 * Sample accuracy of playback: drills rendered offline at 44.1 kHz in Chromium by the live
 * scheduler, every onset found in the buffer and compared with its ideal time, computed here
 * from the drill's positions with exact fractions. Tolerance: 2 samples (45 µs), far below the
 * ~6 ms just-noticeable displacement in an isochronous sequence (A. Friberg & J. Sundberg,
 * "Time discrimination in a monotonic, isochronous sequence", J. Acoust. Soc. Am. 98(5), 1995).
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bundleForBrowser, launchChromium } from '../support/browser';
import {
  idealOnsets,
  renderScenario,
  TIMING_SCENARIOS as SCENARIOS,
  worstError,
} from './playback-timing.support';

describe('playback timing in Chromium (offline render, 44.1 kHz)', () => {
  let browser: Browser;
  let page: Page;
  const worst: { name: string; error: number }[] = [];

  beforeAll(async () => {
    const code = await bundleForBrowser('src/app/drills/playback/offline-render.ts');
    browser = await launchChromium();
    page = await browser.newPage();
    await page.setContent('<!doctype html><title>playback timing</title>');
    await page.addScriptTag({ content: code });
  });

  afterAll(async () => {
    const overall = Math.max(0, ...worst.map((w) => w.error));
    console.log(`Playback timing: worst onset error ${overall.toFixed(3)} samples`);
    for (const w of worst) console.log(`  ${w.name}: ${w.error.toFixed(3)} samples`);
    await browser?.close();
  });

  it.each(SCENARIOS.map((s) => [s.name, s] as const))(
    '%s: every onset within 2 samples',
    async (_name, s) => {
      const result = await renderScenario(page, s);
      const ideal = idealOnsets(s, result);
      expect(ideal.length).toBeGreaterThan(20);
      expect(result.onsets, 'one detected onset per distinct instant').toHaveLength(ideal.length);
      const change = result.segments[1];
      if (s.tempoChange !== undefined && change !== undefined) {
        // The bar position is kept: the new tempo starts where the old one had got to.
        const beat = change.beatNum / change.beatDen;
        expect(change.originTime).toBeCloseTo(0.05 + (beat * 60) / s.settings.tempo, 9);
        expect(change.originTime).toBeGreaterThanOrEqual(s.tempoChange.atTime);
        expect(change.tempo).toBe(s.tempoChange.tempo);
      }
      const error = worstError(result.onsets, ideal);
      worst.push({ name: s.name, error });
      expect(error).toBeLessThanOrEqual(2);
    },
  );

  it('the check can fail: onsets 3 samples late are caught', async () => {
    const s = SCENARIOS[1]!;
    const result = await renderScenario(page, s);
    const ideal = idealOnsets(s, result);
    const shifted = result.onsets.map((o) => o + 3);
    expect(worstError(shifted, ideal)).toBeGreaterThan(2);
  });
});
