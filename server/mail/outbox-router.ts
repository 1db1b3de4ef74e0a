import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { notFound } from '../http-error';
import { listQuery } from '../paging';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import type { OutboxRepository } from './outbox-repository';

const outboxQuery = listQuery(['createdAt'], 'createdAt').extend({
  to: z.string().trim().max(254, 'An e-mail address has at most 254 characters.').optional(),
});

/**
 * `/api/outbox` (admin): `GET /` → `{ items, total, page, pageSize }` newest first (`?to=`),
 * `GET /:id` → `{ message }` with its text and HTML parts.
 */
export function createOutboxRouter(outbox: OutboxRepository): Router {
  const router = Router();
  const admin = requireRole('admin');
  router.get('/', admin, validate({ query: outboxQuery }), async (req, res) => {
    const query = req.query as unknown as z.output<typeof outboxQuery>;
    res.json(await outbox.list(query));
  });
  router.get('/:id', admin, validate({ params: idParams }), async (req, res) => {
    const message = await outbox.find(idOf(req.params));
    if (!message) throw notFound('No message with this id in the outbox.');
    res.json({ message });
  });
  return router;
}
