import { pipeline } from 'node:stream/promises';
import { Router, type Response } from 'express';
import type { z } from 'zod';
import type { PublicUser } from '../auth/roles';
import { requireRole } from '../auth/require-role';
import type { WorksheetPrint } from '../pdf/worksheet-print';
import { fileSlug } from '../rule-cards/card-fields';
import { idOf, idParams } from '../rule-cards/rule-cards-router';
import { validate } from '../validate';
import {
  createWorksheetSchema,
  pdfQuerySchema,
  type Paper,
  updateWorksheetSchema,
  worksheetListSchema,
} from './worksheet-schemas';
import type { WorksheetsService } from './worksheets-service';

/**
 * What the PDF route needs: the print of a stored worksheet, and the renderer; and what starts
 * engraving a worksheet's drills in the background whenever it is written or opened, so its
 * export only lays out the pages.
 */
export interface WorksheetPdfRoute {
  readonly prepare?: (user: PublicUser, id: number) => void;
  readonly print: (user: PublicUser, id: number, paper?: Paper) => Promise<WorksheetPrint>;
  readonly render: (
    print: WorksheetPrint,
    signal?: AbortSignal,
  ) => Promise<NodeJS.ReadableStream | Buffer>;
}

/** `/api/worksheets` (teachers only, each on their own); see docs/api-worksheets.md. */
export function createWorksheetsRouter(service: WorksheetsService, pdf: WorksheetPdfRoute): Router {
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
    const worksheet = await service.create(req.user!.id, input);
    res.status(201).json({ worksheet });
    pdf.prepare?.(req.user!, worksheet.id);
  });

  router.get('/:id', teacher, validate({ params: idParams }), async (req, res) => {
    const id = idOf(req.params);
    res.json({ worksheet: await service.get(req.user!.id, id) });
    pdf.prepare?.(req.user!, id);
  });

  router.put(
    '/:id',
    teacher,
    validate({ params: idParams, body: updateWorksheetSchema }),
    async (req, res) => {
      const changes = req.body as z.output<typeof updateWorksheetSchema>;
      const id = idOf(req.params);
      res.json({ worksheet: await service.update(req.user!.id, id, changes) });
      pdf.prepare?.(req.user!, id);
    },
  );

  router.post('/:id/duplicate', teacher, validate({ params: idParams }), async (req, res) => {
    res.status(201).json({ worksheet: await service.duplicate(req.user!.id, idOf(req.params)) });
  });

  router.delete('/:id', teacher, validate({ params: idParams }), async (req, res) => {
    await service.remove(req.user!.id, idOf(req.params));
    res.status(204).end();
  });

  router.get(
    '/:id/pdf',
    teacher,
    validate({ params: idParams, query: pdfQuerySchema }),
    async (req, res) => {
      const { paper } = req.query as z.output<typeof pdfQuerySchema>;
      // A teacher who cancels the download closes the connection: stop engraving then.
      const gone = new AbortController();
      res.on('close', () => {
        if (!res.writableFinished) gone.abort();
      });
      const print = await pdf.print(req.user!, idOf(req.params), paper);
      try {
        const file = await pdf.render(print, gone.signal);
        res.type('application/pdf');
        res.attachment(`${fileSlug(print.title)}.pdf`);
        await send(res, file);
      } catch (error) {
        // Nobody is left to answer once the client has gone; anything else is a real failure.
        if (gone.signal.aborted) return;
        throw error;
      }
    },
  );

  return router;
}

async function send(res: Response, file: NodeJS.ReadableStream | Buffer): Promise<void> {
  if (Buffer.isBuffer(file)) {
    res.send(file);
    return;
  }
  await pipeline(file, res);
}
