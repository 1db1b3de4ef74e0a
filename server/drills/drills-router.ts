import { Router } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import type { SeedLinksService } from '../seed-links/seed-links-service';
import { validate } from '../validate';
import { drillListSchema, saveDrillSchema, updateDrillSchema } from './drill-schemas';
import type { DrillsService } from './drills-service';

/** `/api/drills` (teachers and admins, each on their own drills); see docs/api-authoring.md. */
export function createDrillsRouter(service: DrillsService, links: SeedLinksService): Router {
  const router = Router();
  const author = requireRole('teacher', 'admin');

  router.get('/', author, validate({ query: drillListSchema }), async (req, res) => {
    const { direction, ...query } = req.query as unknown as z.output<typeof drillListSchema>;
    const ascending = query.sort === 'title' || query.sort === 'seed';
    res.json(
      await service.list(req.user!.id, {
        ...query,
        direction: direction ?? (ascending ? 'asc' : 'desc'),
      }),
    );
  });

  router.post('/', author, validate({ body: saveDrillSchema }), async (req, res) => {
    const input = req.body as z.output<typeof saveDrillSchema>;
    res.status(201).json({ drill: await service.save(req.user!.id, input) });
  });

  router.get('/:id', author, validate({ params: idParams }), async (req, res) => {
    res.json({ drill: await service.get(req.user!.id, idOf(req.params)) });
  });

  router.put(
    '/:id',
    author,
    validate({ params: idParams, body: updateDrillSchema }),
    async (req, res) => {
      const changes = req.body as z.output<typeof updateDrillSchema>;
      res.json({ drill: await service.update(req.user!.id, idOf(req.params), changes) });
    },
  );

  router.delete('/:id', author, validate({ params: idParams }), async (req, res) => {
    await service.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });

  router.post('/:id/share', author, validate({ params: idParams }), async (req, res) => {
    const { link, created } = await links.share(req.user!.id, idOf(req.params));
    res.status(created ? 201 : 200).json({ link });
  });

  router.delete('/:id/share', author, validate({ params: idParams }), async (req, res) => {
    await links.revoke(req.user!.id, idOf(req.params));
    res.status(204).end();
  });

  return router;
}
