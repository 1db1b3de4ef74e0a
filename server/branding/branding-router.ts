import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { validate } from '../validate';
import type { BrandingService } from './branding-service';
import { logoUpload } from './logo-upload';

export const brandingSchema = z.strictObject({
  studioName: z
    .string({ error: 'The studio name is text.' })
    .trim()
    .max(120, 'A studio name has at most 120 characters.'),
});

/**
 * `/api/branding` (teachers, each their own): `GET` and `PUT { studioName }` → `{ branding }`;
 * `GET /logo` → the image; `PUT /logo` (multipart field `logo`, PNG or JPEG ≤ 1 MB) → `{ branding }`;
 * `DELETE /logo` → 204.
 */
export function createBrandingRouter(service: BrandingService): Router {
  const router = Router();
  const teacher = requireRole('teacher');

  router.get('/', teacher, async (req, res) => {
    res.json({ branding: await service.get(req.user!.id) });
  });

  router.put('/', teacher, validate({ body: brandingSchema }), async (req, res) => {
    const { studioName } = req.body as z.output<typeof brandingSchema>;
    res.json({ branding: await service.setStudioName(req.user!.id, studioName) });
  });

  router.get('/logo', teacher, async (req, res) => {
    const logo = await service.logo(req.user!.id);
    res.type(logo.mime).send(logo.bytes);
  });

  router.put('/logo', teacher, logoUpload(), async (req, res) => {
    res.json({ branding: await service.setLogo(req.user!.id, req.file!.buffer) });
  });

  router.delete('/logo', teacher, async (req, res) => {
    await service.removeLogo(req.user!.id);
    res.status(204).end();
  });

  return router;
}
