import { spawn, type ChildProcess } from 'node:child_process';
import { setTimeout as sleep } from 'node:timers/promises';
import Database from 'better-sqlite3';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PasswordHasher } from './auth/passwords';
import { createDb, migrateLatest } from './db';
import { seedDemo } from './demo/seed-demo';
import { postgresForTests } from './testing/postgres-scratch';
import { AGE_SESSIONS, findAccount } from './testing/test-app';

// Starts the real entry point the way `npm run serve` does (`node --import tsx`, not Vitest's
// transform), so this checks that knex loads the TypeScript migrations in production, that demo seeding
// happens on the first start only, and that SIGTERM shuts down cleanly.

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const TSX = path.join(ROOT, 'node_modules', '.bin', 'tsx');
/** One process with tsx's loader; the `tsx` CLI's signal relay could SIGKILL a slow shutdown. */
const SERVE = ['--import', 'tsx', 'server/main.ts'];

interface Started {
  child: ChildProcess;
  url: string;
  output: () => string;
  exited: Promise<number | null>;
}

function start(dataDir: string, extraEnv: Record<string, string> = {}): Promise<Started> {
  const child = spawn(process.execPath, SERVE, {
    cwd: ROOT,
    env: {
      ...process.env,
      PORT: '0',
      DATA_DIR: dataDir,
      PASSWORD_HASH_COST: '10',
      LOG_LEVEL: 'info',
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${output}`)), 60_000);
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      const match = /"message":"Tensile is listening","port":(\d+)/.exec(output);
      if (match) {
        clearTimeout(timer);
        resolve({ child, url: `http://127.0.0.1:${match[1]}`, output: () => output, exited });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    void exited.then((code) => {
      clearTimeout(timer);
      reject(new Error(`server exited with ${code}:\n${output}`));
    });
  });
}

