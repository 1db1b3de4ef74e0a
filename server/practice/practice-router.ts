import { Router } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import { logPracticeBody, practiceListQuery, progressQuery } from './practice-schemas';
import type { PracticeService } from './practice-service';

/**
 * `/api/practice`:
 * - `POST /logs` (student) `{ assignmentId?, minutes, tempo, rating, note? }` → 201 `{ log }`;
 * - `GET /logs` (student: own; teacher: `?studentId=` of their studio) → paged logs, newest
 *   first, `?assignmentId=` to narrow;
 * - `GET /logs/:id` → `{ log }`; another student's log answers 404;
 * - `GET /progress` (`?studentId=`, `?assignmentId=`) → `{ progress: { tempo, minutesPerWeek } }`.
 */
export function createPracticeRouter(service: PracticeService): Router {
  const router = Router();
  const readers = requireRole('student', 'teacher');

  router.post(
    '/logs',
    requireRole('student'),
    validate({ body: logPracticeBody }),
    async (req, res) => {
      const body = req.body as z.output<typeof logPracticeBody>;
      res.status(201).json({ log: await service.log(req.user!, body) });
    },
  );

  router.get('/logs', readers, validate({ query: practiceListQuery }), async (req, res) => {
    const { page, pageSize, studentId, assignmentId } = req.query as unknown as z.output<
      typeof practiceListQuery
    >;
    res.json(await service.list(req.user!, { page, pageSize, studentId, assignmentId }));
  });

  router.get('/logs/:id', readers, validate({ params: idParams }), async (req, res) => {
    res.json({ log: await service.get(req.user!, idOf(req.params)) });
  });

  router.get('/progress', readers, validate({ query: progressQuery }), async (req, res) => {
    const query = req.query as unknown as z.output<typeof progressQuery>;
    res.json({ progress: await service.progress(req.user!, query) });
  });

  return router;
}
