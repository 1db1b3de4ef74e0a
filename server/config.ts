import path from 'node:path';
import { z } from 'zod';
import { DEFAULT_HASH_COST } from './auth/passwords';
import { MIN_SESSION_SECRET_LENGTH, readOrCreateSessionSecret } from './session-secret';

/** Where and how the server keeps its data. */
export type DatabaseConfig =
  | { readonly client: 'better-sqlite3'; readonly filename: string }
  | { readonly client: 'pg'; readonly connectionString: string };

/** The server's settings, read once at start from the environment. */
export interface Config {
  readonly port: number;
  readonly publicUrl: string;
  /** True when the public address is https: session cookies are then marked `Secure`. */
  readonly secureCookies: boolean;
  readonly dataDir: string;
  readonly database: DatabaseConfig;
  readonly sessionSecret: string;
  readonly smtpUrl: string | undefined;
  /**
   * Passed to Express's `trust proxy` setting: which proxies may report the client's address
   * (X-Forwarded-For) and protocol. Off unless TRUST_PROXY names them.
   */
  readonly trustProxy: boolean | number | string;
  /**
   * Seed the demo school into an empty database. Off in production unless SEED_DEMO=true is set
   * explicitly; then the demo accounts' published passwords are accepted at start too.
   */
  readonly seedDemo: boolean;
  /** scrypt cost for new password hashes: log2 of N (see server/auth/passwords.ts). */
  readonly passwordHashCost: number;
  readonly logLevel: LogLevelName;
  /** NODE_ENV=production, or an https PUBLIC_URL: real people's data, no demo defaults. */
  readonly production: boolean;
}

export type LogLevelName = 'debug' | 'info' | 'warn' | 'error' | 'silent';

/** Raised when an environment variable holds a value the server cannot use. */
export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}

const booleanText = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((value) => value === 'true' || value === '1' || value === 'yes');

const envSchema = z.object({
  NODE_ENV: z.string().optional(),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  DATA_DIR: z.string().min(1).default('data'),
  DATABASE_URL: z.string().min(1).optional(),
  SESSION_SECRET: z.string().min(MIN_SESSION_SECRET_LENGTH).optional(),
  SMTP_URL: z.url({ protocol: /^smtps?$/ }).optional(),
  PUBLIC_URL: z.url({ protocol: /^https?$/ }).optional(),
  TRUST_PROXY: z.string().min(1).optional(),
  SEED_DEMO: booleanText.optional(),
  PASSWORD_HASH_COST: z.coerce.number().int().min(10).max(20).default(DEFAULT_HASH_COST),
  LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info'),
});

type Env = Record<string, string | undefined>;

/**
 * Reads the environment into a frozen {@link Config}, throwing a {@link ConfigError} that names
 * every bad variable. Without `SESSION_SECRET`, a secret is generated into the data directory
 * on first start and reused afterwards.
 */
export function loadConfig(env: Env = process.env, cwd: string = process.cwd()): Config {
  const parsed = envSchema.safeParse(withoutEmptyValues(env));
  if (!parsed.success) {
    const problems = parsed.error.issues.map(
      (issue) => `${issue.path.join('.')}: ${issue.message}`,
    );
    throw new ConfigError(`Invalid server configuration. ${problems.join('; ')}`);
  }
  const values = parsed.data;
  const publicUrl = stripTrailingSlash(values.PUBLIC_URL ?? `http://localhost:${values.PORT}`);
  const secureCookies = publicUrl.startsWith('https:');
  // An https address means a deployment people reach, whatever NODE_ENV says.
  const production = values.NODE_ENV === 'production' || secureCookies;
  if (production && values.PASSWORD_HASH_COST < DEFAULT_HASH_COST) {
    throw new ConfigError(
      `Invalid server configuration. PASSWORD_HASH_COST: must be ${DEFAULT_HASH_COST} or more in production`,
    );
  }
  const dataDir = path.resolve(cwd, values.DATA_DIR);
  return Object.freeze({
    port: values.PORT,
    publicUrl,
    secureCookies,
    dataDir,
    database: parseDatabaseUrl(values.DATABASE_URL, dataDir, cwd),
    sessionSecret: values.SESSION_SECRET ?? readOrCreateSessionSecret(dataDir),
    smtpUrl: values.SMTP_URL,
    trustProxy: parseTrustProxy(values.TRUST_PROXY),
    seedDemo: values.SEED_DEMO ?? !production,
    passwordHashCost: values.PASSWORD_HASH_COST,
    logLevel: values.LOG_LEVEL,
    production,
  });
}

/**
 * `postgres://…` selects PostgreSQL; anything else is a SQLite file (`sqlite:` or `file:`
 * prefixes allowed), relative paths resolved against the working directory.
 */
function parseDatabaseUrl(url: string | undefined, dataDir: string, cwd: string): DatabaseConfig {
  if (url === undefined) {
    return Object.freeze({
      client: 'better-sqlite3',
      filename: path.join(dataDir, 'tensile.sqlite'),
    });
  }
  if (/^postgres(ql)?:\/\//.test(url))
    return Object.freeze({ client: 'pg', connectionString: url });
  if (/^[a-z][a-z0-9+.-]*:\/\//i.test(url) && !/^(sqlite|file):/.test(url)) {
    throw new ConfigError(
      'Invalid server configuration. DATABASE_URL: use postgres://… or a SQLite file path',
    );
  }
  const filename = url.replace(/^(sqlite|file):(\/\/)?/, '');
  if (filename === ':memory:') return Object.freeze({ client: 'better-sqlite3', filename });
  return Object.freeze({ client: 'better-sqlite3', filename: path.resolve(cwd, filename) });
}

/**
 * Trusts no proxy unless told: a trusted X-Forwarded-For names the client the sign-in limiter
 * counts, and any host on a private network (another tenant, a compromised container) could
 * otherwise pick that name. Values follow Express's `trust proxy` setting: addresses, subnets
 * or names such as `loopback`, comma-separated; a hop count; or `true` (every hop: only when
 * nothing can reach the server but the proxy).
 */
function parseTrustProxy(value: string | undefined): boolean | number | string {
  if (value === undefined) return false;
  if (value === 'true') return true;
  if (value === 'false') return false;
  if (/^\d+$/.test(value)) return Number(value);
  return value;
}

function withoutEmptyValues(env: Env): Env {
  return Object.fromEntries(Object.entries(env).filter(([, value]) => value !== ''));
}

function stripTrailingSlash(url: string): string {
  return url.replace(/\/+$/, '');
}
