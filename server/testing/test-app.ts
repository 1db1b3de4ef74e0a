import { mkdtemp, rm } from 'node:fs/promises';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import type { Knex } from 'knex';
import request from 'supertest';
import { createApp, type AppDeps } from '../app';
import { PasswordHasher } from '../auth/passwords';
import type { Role } from '../auth/roles';
import { SignInLimiter, type SignInLimits } from '../auth/sign-in-limiter';
import { loadConfig, type Config } from '../config';
import { createDb, migrateLatest } from '../db';
import { createScratchDatabase, postgresForTests } from './postgres-scratch';
import { DEMO_ACCOUNTS, type DemoAccount } from '../demo/seed-demo';
import { seedDemo } from '../demo/seed-demo';
import { createLogger, type Logger } from '../logger';
import { sharedPrintEngraver, type PrintEngraver } from '../pdf/print-engraver';
import { syncBuiltInPresets } from '../presets/sync-built-ins';
import { createSessionStore, stopSessionStore } from '../session';

/** A running app on a fresh temporary database, for supertest. */
export interface TestApp {
  readonly app: Express;
  readonly db: Knex;
  readonly config: Config;
  readonly dataDir: string;
  /** Lines the app logged, for checks that nothing secret was written. */
  readonly logLines: string[];
  /** A cookie-keeping client, signed out. */
  agent(): request.Agent;
  /** A cookie-keeping client signed in as the given demo account (or the first of a role). */
  signIn(who: Role | string): Promise<request.Agent>;
  /**
   * Serves the app on a loopback port (once) and returns its base URL, for tests that send many
   * requests at once: supertest would otherwise start a server per request.
   */
  listen(): Promise<string>;
  /** Closes the database and deletes the temporary data directory. */
  close(): Promise<void>;
}

export interface TestAppOptions {
  /** Extra environment (e.g. `{ PUBLIC_URL: 'https://…' }`). */
  readonly env?: Record<string, string>;
  /** Add the demo accounts (default true). */
  readonly seed?: boolean;
  /** Overrides for {@link createApp}'s dependencies. */
  readonly deps?: Partial<Omit<AppDeps, 'config' | 'db' | 'signInLimiter'>>;
  /** Sign-in limits other than the defaults (counted in the test database). */
  readonly signInLimits?: SignInLimits;
}

/**
 * Engraves for exports only: specs of background engraving inject their own engraver, the
 * others would otherwise start worker threads engraving behind every worksheet they create.
 */
const exportOnlyEngraver: PrintEngraver = {
  get cache() {
    return sharedPrintEngraver().cache;
  },
  prepare: async () => undefined,
  drawings: (jobs, signal) => sharedPrintEngraver().drawings(jobs, signal),
};

/** scrypt's lowest allowed cost (N = 2^10) keeps tests fast; production uses 15 or more. */
export const TEST_HASH_COST = '10';

/**
 * Creates a temp data dir, opens a SQLite database in it, migrates, copies in the built-in
 * presets, seeds the demo accounts with a low hash cost and builds the app. Call `close()` in `afterAll`/`afterEach`.
 */
export async function createTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  const dataDir = await mkdtemp(path.join(os.tmpdir(), 'tensile-test-'));
  const postgres = postgresForTests();
  const scratch =
    postgres && !options.env?.['DATABASE_URL'] ? await createScratchDatabase(postgres) : undefined;
  const config = loadConfig({
    DATA_DIR: dataDir,
    PASSWORD_HASH_COST: TEST_HASH_COST,
    ...(scratch ? { DATABASE_URL: scratch.url } : {}),
    ...options.env,
  });
  const db = createDb(config);
  await migrateLatest(db);
  await syncBuiltInPresets(db);
  if (options.seed ?? true) await seedDemo(db, new PasswordHasher(config.passwordHashCost));
  const logLines: string[] = [];
  const logger: Logger = createLogger('debug', (line) => logLines.push(line));
  const sessionStore = createSessionStore(db, logger, 0);
  const app = createApp({
    config,
    db,
    logger,
    sessionStore,
    browserDist: path.join(dataDir, 'no-dist'),
    signInLimiter: new SignInLimiter(db, options.signInLimits),
    printEngraver: exportOnlyEngraver,
    ...options.deps,
  });

  const agent = () => request.agent(app);
  let server: Server | undefined;
  return {
    app,
    db,
    config,
    dataDir,
    logLines,
    agent,
    async signIn(who) {
      const account = findAccount(who);
      const client = agent();
      const response = await client
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: account.password });
      if (response.status !== 200) {
        throw new Error(`Test sign-in as ${account.email} failed with ${response.status}`);
      }
      return client;
    },
    async listen() {
      server ??= await new Promise<Server>((resolve) => {
        const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
      });
      return `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    },
    async close() {
      if (server) {
        server.closeAllConnections();
        await new Promise((resolve) => server!.close(resolve));
      }
      stopSessionStore(sessionStore);
      await db.destroy();
      await scratch?.drop();
      await rm(dataDir, { recursive: true, force: true });
    },
  };
}

/**
 * SQLite statement that makes every stored session look saved an hour ago (its expiry a week
 * from then), so the next signed-in request is due a refresh, i.e. a write.
 */
export const AGE_SESSIONS =
  "update sessions set sess = json_set(sess, '$.cookie.expires', " +
  "strftime('%Y-%m-%dT%H:%M:%fZ', 'now', '-1 hour', '+7 days'))";

/** The demo account with this e-mail, or the first demo account holding this role. */
export function findAccount(who: Role | string): DemoAccount {
  const account =
    DEMO_ACCOUNTS.find((a) => a.email === who) ?? DEMO_ACCOUNTS.find((a) => a.role === who);
  if (!account) throw new Error(`No demo account for ${who}`);
  return account;
}
