import type { Knex } from 'knex';
import {
  RateLimiterPostgres,
  RateLimiterRes,
  RateLimiterSQLite,
  type RateLimiterAbstract,
} from 'rate-limiter-flexible';
import { errorFields, type Logger } from '../logger';

/** One limit: this many attempts per window, the window counted from the first attempt. */
export interface LimitRule {
  readonly attempts: number;
  readonly windowSeconds: number;
}

/** The sign-in limits: per client address, and per address and e-mail (the account lock). */
export interface SignInLimits {
  readonly perAddress: LimitRule;
  readonly perAccount: LimitRule;
}

/**
 * 10 failed sign-ins per address and e-mail per 15 minutes, and 100 per address per day whatever
 * the e-mails: common practice for web sign-in. A school's shared address stays well inside the
 * daily figure, since successful sign-ins give their attempt back.
 */
export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = {
  perAccount: { attempts: 10, windowSeconds: 15 * 60 },
  perAddress: { attempts: 100, windowSeconds: 24 * 60 * 60 },
};

/** Where the counters live (see migrations/…_create_sign_in_attempts.ts). */
export const SIGN_IN_ATTEMPTS_TABLE = 'sign_in_attempts';

/** Counters this long past their window are deleted by {@link SignInLimiter.sweep}. */
const SWEEP_AFTER_MS = 60 * 60_000;

/** Whether an attempt may go on to the password check, and if not, how long to wait. */
export type AttemptVerdict =
  { readonly allowed: true } | { readonly allowed: false; readonly retryAfterMs: number };

/**
 * Limits sign-in attempts with rate-limiter-flexible, its counters in the app's own database so
 * that several server processes share them. An attempt is counted before its password is
 * checked, in one atomic upsert, so parallel guesses cannot all pass the check before the first
 * failure is recorded.
 */
export class SignInLimiter {
  private readonly byAddress: RateLimiterAbstract;
  private readonly byAccount: RateLimiterAbstract;

  constructor(
    private readonly db: Knex,
    limits: SignInLimits = DEFAULT_SIGN_IN_LIMITS,
  ) {
    this.byAddress = storeLimiter(db, 'address', limits.perAddress);
    this.byAccount = storeLimiter(db, 'account', limits.perAccount);
  }

  /**
   * Counts one attempt from `address` at `email`. Not allowed once either limit is spent; a
   * refused attempt still counts against the address. Store failures are thrown.
   */
  async begin(address: string, email: string): Promise<AttemptVerdict> {
    for (const [limiter, key] of [
      [this.byAddress, address],
      [this.byAccount, accountKey(address, email)],
    ] as const) {
      try {
        await limiter.consume(key);
      } catch (rejection) {
        if (rejection instanceof RateLimiterRes) {
          return { allowed: false, retryAfterMs: Math.max(rejection.msBeforeNext, 1000) };
        }
        throw rejection;
      }
    }
    return { allowed: true };
  }

  /**
   * After a correct password: the address gets this attempt back (only failures count against
   * it) and the account lock is cleared. The address count is not reset: one valid account must
   * not wipe out the failures it made guessing at others.
   */
  async succeeded(address: string, email: string): Promise<void> {
    await this.byAddress.reward(address, 1);
    await this.byAccount.delete(accountKey(address, email));
  }

  /** Deletes counters whose window ended over an hour ago. */
  async sweep(now: number = Date.now()): Promise<number> {
    return this.db(SIGN_IN_ATTEMPTS_TABLE)
      .where('expire', '<', now - SWEEP_AFTER_MS)
      .delete();
  }

  /** Sweeps every `intervalMs` until the returned function is called; failures are logged. */
  startSweeping(logger: Logger, intervalMs = 10 * 60_000): () => void {
    const timer = setInterval(() => {
      this.sweep().catch((error: unknown) =>
        logger.warn('Sign-in attempt clean-up failed', errorFields(error)),
      );
    }, intervalMs);
    timer.unref();
    return () => clearInterval(timer);
  }
}

/**
 * The address a limit counts: an IPv4 address as is (also when IPv4-mapped), an IPv6 address by
 * its /64 prefix, since one subscriber is usually given a whole /64 and could rotate through it.
 */
export function addressKey(ip: string | undefined): string {
  if (!ip) return 'unknown';
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(ip);
  if (mapped) return mapped[1]!;
  if (!ip.includes(':')) return ip;
  const groups = ipv6Groups(ip.split('%')[0]!);
  if (!groups) return ip;
  return `${groups.slice(0, 4).join(':')}::/64`;
}

/** The eight 16-bit groups of an IPv6 address as short hex, or undefined if it is not one. */
function ipv6Groups(ip: string): string[] | undefined {
  const halves = ip.split('::');
  if (halves.length > 2) return undefined;
  const split = (part: string | undefined) =>
    part ? part.split(':').flatMap(dottedQuadToHex) : [];
  const head = split(halves[0]);
  const tail = split(halves[1]);
  const missing = 8 - head.length - tail.length;
  if (halves.length === 1 ? missing !== 0 : missing < 1) return undefined;
  const groups = [...head, ...Array<string>(halves.length === 1 ? 0 : missing).fill('0'), ...tail];
  if (!groups.every((group) => /^[0-9a-f]{1,4}$/i.test(group))) return undefined;
  return groups.map((group) => parseInt(group, 16).toString(16));
}

/** An embedded IPv4 tail (`::ffff:1.2.3.4`, `64:ff9b::1.2.3.4`) stands for two groups. */
function dottedQuadToHex(group: string): string[] {
  const octets = group.split('.');
  if (octets.length !== 4) return [group];
  const [a, b, c, d] = octets.map(Number) as [number, number, number, number];
  return [((a << 8) | b).toString(16), ((c << 8) | d).toString(16)];
}

function accountKey(address: string, email: string): string {
  return `${address}|${email}`;
}

function storeLimiter(db: Knex, keyPrefix: string, rule: LimitRule): RateLimiterAbstract {
  const options = {
    storeClient: db,
    storeType: 'knex',
    tableName: SIGN_IN_ATTEMPTS_TABLE,
    // The migration creates the table. The library's own clean-up timer is off: on SQLite a
    // failed clean-up would be an unhandled rejection; sweep() does it with a catch instead.
    tableCreated: true,
    clearExpiredByTimeout: false,
    keyPrefix,
    points: rule.attempts,
    duration: rule.windowSeconds,
  };
  return db.client.config.client === 'pg'
    ? new RateLimiterPostgres(options)
    : new RateLimiterSQLite(options);
}
