import { Router } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { validate } from '../validate';
import { previewFieldsSchema, saveFieldsSchema } from './import-schemas';
import type { ImportsService } from './imports-service';
import { midiUpload } from './midi-upload';

/** `/api/imports` (teachers): MIDI grooves read as drills, previewed or saved. */
export function createImportsRouter(service: ImportsService): Router {
  const router = Router();
  const teacher = requireRole('teacher');
  const upload = midiUpload();

  router.post('/midi', teacher, upload, validate({ body: previewFieldsSchema }), (req, res) => {
    const { track } = req.body as z.output<typeof previewFieldsSchema>;
    res.json({ groove: service.preview(req.file!.buffer, track) });
  });

  router.post(
    '/midi/save',
    teacher,
    upload,
    validate({ body: saveFieldsSchema }),
    async (req, res) => {
      const fields = req.body as z.output<typeof saveFieldsSchema>;
      res.status(201).json({ drill: await service.save(req.user!.id, req.file!.buffer, fields) });
    },
  );

  return router;
}
