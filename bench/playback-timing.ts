/**
 * Prints the worst onset error of playback: drills rendered offline at 44.1 kHz in Chromium by
 * the live scheduler, onsets measured in the buffer against their exact ideal times.
 * Run: npx tsx bench/playback-timing.ts
 */
import { bundleForBrowser, launchChromium } from '../tests/support/browser';
import {
  idealOnsets,
  renderScenario,
  TIMING_SCENARIOS,
  worstError,
} from '../tests/e2e/playback-timing.support';

const code = await bundleForBrowser('src/app/drills/playback/offline-render.ts');
const browser = await launchChromium();
try {
  const page = await browser.newPage();
  await page.setContent('<!doctype html><title>playback timing</title>');
  await page.addScriptTag({ content: code });
  let overall = 0;
  for (const scenario of TIMING_SCENARIOS) {
    const result = await renderScenario(page, scenario);
    const ideal = idealOnsets(scenario, result);
    const error = worstError(result.onsets, ideal);
    overall = Math.max(overall, error);
    console.log(`${scenario.name}: ${ideal.length} onsets, worst ${error.toFixed(3)} samples`);
  }
  console.log(`Playback timing: worst onset error ${overall.toFixed(3)} samples (44.1 kHz)`);
} finally {
  await browser.close();
}
