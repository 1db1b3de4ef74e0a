import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { AuthService } from './auth-service';

/** The strategy name used by the sign-in route. */
export const LOCAL_STRATEGY = 'local';

/**
 * A Passport instance of its own (not the global singleton), so that several apps, as in
 * tests, never share strategies. The session stores only the account id; each request
 * reloads the account, so a disabled account loses access on its next request.
 */
export function createPassport(auth: AuthService): passport.Authenticator {
  const instance = new passport.Passport();
  instance.use(
    LOCAL_STRATEGY,
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      (email, password, done) => {
        auth.verifyCredentials(email, password).then(
          (user) => done(null, user ?? false),
          (error: unknown) => done(error),
        );
      },
    ),
  );
  instance.serializeUser<number>((user, done) => done(null, user.id));
  instance.deserializeUser<number>((id, done) => {
    auth.findSessionUser(Number(id)).then(
      // `false` makes Passport drop the stale login instead of failing the request.
      (user) => done(null, user ?? false),
      (error: unknown) => done(error),
    );
  });
  return instance;
}
