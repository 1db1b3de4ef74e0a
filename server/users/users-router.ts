import { Router } from 'express';
import { z } from 'zod';
import { emailSchema, personNameSchema } from '../auth/account-schemas';
import { requireRole } from '../auth/require-role';
import { ROLES } from '../auth/roles';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import type { MailLimiter } from '../auth/mail-limiter';
import { addressKey } from '../auth/sign-in-limiter';
import type { UsersService } from './users-service';

const inviteTeacherBody = z.strictObject({ name: personNameSchema, email: emailSchema });
const updateUserBody = z
  .strictObject({
    role: z.enum(ROLES, { error: 'The role is admin, teacher or student.' }).optional(),
    active: z.boolean({ error: 'Active is true or false.' }).optional(),
  })
  .refine((body) => body.role !== undefined || body.active !== undefined, {
    message: 'Change the role or whether the account is active.',
  });

/**
 * `/api/users` (admin):
 * - `GET /` → `{ users: [{ id, email, name, role, status }] }` (status active, invited or
 *   deactivated);
 * - `POST /` `{ name, email }` → 201 `{ user }`: a teacher, invited by e-mail;
 * - `PATCH /:id` `{ role?, active? }` → `{ user }`; 409 `last_admin`;
 * - `POST /:id/password-reset` → 202, a reset link e-mailed; 429 under the same limits as the
 *   public reset form (the two count together per address).
 */
export function createUsersRouter(users: UsersService, limiter: MailLimiter): Router {
  const router = Router();
  const admin = requireRole('admin');
  router.get('/', admin, async (_req, res) => {
    res.json({ users: await users.list() });
  });
  router.post('/', admin, validate({ body: inviteTeacherBody }), async (req, res) => {
    const body = req.body as z.output<typeof inviteTeacherBody>;
    res.status(201).json({ user: await users.inviteTeacher(req.user!, body) });
  });
  router.patch(
    '/:id',
    admin,
    validate({ params: idParams, body: updateUserBody }),
    async (req, res) => {
      const body = req.body as z.output<typeof updateUserBody>;
      res.json({ user: await users.update(idOf(req.params), body) });
    },
  );
  router.post('/:id/password-reset', admin, validate({ params: idParams }), async (req, res) => {
    await users.sendReset(idOf(req.params), (email) =>
      limiter.take('password_reset', email, addressKey(req.ip), res),
    );
    res.status(202).json({ message: 'A reset link is on its way.' });
  });
  return router;
}
