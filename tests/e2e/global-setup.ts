import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { BUILT_APP_DIR, CHROMIUM_PATH } from '../support/browser';

/** Fails the run at once, with the fix, when the built app or the browser is missing. */
export default function checkPrerequisites(): void {
  const indexHtml = join(BUILT_APP_DIR, 'index.html');
  if (!existsSync(indexHtml)) {
    throw new Error(
      `Browser journeys need the built app, but ${indexHtml} is missing. ` +
        'Run "npm run build" first (or "npm run test:e2e", which builds).',
    );
  }
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `Browser journeys need Debian Chromium at ${CHROMIUM_PATH}. ` +
        'Run "node scripts/ensure-chromium.mjs".',
    );
  }
}
