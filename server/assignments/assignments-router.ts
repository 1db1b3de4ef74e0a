import { Router } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import { assignmentListQuery, createAssignmentBody } from './assignment-schemas';
import type { AssignmentsService } from './assignments-service';

/**
 * `/api/assignments`:
 * - `GET /` (teacher) → `{ items: TeacherAssignment[], total, page, pageSize }`, latest due date
 *   first, `?studentId=` for one student;
 * - `POST /` (teacher) → 201 `{ assignment }` (students get an e-mail notice);
 * - `GET /mine` (student) → `{ assignments: StudentAssignment[] }`, due soonest first;
 * - `GET /:id` (teacher: own; student: assigned to them) → `{ assignment }`;
 * - `DELETE /:id` (teacher, own) → 204.
 * Anything not theirs answers 404.
 */
export function createAssignmentsRouter(service: AssignmentsService): Router {
  const router = Router();
  const teacher = requireRole('teacher');

  router.get('/', teacher, validate({ query: assignmentListQuery }), async (req, res) => {
    const { page, pageSize, studentId } = req.query as unknown as z.output<
      typeof assignmentListQuery
    >;
    res.json(await service.listForTeacher(req.user!.id, { page, pageSize, studentId }));
  });

  router.post('/', teacher, validate({ body: createAssignmentBody }), async (req, res) => {
    const body = req.body as z.output<typeof createAssignmentBody>;
    res.status(201).json({ assignment: await service.create(req.user!, body) });
  });

  router.get('/mine', requireRole('student'), async (req, res) => {
    res.json({ assignments: await service.listForStudent(req.user!.id) });
  });

  router.get(
    '/:id',
    requireRole('teacher', 'student'),
    validate({ params: idParams }),
    async (req, res) => {
      const id = idOf(req.params);
      const assignment =
        req.user!.role === 'teacher'
          ? await service.getForTeacher(req.user!.id, id)
          : await service.getForStudent(req.user!.id, id);
      res.json({ assignment });
    },
  );

  router.delete('/:id', teacher, validate({ params: idParams }), async (req, res) => {
    await service.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });

  return router;
}
