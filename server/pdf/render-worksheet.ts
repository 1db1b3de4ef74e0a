import { setImmediate as nextTurn } from 'node:timers/promises';
import type { Readable } from 'node:stream';
import { notationArt } from './notation-art';
import { preparedPdfmake } from './pdf-fonts';
import { qrSvg } from './qr-code';
import { tensionPlotSvg } from './tension-plot';
import {
  notationRoom,
  textArea,
  worksheetDocument,
  type DocumentOptions,
  type DrillArt,
} from './worksheet-document';
import type { WorksheetPrint } from './worksheet-print';

/**
 * Lay out a worksheet and start its PDF. The answer is a readable stream of the file's bytes.
 * Engraving is synchronous and takes a while per drill, so the event loop gets a turn between
 * drills, and `signal` (a cancelled download) stops the work between them.
 */
export async function renderWorksheetPdf(
  print: WorksheetPrint,
  signal?: AbortSignal,
): Promise<Readable> {
  return layOutPdf(print, await drawArt(print, signal), {}, signal);
}

/** Each drill's notation, QR code and tension plot. */
export async function drawArt(print: WorksheetPrint, signal?: AbortSignal): Promise<DrillArt[]> {
  const art: DrillArt[] = [];
  const text = textArea(print.paper);
  for (const drill of print.drills) {
    signal?.throwIfAborted();
    const room = notationRoom(text.width, text.height, drill.aids.tension);
    art.push({
      notation: notationArt(drill.drill, drill.aids, room / text.width),
      qr: await qrSvg(drill.seedLink),
      tension: drill.aids.tension ? tensionPlotSvg(drill.drill) : null,
    });
    await nextTurn();
  }
  return art;
}

/** pdfmake's part: lay out the pages around ready art and start writing them. */
export async function layOutPdf(
  print: WorksheetPrint,
  art: readonly DrillArt[],
  options: DocumentOptions = {},
  signal?: AbortSignal,
): Promise<Readable> {
  signal?.throwIfAborted();
  const stream = await preparedPdfmake()
    .createPdf(worksheetDocument(print, art, options))
    .getStream();
  // pdfkit writes the pages out once the document is ended; the caller reads them as they come.
  stream.end();
  return stream;
}

/** Read a PDF stream to the end. */
export async function pdfBytes(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}
