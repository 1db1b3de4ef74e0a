import { Router } from 'express';
import { z } from 'zod';
import { emailSchema, personNameSchema } from '../auth/account-schemas';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import type { StudioService } from './studio-service';

export const inviteStudentBody = z.strictObject({ name: personNameSchema, email: emailSchema });

/**
 * `/api/studio` (teacher, own studio only):
 * - `GET /students` → `{ students: RosterEntry[] }` (current, invited and removed);
 * - `POST /students` `{ name, email }` → 201 `{ student }`, invitation e-mailed (409 when the
 *   address has an account, 502 when the e-mail could not be sent);
 * - `DELETE /students/:id` → 204; 404 for anyone not in the studio.
 */
export function createStudioRouter(studio: StudioService): Router {
  const router = Router();
  const teacher = requireRole('teacher');
  router.get('/students', teacher, async (req, res) => {
    res.json({ students: await studio.roster(req.user!.id) });
  });
  router.post('/students', teacher, validate({ body: inviteStudentBody }), async (req, res) => {
    const body = req.body as z.output<typeof inviteStudentBody>;
    res.status(201).json({ student: await studio.invite(req.user!, body) });
  });
  router.delete('/students/:id', teacher, validate({ params: idParams }), async (req, res) => {
    await studio.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });
  return router;
}
