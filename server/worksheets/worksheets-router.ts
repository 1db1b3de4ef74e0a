import { Router } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import {
  createWorksheetSchema,
  updateWorksheetSchema,
  worksheetListSchema,
} from './worksheet-schemas';
import type { WorksheetsService } from './worksheets-service';

/** `/api/worksheets` (teachers only, each on their own); see docs/api-worksheets.md. */
export function createWorksheetsRouter(service: WorksheetsService): Router {
  const router = Router();
  const teacher = requireRole('teacher');

  router.get('/', teacher, validate({ query: worksheetListSchema }), async (req, res) => {
    const { direction, ...query } = req.query as unknown as z.output<typeof worksheetListSchema>;
    const ascending = query.sort === 'title';
    res.json(
      await service.list(req.user!.id, {
        ...query,
        direction: direction ?? (ascending ? 'asc' : 'desc'),
      }),
    );
  });

  router.post('/', teacher, validate({ body: createWorksheetSchema }), async (req, res) => {
    const input = req.body as z.output<typeof createWorksheetSchema>;
    res.status(201).json({ worksheet: await service.create(req.user!.id, input) });
  });

  router.get('/:id', teacher, validate({ params: idParams }), async (req, res) => {
    res.json({ worksheet: await service.get(req.user!.id, idOf(req.params)) });
  });

  router.put(
    '/:id',
    teacher,
    validate({ params: idParams, body: updateWorksheetSchema }),
    async (req, res) => {
      const changes = req.body as z.output<typeof updateWorksheetSchema>;
      res.json({ worksheet: await service.update(req.user!.id, idOf(req.params), changes) });
    },
  );

  router.post('/:id/duplicate', teacher, validate({ params: idParams }), async (req, res) => {
    res.status(201).json({ worksheet: await service.duplicate(req.user!.id, idOf(req.params)) });
  });

  router.delete('/:id', teacher, validate({ params: idParams }), async (req, res) => {
    await service.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });

  return router;
}
