import { Router } from 'express';
import { z } from 'zod';
import { emailSchema, personNameSchema } from '../auth/account-schemas';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import type { MailLimiter } from '../auth/mail-limiter';
import { addressKey } from '../auth/sign-in-limiter';
import type { StudioService } from './studio-service';

export const inviteStudentBody = z.strictObject({ name: personNameSchema, email: emailSchema });

/**
 * `/api/studio` (teacher, own studio only):
 * - `GET /students` → `{ students: RosterEntry[] }` (current, invited and removed);
 * - `POST /students` `{ name, email }` → 201 `{ student, outcome: 'invited' }`, invitation
 *   e-mailed; for an address already in the studio, 200 with `outcome` `resent` (a pending
 *   invitation sent again) or `rejoined` (a removed student back, history kept); 409
 *   `email_taken` for anyone else's account, `already_in_studio` for a current student; 429 when
 *   too many invitations went to the address (or from the client) this hour; 502 when the e-mail
 *   could not be sent;
 * - `POST /students/:id/invitation` → `{ student }`: resends a pending invitation (409
 *   `not_pending` once joined or removed; 429 as above);
 * - `DELETE /students/:id` → 204; 404 for anyone not in the studio.
 */
export function createStudioRouter(studio: StudioService, limiter: MailLimiter): Router {
  const router = Router();
  const teacher = requireRole('teacher');
  router.get('/students', teacher, async (req, res) => {
    res.json({ students: await studio.roster(req.user!.id) });
  });
  router.post('/students', teacher, validate({ body: inviteStudentBody }), async (req, res) => {
    const body = req.body as z.output<typeof inviteStudentBody>;
    const { student, outcome } = await studio.invite(req.user!, body, (email) =>
      limiter.take('invitation', email, addressKey(req.ip), res),
    );
    res.status(outcome === 'invited' ? 201 : 200).json({ student, outcome });
  });

  router.post(
    '/students/:id/invitation',
    teacher,
    validate({ params: idParams }),
    async (req, res) => {
      const student = await studio.resend(req.user!, idOf(req.params), (email) =>
        limiter.take('invitation', email, addressKey(req.ip), res),
      );
      res.json({ student });
    },
  );
  router.delete('/students/:id', teacher, validate({ params: idParams }), async (req, res) => {
    await studio.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });
  return router;
}
