import { setImmediate as nextTurn } from 'node:timers/promises';
import type { Readable } from 'node:stream';
import { notationArt } from './notation-art';
import { drawPrintDrawing, type FontTable, type PdfKitDocument } from './draw-print';
import { preparedPdfmake, TEXT_FONT } from './pdf-fonts';
import type { PrintDrawing } from './print-drawing';
import { qrSvg } from './qr-code';
import { tensionPlotSvg } from './tension-plot';
import {
  NOTATION_DRAWING,
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
  // Pages stay open until the end, so the notation can be drawn into its places once laid out.
  const stream = await preparedPdfmake()
    .createPdf(worksheetDocument(print, art, options), { bufferPages: true })
    .getStream();
  drawNotation(stream as unknown as LaidOutDocument);
  // pdfkit writes the pages out once the document is ended; the caller reads them as they come.
  stream.end();
  return stream;
}

/** What pdfmake 0.3 leaves on its PDFKit document: the pages it laid out, items placed. */
export interface LaidOutDocument extends PdfKitDocument {
  readonly _pdfMakePages: readonly { readonly items: readonly PageItem[] }[];
  switchToPage(index: number): unknown;
}

interface PageItem {
  readonly type: string;
  readonly item: {
    readonly x: number;
    readonly y: number;
    readonly _width: number;
    readonly _height: number;
    readonly [NOTATION_DRAWING]?: PrintDrawing;
  };
}

/** Draw each drill's notation into the place pdfmake gave it (see worksheet-document.ts). */
export function drawNotation(doc: LaidOutDocument): void {
  const fonts: FontTable = new Map();
  doc._pdfMakePages.forEach((page, index) => {
    for (const { type, item } of page.items) {
      const drawing = type === 'svg' ? item[NOTATION_DRAWING] : undefined;
      if (!drawing) continue;
      doc.switchToPage(index);
      const box = { x: item.x, y: item.y, width: item._width, height: item._height };
      drawPrintDrawing(doc, drawing, box, fonts, TEXT_FONT);
    }
  });
}

/** Read a PDF stream to the end. */
export async function pdfBytes(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}
