import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { RequestHandler } from 'express';
import session, { type SessionData } from 'express-session';
import type { Knex } from 'knex';
import type { Config } from './config';
import { HttpError } from './http-error';
import type { Logger } from './logger';
import { errorFields } from './logger';

/** Name of the session cookie. */
export const SESSION_COOKIE = 'tensile.sid';

/** Sessions last a week from their last refresh: a week without a visit signs the user out. */
const SESSION_MAX_AGE_MS = 7 * 24 * 60 * 60 * 1000;

/**
 * A signed-in session's expiry (and cookie) is renewed at most this often. Renewing on every
 * request made every signed-in read wait for a database write.
 */
export const SESSION_REFRESH_MS = 5 * 60_000;

declare module 'express-session' {
  interface SessionData {
    /** When {@link refreshSession} last renewed the session (epoch ms). */
    refreshedAt?: number;
  }
}

/** Why a request failed when the session store did; answered 503 with the error shape. */
const STORE_UNAVAILABLE =
  'The server cannot reach its session store just now. Please try again in a moment.';

/**
 * Wraps the Knex session store so that none of its failures can end the process, and each
 * reaches the request as a 503. connect-session-knex's methods both call back with an error and
 * reject their promise, and `touch` only rejects: an unhandled rejection, which stopped the
 * server when another process held the SQLite write lock. There is no `touch` here at all:
 * express-session then writes nothing for an unchanged session, and {@link refreshSession}
 * renews expiries at most every {@link SESSION_REFRESH_MS}.
 */
export class SafeSessionStore extends session.Store {
  constructor(
    readonly inner: ConnectSessionKnexStore,
    private readonly logger: Logger,
  ) {
    super();
    // A failed start-up check (table missing) would otherwise reject with no one listening.
    inner.ready.catch((error: unknown) => this.failed('ready', error));
  }

  override get(sid: string, callback: (error: unknown, session?: SessionData | null) => void) {
    this.inner.get(sid, ignore).then(
      (data) => callback(null, data),
      (error: unknown) => callback(this.failed('get', error)),
    );
  }

  override set(sid: string, data: SessionData, callback?: (error?: unknown) => void) {
    this.inner.set(sid, data).then(
      () => callback?.(),
      (error: unknown) => callback?.(this.failed('set', error)),
    );
  }

  override destroy(sid: string, callback?: (error?: unknown) => void) {
    this.inner.destroy(sid).then(
      () => callback?.(),
      (error: unknown) => callback?.(this.failed('destroy', error)),
    );
  }

  private failed(operation: string, error: unknown): HttpError {
    this.logger.error('Session store failed', { operation, ...errorFields(error) });
    return new HttpError(503, 'service_unavailable', STORE_UNAVAILABLE);
  }
}

function ignore(): void {}

/**
 * A session store on the app's own database. `knex` is always passed: the store's fallback
 * opens a `sqlite3` database, a driver this project does not install. The `sessions` table
 * comes from the migrations, so the store must not create it.
 */
export function createSessionStore(
  db: Knex,
  logger: Logger,
  cleanupIntervalMs = 60 * 60_000,
): SafeSessionStore {
  const inner = new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: cleanupIntervalMs,
    onDbCleanupError: (error) => logger.warn('Session clean-up failed', errorFields(error)),
  });
  return new SafeSessionStore(inner, logger);
}

/** Stops the store's periodic clean-up so the process can exit. */
export function stopSessionStore(store: SafeSessionStore): void {
  clearTimeout(store.inner.nextDbCleanup);
  store.inner.options.cleanupInterval = 0;
}

/**
 * express-session with an HttpOnly, SameSite=Lax cookie, `Secure` behind an https address. Not
 * rolling and never resaved unchanged: only {@link refreshSession} renews a session's expiry.
 */
export function createSessionMiddleware(
  config: Pick<Config, 'sessionSecret' | 'secureCookies'>,
  store: session.Store,
): RequestHandler {
  return session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store,
    resave: false,
    rolling: false,
    saveUninitialized: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.secureCookies,
      maxAge: SESSION_MAX_AGE_MS,
      path: '/',
    },
  });
}

/**
 * Renews a signed-in session's expiry once it was last saved more than `refreshAfterMs` ago, so
 * a session lasts a week from the last visit while most requests write nothing. The save happens
 * here, before the route, instead of when the response ends: a store failure is then this
 * request's 503, not an error after the answer has gone out. (Sign-in needs nothing of this:
 * Passport saves the new session itself before answering.)
 */
export function refreshSession(refreshAfterMs: number = SESSION_REFRESH_MS): RequestHandler {
  return (req, _res, next) => {
    if (!req.user || !req.session) return next();
    // The loaded session still carries the expiry it was stored with: saved at expires − max age.
    const expires = req.session.cookie.expires?.getTime() ?? 0;
    if (Date.now() - (expires - SESSION_MAX_AGE_MS) < refreshAfterMs) return next();
    // A changed value makes express-session send the cookie again, with the new expiry.
    req.session.refreshedAt = Date.now();
    req.session.touch();
    req.session.save((error: unknown) => next(error));
  };
}

/**
 * With `Secure` cookies, a request that reaches the server as plain http gets no session
 * cookie, and sign-in silently fails to stick. That nearly always means the TLS proxy is not
 * trusted (TRUST_PROXY), so say so once in the log.
 */
export function warnWhenCookiesCannotBeSent(logger: Logger): RequestHandler {
  let warned = false;
  return (req, _res, next) => {
    if (!warned && !req.secure) {
      warned = true;
      logger.warn(
        'PUBLIC_URL is https but a request arrived over plain http, so no session cookie can be ' +
          'set. Serve through the TLS proxy and set TRUST_PROXY to trust it.',
        { forwardedProto: req.get('x-forwarded-proto') ?? null },
      );
    }
    next();
  };
}
