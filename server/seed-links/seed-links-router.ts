import { Router } from 'express';
import { z } from 'zod';
import { allowAnyone } from '../auth/require-role';
import { validate } from '../validate';
import type { SeedLinksService } from './seed-links-service';

const codeParams = z.object({
  code: z
    .string()
    .regex(/^[A-Za-z0-9_-]{16,64}$/, 'A share code is 16 to 64 letters, digits, - or _.'),
});

/**
 * `GET /api/seed-links/:code` (anyone, signed in or not) → `{ drill: { title, snapshot, card,
 * teacherName } }`; 404 for an unknown code, 410 `withdrawn` once the teacher revoked it.
 */
export function createSeedLinksRouter(service: SeedLinksService): Router {
  const router = Router();
  router.get('/:code', allowAnyone, validate({ params: codeParams }), async (req, res) => {
    res.json({ drill: await service.open((req.params as { code: string }).code) });
  });
  return router;
}
