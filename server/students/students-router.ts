import { Router } from 'express';
import { requireRole } from '../auth/require-role';
import type { StudentsService } from './students-service';

/**
 * `GET /api/students` (teacher, admin) → `{ students: [{ id, name, email }] }`, by name: a
 * teacher's own studio, every active student for an admin.
 */
export function createStudentsRouter(students: StudentsService): Router {
  const router = Router();
  router.get('/', requireRole('teacher', 'admin'), async (req, res) => {
    res.json({ students: await students.listStudents(req.user!) });
  });
  return router;
}
