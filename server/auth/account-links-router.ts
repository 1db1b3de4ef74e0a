import { Router, type Request } from 'express';
import type { z } from 'zod';
import { validate } from '../validate';
import { choosePasswordBody, resetRequestBody, tokenParams } from './account-schemas';
import type { AccountLinksService } from './account-links-service';
import type { MailLimiter } from './mail-limiter';
import { addressKey } from './sign-in-limiter';
import { allowAnyone } from './require-role';
import type { PublicUser } from './roles';

type TokenParams = z.output<typeof tokenParams>;

/**
 * `/api/invitations` (anyone holding the link):
 * - `GET /:token` → `{ invitation: { name, email, role } }`; 404 `invalid_link`, 410
 *   `link_used` / `link_expired`;
 * - `POST /:token` `{ password }` → `{ user }`, signed in.
 */
export function createInvitationsRouter(links: AccountLinksService): Router {
  const router = Router();
  router.get('/:token', allowAnyone, validate({ params: tokenParams }), async (req, res) => {
    const { token } = req.params as unknown as TokenParams;
    res.json({ invitation: await links.describeInvitation(token) });
  });
  router.post(
    '/:token',
    allowAnyone,
    validate({ params: tokenParams, body: choosePasswordBody }),
    async (req, res) => {
      const { token } = req.params as unknown as TokenParams;
      const { password } = req.body as z.output<typeof choosePasswordBody>;
      const user = await links.acceptInvitation(token, password);
      await logIn(req, user);
      res.json({ user });
    },
  );
  return router;
}

/**
 * `/api/password-resets` (anyone):
 * - `POST /` `{ email }` → 202, the same answer whether or not the address has an account; 429
 *   after 3 requests for one address (or 10 from one client) within an hour;
 * - `GET /:token` → `{ reset: { email } }`; 404 / 410 as for invitations;
 * - `POST /:token` `{ password }` → 204; the person then signs in with the new password.
 */
export function createPasswordResetsRouter(
  links: AccountLinksService,
  limiter: MailLimiter,
): Router {
  const router = Router();
  router.post('/', allowAnyone, validate({ body: resetRequestBody }), async (req, res) => {
    const { email } = req.body as z.output<typeof resetRequestBody>;
    // Counted on the address asked for, account or not, so a 429 reveals nothing either.
    limiter.take('password_reset', email, addressKey(req.ip), res);
    await links.requestReset(email);
    res.status(202).json({
      message: 'If an account uses this address, a link to choose a new password is on its way.',
    });
  });
  router.get('/:token', allowAnyone, validate({ params: tokenParams }), async (req, res) => {
    const { token } = req.params as unknown as TokenParams;
    res.json({ reset: await links.describeReset(token) });
  });
  router.post(
    '/:token',
    allowAnyone,
    validate({ params: tokenParams, body: choosePasswordBody }),
    async (req, res) => {
      const { token } = req.params as unknown as TokenParams;
      const { password } = req.body as z.output<typeof choosePasswordBody>;
      await links.resetPassword(token, password);
      res.status(204).end();
    },
  );
  return router;
}

/** Signs in on this request; `req.login` regenerates the session first (Passport 0.7). */
function logIn(req: Request, user: PublicUser): Promise<void> {
  return new Promise((resolve, reject) =>
    req.login(user, (error: unknown) => (error ? reject(error) : resolve())),
  );
}
