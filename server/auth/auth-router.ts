import { Router, type Request, type Response } from 'express';
import type passport from 'passport';
import { HttpError } from '../http-error';
import { validate } from '../validate';
import type { SignInBody } from './auth-schemas';
import { signInBody } from './auth-schemas';
import { LOCAL_STRATEGY } from './passport-setup';
import { allowAnyone, requireSignIn } from './require-role';
import type { PublicUser } from './roles';
import { addressKey, type SignInLimiter } from './sign-in-limiter';

/** Dependencies of {@link createAuthRouter}. */
export interface AuthRouterDeps {
  readonly passport: passport.Authenticator;
  readonly limiter: SignInLimiter;
  /** The session cookie's name, cleared on sign-out. */
  readonly cookieName: string;
}

const WRONG_CREDENTIALS = 'Email or password is not correct.';

/**
 * `/api/auth`:
 * - `POST /sign-in` (anyone) → `{ user }`, or 401 with one message for any wrong credentials;
 * - `POST /sign-out` (anyone; ends the session if there is one) → 204;
 * - `GET /me` (signed in, any role) → `{ user }`.
 */
export function createAuthRouter(deps: AuthRouterDeps): Router {
  const router = Router();

  router.post('/sign-in', allowAnyone, validate({ body: signInBody }), async (req, res) => {
    const body = req.body as SignInBody;
    // req.ip honours X-Forwarded-For only from the proxies TRUST_PROXY names.
    const address = addressKey(req.ip);
    // Counted before the password is checked, so parallel guesses cannot outrun the count.
    const verdict = await deps.limiter.begin(address, body.email);
    if (!verdict.allowed) {
      res.setHeader('Retry-After', String(Math.ceil(verdict.retryAfterMs / 1000)));
      throw tooManyAttempts(verdict.retryAfterMs);
    }
    const user = await authenticate(deps.passport, req, res);
    if (!user) throw new HttpError(401, 'invalid_credentials', WRONG_CREDENTIALS);
    await deps.limiter.succeeded(address, body.email);
    // req.login regenerates the session (Passport 0.7), so a pre-sign-in id is never reused,
    // and saves it before we answer, so a store failure is this request's 503.
    await new Promise<void>((resolve, reject) =>
      req.login(user, (error: unknown) => (error ? reject(error) : resolve())),
    );
    res.json({ user: publicUser(user) });
  });

  router.post('/sign-out', allowAnyone, async (req, res) => {
    if (req.session) {
      await new Promise<void>((resolve, reject) =>
        req.session.destroy((error: unknown) => (error ? reject(error) : resolve())),
      );
    }
    res.clearCookie(deps.cookieName, { path: '/' });
    res.status(204).end();
  });

  router.get('/me', requireSignIn, (req, res) => {
    res.json({ user: publicUser(req.user!) });
  });

  return router;
}

function authenticate(
  instance: passport.Authenticator,
  req: Request,
  res: Response,
): Promise<PublicUser | undefined> {
  return new Promise((resolve, reject) => {
    const handler = instance.authenticate(
      LOCAL_STRATEGY,
      { session: false },
      (error: unknown, user: PublicUser | false | undefined) => {
        if (error) reject(error);
        else resolve(user || undefined);
      },
    ) as (req: Request, res: Response, next: (error?: unknown) => void) => void;
    handler(req, res, reject);
  });
}

/** 429 saying how long to wait, in minutes up to an hour and in hours beyond. */
function tooManyAttempts(waitMs: number): HttpError {
  const minutes = Math.ceil(waitMs / 60_000);
  const hours = Math.ceil(minutes / 60);
  const wait = minutes < 60 ? plural(minutes, 'minute') : plural(hours, 'hour');
  return new HttpError(
    429,
    'too_many_attempts',
    `Too many sign-in attempts. Try again in ${wait}.`,
  );
}

function plural(count: number, unit: string): string {
  return `${count} ${unit}${count === 1 ? '' : 's'}`;
}

function publicUser(user: PublicUser): PublicUser {
  return { id: user.id, email: user.email, name: user.name, role: user.role };
}
