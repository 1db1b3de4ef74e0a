import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findAccount } from './testing/test-app';

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
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${output}`)), 20_000);
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

let dataDir: string;
beforeAll(async () => {
  dataDir = await mkdtemp(path.join(os.tmpdir(), 'tensile-main-'));
});
afterAll(async () => {
  await rm(dataDir, { recursive: true, force: true });
});

describe('server/main.ts under tsx', () => {
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
  });

  it('fails fast with a readable message on a bad PORT', async () => {
    const child = spawn(process.execPath, SERVE, {
      cwd: ROOT,
      env: { ...process.env, PORT: 'eighty', DATA_DIR: dataDir },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
    expect(code).toBe(1);
    expect(stderr).toMatch(/Tensile could not start: Invalid server configuration\. PORT/);
    expect(stderr).not.toMatch(/\n\s+at /);
  });

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
