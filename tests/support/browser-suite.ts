import type { Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { launchChromium, startServer, type RunningServer } from './browser';

/** The real server and one Chromium shared by a browser spec file. */
export interface BrowserSuite {
  readonly server: RunningServer;
  readonly browser: Browser;
}

/**
 * Starts a fresh server (its own temporary database) and Chromium before the file's tests and
 * stops both after them. Call it first in a `describe`, so that the file's own `afterAll` hooks
 * (closing contexts) run before the browser closes.
 */
export function useServerAndBrowser(): BrowserSuite {
  let server: RunningServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    [server, browser] = await Promise.all([startServer(), launchChromium()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  return {
    get server() {
      if (!server)
        throw new Error('The test server is not running yet (use it inside a test or hook).');
      return server;
    },
    get browser() {
      if (!browser) throw new Error('Chromium is not running yet (use it inside a test or hook).');
      return browser;
    },
  };
}
