import { Router } from 'express';
import { requireRole } from '../auth/require-role';
import type { UsersRepository } from '../auth/users-repository';

/** `GET /api/users` (admin) → `{ users: [{ id, email, name, role }] }`. */
export function createUsersRouter(users: UsersRepository): Router {
  const router = Router();
  router.get('/', requireRole('admin'), async (_req, res) => {
    res.json({ users: await users.listAll() });
  });
  return router;
}
