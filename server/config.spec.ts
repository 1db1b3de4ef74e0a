import { mkdtemp, readFile, rm, stat, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';
import { SESSION_SECRET_FILE } from './session-secret';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'tensile-config-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('loadConfig', () => {
  it('uses the documented defaults', () => {
    const config = loadConfig({}, dir);
    expect(config.port).toBe(8080);
    expect(config.dataDir).toBe(path.join(dir, 'data'));
    expect(config.database).toEqual({
      client: 'better-sqlite3',
      filename: path.join(dir, 'data', 'tensile.sqlite'),
    });
    expect(config.publicUrl).toBe('http://localhost:8080');
    expect(config.secureCookies).toBe(false);
    expect(config.trustProxy).toBe(false);
    expect(config.seedDemo).toBe(true);
    expect(config.passwordHashCost).toBe(15);
    expect(config.smtpUrl).toBeUndefined();
  });

  it('returns a frozen object', () => {
    const config = loadConfig({}, dir);
    expect(Object.isFrozen(config)).toBe(true);
    expect(Object.isFrozen(config.database)).toBe(true);
  });

  it('derives PUBLIC_URL from PORT when absent', () => {
    expect(loadConfig({ PORT: '9191', DATA_DIR: dir }).publicUrl).toBe('http://localhost:9191');
  });

  it.each(['abc', '-1', '70000', '80.5'])('fails fast on PORT=%s, naming the variable', (port) => {
    expect(() => loadConfig({ PORT: port, DATA_DIR: dir })).toThrow(ConfigError);
    expect(() => loadConfig({ PORT: port, DATA_DIR: dir })).toThrow(/PORT/);
  });

  it('fails fast on a malformed PUBLIC_URL, SMTP_URL, SEED_DEMO or PASSWORD_HASH_COST', () => {
    expect(() => loadConfig({ PUBLIC_URL: 'not a url', DATA_DIR: dir })).toThrow(/PUBLIC_URL/);
    expect(() => loadConfig({ SMTP_URL: 'http://mail.test', DATA_DIR: dir })).toThrow(/SMTP_URL/);
    expect(() => loadConfig({ SEED_DEMO: 'maybe', DATA_DIR: dir })).toThrow(/SEED_DEMO/);
    expect(() => loadConfig({ PASSWORD_HASH_COST: '9', DATA_DIR: dir })).toThrow(
      /PASSWORD_HASH_COST/,
    );
  });

  it('refuses a low password hash cost in production but allows it in tests', () => {
    expect(loadConfig({ PASSWORD_HASH_COST: '10', DATA_DIR: dir }).passwordHashCost).toBe(10);
    expect(() =>
      loadConfig({ PASSWORD_HASH_COST: '10', NODE_ENV: 'production', DATA_DIR: dir }),
    ).toThrow(/PASSWORD_HASH_COST/);
  });

  it('refuses a short SESSION_SECRET', () => {
    expect(() => loadConfig({ SESSION_SECRET: 'short', DATA_DIR: dir })).toThrow(/SESSION_SECRET/);
  });

  it('switches to PostgreSQL for a postgres:// URL', () => {
    const url = 'postgres://tensile:pw@db.internal.test:5432/tensile';
    expect(loadConfig({ DATABASE_URL: url, DATA_DIR: dir }).database).toEqual({
      client: 'pg',
      connectionString: url,
    });
  });

  it('reads a SQLite path, with or without a sqlite: prefix, and refuses other schemes', () => {
    expect(loadConfig({ DATABASE_URL: 'sqlite:db/x.sqlite', DATA_DIR: dir }, dir).database).toEqual(
      {
        client: 'better-sqlite3',
        filename: path.join(dir, 'db', 'x.sqlite'),
      },
    );
    expect(() => loadConfig({ DATABASE_URL: 'mysql://x.test/db', DATA_DIR: dir })).toThrow(
      /DATABASE_URL/,
    );
  });

  it('marks cookies secure behind an https address but trusts no proxy unless told', () => {
    const config = loadConfig({ PUBLIC_URL: 'https://studio.larkspur.test/', DATA_DIR: dir });
    expect(config.publicUrl).toBe('https://studio.larkspur.test');
    expect(config.secureCookies).toBe(true);
    expect(config.trustProxy).toBe(false);
    expect(loadConfig({ TRUST_PROXY: 'loopback, 10.0.0.5', DATA_DIR: dir }).trustProxy).toBe(
      'loopback, 10.0.0.5',
    );
    expect(loadConfig({ TRUST_PROXY: '2', DATA_DIR: dir }).trustProxy).toBe(2);
    expect(loadConfig({ TRUST_PROXY: 'true', DATA_DIR: dir }).trustProxy).toBe(true);
  });

  it('reads SEED_DEMO=false', () => {
    expect(loadConfig({ SEED_DEMO: 'false', DATA_DIR: dir }).seedDemo).toBe(false);
  });

  it('seeds the demo school by default on a developer machine, never by default in production', () => {
    const dev = loadConfig({ DATA_DIR: dir });
    expect(dev.production).toBe(false);
    expect(dev.seedDemo).toBe(true);
    for (const env of [
      { NODE_ENV: 'production' },
      { PUBLIC_URL: 'https://studio.larkspur.test' },
      { NODE_ENV: 'development', PUBLIC_URL: 'https://studio.larkspur.test' },
    ]) {
      const config = loadConfig({ ...env, DATA_DIR: dir });
      expect(config.production).toBe(true);
      expect(config.seedDemo).toBe(false);
      // Only an explicit SEED_DEMO=true (a public demo on purpose) seeds in production.
      expect(loadConfig({ ...env, SEED_DEMO: 'true', DATA_DIR: dir }).seedDemo).toBe(true);
    }
  });
});

describe('session secret', () => {
  it('is generated on first start, stored privately, and reused afterwards', async () => {
    const first = loadConfig({ DATA_DIR: dir }).sessionSecret;
    const file = path.join(dir, SESSION_SECRET_FILE);
    expect(first.length).toBeGreaterThanOrEqual(32);
    expect((await readFile(file, 'utf8')).trim()).toBe(first);
    expect((await stat(file)).mode & 0o077).toBe(0);
    expect(loadConfig({ DATA_DIR: dir }).sessionSecret).toBe(first);
  });

  it('differs between installations', async () => {
    const other = await mkdtemp(path.join(os.tmpdir(), 'tensile-config-'));
    try {
      expect(loadConfig({ DATA_DIR: dir }).sessionSecret).not.toBe(
        loadConfig({ DATA_DIR: other }).sessionSecret,
      );
    } finally {
      await rm(other, { recursive: true, force: true });
    }
  });

  it('comes from SESSION_SECRET when set, without writing a file', async () => {
    const secret = 'x'.repeat(40);
    expect(loadConfig({ SESSION_SECRET: secret, DATA_DIR: dir }).sessionSecret).toBe(secret);
    await expect(stat(path.join(dir, SESSION_SECRET_FILE))).rejects.toThrow(/ENOENT/);
  });

  it('refuses a truncated secret file instead of using it', async () => {
    await writeFile(path.join(dir, SESSION_SECRET_FILE), 'tiny\n');
    expect(() => loadConfig({ DATA_DIR: dir })).toThrow(/shorter than 32/);
  });
});
