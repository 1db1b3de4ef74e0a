import { ConnectSessionKnexStore } from 'connect-session-knex';
import session from 'express-session';
import type { RequestHandler } from 'express';
import type { Knex } from 'knex';
import type { Config } from './config';
import type { Logger } from './logger';
import { errorFields } from './logger';

/** Name of the session cookie. */
export const SESSION_COOKIE = 'tensile.sid';

/** Sessions last a week from the last sign-in or save. */
const SESSION_MAX_AGE_MS = 7 * 24 * 60 * 60 * 1000;

/**
 * A session store on the app's own database. `knex` is always passed: the store's fallback
 * opens a `sqlite3` database, a driver this project does not install. The `sessions` table
 * comes from the migrations, so the store must not create it.
 */
export function createSessionStore(
  db: Knex,
  logger: Logger,
  cleanupIntervalMs = 60 * 60_000,
): ConnectSessionKnexStore {
  return new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: cleanupIntervalMs,
    onDbCleanupError: (error) => logger.warn('Session clean-up failed', errorFields(error)),
  });
}

/** Stops the store's periodic clean-up so the process can exit. */
export function stopSessionStore(store: ConnectSessionKnexStore): void {
  clearTimeout(store.nextDbCleanup);
  store.options.cleanupInterval = 0;
}

/** express-session with an HttpOnly, SameSite=Lax cookie, `Secure` behind an https address. */
export function createSessionMiddleware(
  config: Pick<Config, 'sessionSecret' | 'secureCookies'>,
  store: session.Store,
): RequestHandler {
  return session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store,
    resave: false,
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
