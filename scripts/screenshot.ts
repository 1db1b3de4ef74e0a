/**
 * Takes docs/drill-page.png: a teacher's drill page for the quintuplet preset, with the beat
 * cursor on bar 1, beat 3, in headless Chromium against the real server (needs `npm run build`).
 * Run: npx tsx scripts/screenshot.ts
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { REPO_ROOT, launchChromium, signIn, startServer } from '../tests/support/browser';
import { DEMO_TEACHERS } from '../tests/support/demo-accounts';

const PRESET = 'quintuplets-hihat-1-3-5';
const SEED = 'lesson-12';
const OUT = join(REPO_ROOT, 'docs/drill-page.png');

const server = await startServer();
const browser = await launchChromium();
try {
  const context = await browser.newContext({
    viewport: { width: 1440, height: 1700 },
    deviceScaleFactor: 1,
    colorScheme: 'light',
  });
  const page = await context.newPage();
  const teacher = DEMO_TEACHERS[0]!;
  await signIn(page, server.url, teacher.email, teacher.password);
  await page.goto(`${server.url}/drills/${PRESET}?seed=${SEED}`);
  await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
  // Step the reading cursor to bar 1, beat 3 with the keyboard, as a teacher would.
  const score = page.locator('tensile-drill-score');
  await score.focus();
  for (let i = 0; i < 3; i++) await score.press('ArrowRight');
  await page.evaluate(() => document.fonts.ready);
  await page.mouse.move(0, 0);
  // The shell scrolls its content pane; show the page from its heading.
  await page.evaluate(() =>
    document.querySelectorAll('*').forEach((el) => el.scrollTop && el.scrollTo(0, 0)),
  );
  mkdirSync(join(REPO_ROOT, 'docs'), { recursive: true });
  await page.screenshot({ path: OUT, fullPage: true });
  console.log(`Saved ${OUT}`);
  await context.close();
} finally {
  await browser.close();
  await server.stop();
}
