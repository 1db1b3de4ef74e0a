import { Router } from 'express';
import { requireRole } from '../auth/require-role';
import type { StudentsService } from './students-service';

/** `GET /api/students` (teacher, admin) → `{ students: [{ id, name, email }] }`, by name. */
export function createStudentsRouter(students: StudentsService): Router {
  const router = Router();
  router.get('/', requireRole('teacher', 'admin'), async (_req, res) => {
    res.json({ students: await students.listStudents() });
  });
  return router;
}
