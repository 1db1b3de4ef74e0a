import { Router, type Response } from 'express';
import { z } from 'zod';
import { requireSignIn } from '../auth/require-role';
import { validate } from '../validate';
import { drillSourceSchema, type DrillSource } from './drill-source';
import type { ExportFile, ExportsService } from './exports-service';

const exportBody = z.strictObject(
  { source: drillSourceSchema },
  { error: 'Send { "source": … } naming the drill to export.' },
);

/**
 * `/api/exports`: a drill as a Standard MIDI File or a MusicXML score, sent as a download. Every
 * signed-in role may export what it may open (students: presets; teachers: their saved drills).
 */
export function createExportsRouter(service: ExportsService): Router {
  const router = Router();

  router.post('/midi', requireSignIn, validate({ body: exportBody }), async (req, res) => {
    send(res, await service.midi(req.user!, sourceOf(req.body)));
  });

  router.post('/musicxml', requireSignIn, validate({ body: exportBody }), async (req, res) => {
    send(res, await service.musicXml(req.user!, sourceOf(req.body)));
  });

  return router;
}

function sourceOf(body: unknown): DrillSource {
  return (body as z.output<typeof exportBody>).source as DrillSource;
}

function send(res: Response, file: ExportFile): void {
  res.attachment(file.filename);
  res.type(file.type);
  res.send(file.body);
}
