/**
 * Browser-test harness: Debian's Chromium driven by playwright-core, the real server on a free
 * port with a fresh database, and a bundler for running pure modules inside a page.
 *
 * Nothing here downloads a browser or reaches past loopback: the journeys must prove that the app
 * works on a machine with no internet at all.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import { chromium, type Browser, type Page } from 'playwright-core';

/** Repository root, so helpers work whatever directory the test runner starts in. */
export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

/** The built Angular app that the server serves. */
export const BUILT_APP_DIR = join(REPO_ROOT, 'dist/tensile/browser');

export const CHROMIUM_PATH = '/usr/bin/chromium';

/**
 * Flags that keep Chromium quiet on a closed network: without the background-networking and
 * component flags it keeps trying to reach update and sync services at every start.
 */
export const CHROMIUM_ARGS: readonly string[] = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];

/** Launches headless Debian Chromium (playwright gives each launch a fresh user-data dir). */
export async function launchChromium(): Promise<Browser> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`${CHROMIUM_PATH} is missing: run "node scripts/ensure-chromium.mjs" first.`);
  }
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [...CHROMIUM_ARGS],
  });
}

export interface RunningServer {
  /** Base URL without a trailing slash, e.g. `http://127.0.0.1:40123`. */
  readonly url: string;
  stop(): Promise<void>;
}

export interface StartServerOptions {
  /** Seed the demo school on first start (default true). */
  readonly seedDemo?: boolean;
  /** Extra environment variables for the server process. */
  readonly env?: Readonly<Record<string, string>>;
  /** How long to wait for `/api/health` (default 60 s: a cold tsx start on 2 busy cores). */
  readonly readyTimeoutMs?: number;
  /** The checkout whose server and build to run (default this one): A/B benches compare two. */
  readonly root?: string;
}

/**
 * Starts the real server (`server/main.ts` under tsx) on a free loopback port with a fresh data
 * directory, and resolves once `/api/health` answers. Needs `dist/` built for the app pages.
 */
export async function startServer(options: StartServerOptions = {}): Promise<RunningServer> {
  const port = await findFreePort();
  const dataDir = mkdtempSync(join(tmpdir(), 'tensile-e2e-'));
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: options.root ?? REPO_ROOT,
    env: serverEnv(port, dataDir, options),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const log = captureOutput(child);
  let stopped: Promise<void> | undefined;
  const stop = (): Promise<void> => {
    stopped ??= terminate(child).finally(() => rmSync(dataDir, { recursive: true, force: true }));
    return stopped;
  };
  try {
    await waitForHealth(url, child, log, options.readyTimeoutMs ?? 60_000);
  } catch (error) {
    await stop();
    throw error;
  }
  return { url, stop };
}

function serverEnv(port: number, dataDir: string, options: StartServerOptions): NodeJS.ProcessEnv {
  // A database or secret from the caller's shell would defeat the fresh temp database.
  const {
    DATABASE_URL: _database,
    SESSION_SECRET: _secret,
    SMTP_URL: _smtp,
    ...inherited
  } = process.env;
  return {
    ...inherited,
    NODE_ENV: 'test',
    PORT: String(port),
    // Same origin as the URL the tests open, in case the server checks request origins.
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    SEED_DEMO: options.seedDemo === false ? 'false' : 'true',
    // Demo passwords are hashed at seeding; a low cost keeps each server start short.
    PASSWORD_HASH_COST: '10',
    LOG_LEVEL: 'warn',
    ...options.env,
  };
}

/** Keeps the last lines of the server's output, to explain a failed start. */
function captureOutput(child: ChildProcess): () => string {
  const chunks: string[] = [];
  const keep = (chunk: Buffer): void => {
    chunks.push(chunk.toString('utf8'));
    if (chunks.length > 200) chunks.shift();
  };
  child.stdout?.on('data', keep);
  child.stderr?.on('data', keep);
  return () => chunks.join('').slice(-4000);
}

async function waitForHealth(
  url: string,
  child: ChildProcess,
  log: () => string,
  timeoutMs: number,
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null) {
      throw new Error(
        `server exited (${child.exitCode ?? child.signalCode}) before it was ready:\n${log()}`,
      );
    }
    try {
      const response = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2_000) });
      if (response.ok) return;
    } catch {
      // Not listening yet.
    }
    await delay(150);
  }
  throw new Error(`server did not answer ${url}/api/health within ${timeoutMs} ms:\n${log()}`);
}

async function terminate(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((done) => child.once('exit', () => done()));
  child.kill('SIGTERM');
  const forced = delay(5_000).then(() => {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  });
  await Promise.race([exited, forced]);
  await exited;
}

function findFreePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer();
    probe.unref();
    probe.once('error', fail);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => (port ? done(port) : fail(new Error('no free port'))));
    });
  });
}

function delay(ms: number): Promise<void> {
  return new Promise((done) => setTimeout(done, ms));
}

/**
 * Signs in through the real sign-in form and waits until the app has left the sign-in page.
 * Fails with the form's own error text when the app refuses the credentials.
 */
export async function signIn(
  page: Page,
  baseUrl: string,
  email: string,
  password: string,
): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await fillSignInForm(page, email, password);
  try {
    await page.waitForURL((target) => !target.pathname.startsWith('/sign-in'), { timeout: 15_000 });
  } catch (error) {
    const alert = await page
      .getByRole('alert')
      .allInnerTexts()
      .catch(() => []);
    const reason = alert.length ? ` The page says: ${alert.join(' / ')}` : '';
    throw new Error(`sign-in as ${email} did not leave the sign-in page.${reason}`, {
      cause: error,
    });
  }
}

/** Fills and submits the sign-in form without waiting for the outcome. */
export async function fillSignInForm(page: Page, email: string, password: string): Promise<void> {
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /^\s*sign in\s*$/i }).click();
}

const LOCAL_HOSTS = new Set(['localhost', '127.0.0.1', '[::1]', '::1']);
const INLINE_SCHEMES = new Set(['data:', 'blob:', 'about:']);

/** True when a URL would leave this machine (anything but loopback, data:, blob:, about:). */
export function isForeignUrl(raw: string): boolean {
  let parsed: URL;
  try {
    parsed = new URL(raw);
  } catch {
    return true;
  }
  if (INLINE_SCHEMES.has(parsed.protocol)) return false;
  return !LOCAL_HOSTS.has(parsed.hostname);
}

/**
 * Starts recording every request (including WebSockets, workers and popups of the page's
 * context) whose host is not loopback. The returned array fills up as the page runs.
 */
export function recordForeignRequests(page: Page): string[] {
  const foreign: string[] = [];
  const note = (url: string): void => {
    if (isForeignUrl(url)) foreign.push(url);
  };
  const context = page.context();
  context.on('request', (request) => note(request.url()));
  const watchSockets = (target: Page): void => {
    target.on('websocket', (socket) => note(socket.url()));
  };
  watchSockets(page);
  context.on('page', watchSockets);
  return foreign;
}

/**
 * Bundles a TypeScript module for the browser as an IIFE whose exports land on
 * `window.__bundle`; pass the result to `page.addScriptTag({ content })`.
 */
export async function bundleForBrowser(entryTs: string): Promise<string> {
  const result = await build({
    entryPoints: [resolve(REPO_ROOT, entryTs)],
    bundle: true,
    format: 'iife',
    globalName: '__bundle',
    platform: 'browser',
    target: 'es2022',
    write: false,
    logLevel: 'silent',
    absWorkingDir: REPO_ROOT,
  });
  const output = result.outputFiles[0];
  if (!output) throw new Error(`esbuild produced no output for ${entryTs}`);
  return output.text;
}