/** Runs the entry point until it exits on its own (a refused start). */
async function runToExit(
  dir: string,
  extraEnv: Record<string, string>,
): Promise<{ code: number | null; stderr: string }> {
  const child = spawn(process.execPath, SERVE, {
    cwd: ROOT,
    env: { ...process.env, PORT: '0', DATA_DIR: dir, ...extraEnv },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stderr = '';
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const timer = setTimeout(() => child.kill('SIGKILL'), 20_000);
  const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
  clearTimeout(timer);
  return { code, stderr };
}

/** A production start: the production hash cost, no SEED_DEMO. */
const PRODUCTION = { NODE_ENV: 'production', PASSWORD_HASH_COST: '15' };

let dataDir: string;
beforeAll(async () => {
  dataDir = await mkdtemp(path.join(os.tmpdir(), 'tensile-main-'));
});
afterAll(async () => {
  await rm(dataDir, { recursive: true, force: true });
});

// The process runs on its SQLite default (the write-lock check needs it); the PostgreSQL run of
// the server suite leaves it to the SQLite run.
describe.skipIf(postgresForTests())('server/main.ts under tsx', () => {
  it('migrates, seeds, serves, and stops on SIGTERM; a restart keeps data and secret', async () => {
    const first = await start(dataDir);
    const health = await fetch(`${first.url}/api/health`);
    expect(health.status).toBe(200);
    expect(await health.json()).toMatchObject({ status: 'ok', db: 'ok' });
    const admin = findAccount('admin');
    const signIn = await fetch(`${first.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: admin.email, password: admin.password }),
    });
    expect(signIn.status).toBe(200);
    expect(first.output()).toContain('Demo accounts added');
    const secret = await readFile(path.join(dataDir, 'session-secret'), 'utf8');
    first.child.kill('SIGTERM');
    expect(await first.exited).toBe(0);
    expect(first.output()).toContain('Shutting down');

    const second = await start(dataDir);
    try {
      expect(second.output()).not.toContain('Demo accounts added');
      expect(second.output()).not.toContain('Database migrated');
      expect(await readFile(path.join(dataDir, 'session-secret'), 'utf8')).toBe(secret);
    } finally {
      second.child.kill('SIGTERM');
      expect(await second.exited).toBe(0);
    }
    // Two start-ups, each migrating and seeding the demo studio: slow on a busy 2-core machine.
  }, 150_000);

  it('fails fast with a readable message on a bad PORT', async () => {
    const { code, stderr } = await runToExit(dataDir, { PORT: 'eighty' });
    expect(code).toBe(1);
    expect(stderr).toMatch(/Tensile could not start: Invalid server configuration\. PORT/);
    expect(stderr).not.toMatch(/\n\s+at /);
  });

  it(
    'never seeds the demo school in production unless SEED_DEMO=true says so',
    { timeout: 60_000 },
    async () => {
      const fresh = await mkdtemp(path.join(os.tmpdir(), 'tensile-prod-'));
      try {
        const server = await start(fresh, PRODUCTION);
        try {
          expect(server.output()).not.toContain('Demo accounts added');
          const admin = findAccount('admin');
          const signIn = await fetch(`${server.url}/api/auth/sign-in`, {
            method: 'POST',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ email: admin.email, password: admin.password }),
          });
          expect(signIn.status).toBe(401);
        } finally {
          server.child.kill('SIGTERM');
          expect(await server.exited).toBe(0);
        }
        // Asked for explicitly (a public demo): seeded, and the log says the passwords work.
        const demo = await start(fresh, { ...PRODUCTION, SEED_DEMO: 'true' });
        demo.child.kill('SIGTERM');
        expect(await demo.exited).toBe(0);
        expect(demo.output()).toContain('Demo accounts added');
        expect(demo.output()).toMatch(/SEED_DEMO=true in production/);
      } finally {
        await rm(fresh, { recursive: true, force: true });
      }
    },
  );

  it(
    'refuses to start in production while an account still has a demo password',
    { timeout: 60_000 },
    async () => {
      const seeded = await mkdtemp(path.join(os.tmpdir(), 'tensile-prod-'));
      try {
        const db = createDb({
          database: { client: 'better-sqlite3', filename: path.join(seeded, 'tensile.sqlite') },
        });
        try {
          await migrateLatest(db);
          await seedDemo(db, new PasswordHasher(10));
        } finally {
          await db.destroy();
        }
        for (const env of [PRODUCTION, { PUBLIC_URL: 'https://studio.larkspur.test' }]) {
          const refused = await runToExit(seeded, { ...env, PASSWORD_HASH_COST: '15' });
          expect(refused.code).toBe(1);
          expect(refused.stderr).toMatch(
            /Tensile could not start: .*accounts still accept a published demo password: .*imogen\.vale@larkspur\.test \(admin\)/,
          );
          expect(refused.stderr).toMatch(/SEED_DEMO=true/);
          expect(refused.stderr).not.toMatch(/\n\s+at /);
        }
      } finally {
        await rm(seeded, { recursive: true, force: true });
      }
    },
  );

  it(
    'answers 503 and stays up while another process holds the SQLite write lock',
    { timeout: 60_000 },
    async () => {
      const dir = await mkdtemp(path.join(os.tmpdir(), 'tensile-lock-'));
      const server = await start(dir);
      try {
        const teacher = findAccount('teacher');
        const signIn = await fetch(`${server.url}/api/auth/sign-in`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ email: teacher.email, password: teacher.password }),
        });
        expect(signIn.status).toBe(200);
        const cookie = signIn.headers.getSetCookie()[0]!.split(';')[0]!;
        const presets = () => fetch(`${server.url}/api/presets`, { headers: { cookie } });

        const other = new Database(path.join(dir, 'tensile.sqlite'));
        try {
          // Due a refresh (a write), as a session is after 5 minutes; then lock as `sqlite3` would.
          other.exec(AGE_SESSIONS);
          other.exec('BEGIN IMMEDIATE');
          other.exec('UPDATE users SET name = name WHERE id = -1');
          const started = performance.now();
          const res = await presets();
          console.info(
            `server process under a held write lock: 503 after ${(performance.now() - started).toFixed(0)} ms`,
          );
          expect(res.status).toBe(503);
          expect(((await res.json()) as { error: { code: string } }).error.code).toBe(
            'service_unavailable',
          );
          await sleep(3_000);
          expect(server.child.exitCode).toBeNull();
        } finally {
          if (other.inTransaction) other.exec('ROLLBACK');
          other.close();
        }
        expect((await presets()).status).toBe(200);
        expect(server.child.exitCode).toBeNull();
      } finally {
        server.child.kill('SIGTERM');
        expect(await server.exited).toBe(0);
        await rm(dir, { recursive: true, force: true });
      }
    },
  );

  it('shares its settings with the knex CLI through knexfile.ts', async () => {
    const cliDir = await mkdtemp(path.join(os.tmpdir(), 'tensile-cli-'));
    try {
      const run = (command: string) =>
        new Promise<{ code: number | null; out: string }>((resolve) => {
          const child = spawn(
            TSX,
            ['node_modules/knex/bin/cli.js', '--knexfile', 'knexfile.ts', command],
            {
              cwd: ROOT,
              env: { ...process.env, DATA_DIR: cliDir },
              stdio: ['ignore', 'pipe', 'pipe'],
            },
          );
          let out = '';
          child.stdout.on('data', (chunk: Buffer) => (out += chunk.toString()));
          child.stderr.on('data', (chunk: Buffer) => (out += chunk.toString()));
          child.on('exit', (code) => resolve({ code, out }));
        });
      const latest = await run('migrate:latest');
      expect(latest.code, latest.out).toBe(0);
      const status = await run('migrate:status');
      expect(status.out).toContain('No Pending Migration files Found.');
      expect(status.out).toContain('_create_users.ts');
    } finally {
      await rm(cliDir, { recursive: true, force: true });
    }
  });
});
