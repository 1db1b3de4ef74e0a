import { pipeline } from 'node:stream/promises';
import { Router, type Response } from 'express';
import type { z } from 'zod';
import { requireRole } from '../auth/require-role';
import { fileSlug } from '../rule-cards/card-fields';
import { validate } from '../validate';
import { drillPdfSchema } from './pdf-schemas';
import type { PdfService } from './pdf-service';

/**
 * A signal that fires when the client goes away before the answer is complete (a cancelled
 * download), so rendering stops instead of finishing a file nobody reads.
 */
export function cancelledWith(res: Response): AbortSignal {
  const controller = new AbortController();
  res.on('close', () => {
    if (!res.writableFinished) controller.abort();
  });
  return controller.signal;
}

/** Stream a PDF as a download named after `title`. */
export async function sendPdf(
  res: Response,
  title: string,
  pdf: NodeJS.ReadableStream,
): Promise<void> {
  res.type('application/pdf');
  res.attachment(`${fileSlug(title)}.pdf`);
  await pipeline(pdf, res);
}

/** `/api/pdf` (teachers and admins): `POST /drill { source, paper?, ladder?, aids? }` → the PDF, streamed. */
export function createPdfRouter(service: PdfService): Router {
  const router = Router();
  router.post(
    '/drill',
    requireRole('teacher', 'admin'),
    validate({ body: drillPdfSchema }),
    async (req, res) => {
      const signal = cancelledWith(res);
      try {
        const { title, pdf } = await service.drillPdf(
          req.user!,
          req.body as z.output<typeof drillPdfSchema>,
          signal,
        );
        await sendPdf(res, title, pdf);
      } catch (error) {
        // A download the teacher cancelled is no error: there is nobody left to answer.
        if (signal.aborted) return;
        throw error;
      }
    },
  );
  return router;
}
