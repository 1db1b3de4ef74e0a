import type { Readable } from 'node:stream';
import { engravingPool } from './engraving-pool';
import { cachedNotation, keepNotation, notationKey } from './notation-art';
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
 * Engraving happens in worker threads, and `signal` (a cancelled download) stops the work
 * between drills.
 */
export async function renderWorksheetPdf(
  print: WorksheetPrint,
  signal?: AbortSignal,
): Promise<Readable> {
  return layOutPdf(print, await drawArt(print, signal), {}, signal);
}

/** Engraves the drills not in the cache; kept for the next export (see engraving-pool.ts). */
const pool = engravingPool();

/** Each drill's notation, QR code and tension plot. */
export async function drawArt(print: WorksheetPrint, signal?: AbortSignal): Promise<DrillArt[]> {
  const text = textArea(print.paper);
  const wanted = print.drills.map((drill) => {
    const maxAspect = notationRoom(text.width, text.height, drill.aids.tension) / text.width;
    const key = notationKey(drill.drill, drill.aids, maxAspect);
    return { job: { drill: drill.drill, aids: drill.aids, maxAspect }, key };
  });
  const kept = wanted.map(({ key }) => cachedNotation(key));
  const missing = wanted.filter((_, i) => !kept[i]);
  // The drills not kept are engraved side by side in worker threads, the event loop free.
  const fresh = await pool.engrave(
    missing.map(({ job }) => job),
    signal,
  );
  missing.forEach(({ key }, i) => keepNotation(key, fresh[i]!));
  const art: DrillArt[] = [];
  for (const [i, drill] of print.drills.entries()) {
    signal?.throwIfAborted();
    art.push({
      notation: kept[i] ?? fresh[missing.indexOf(wanted[i]!)]!,
      qr: await qrSvg(drill.seedLink),
      tension: drill.aids.tension ? tensionPlotSvg(drill.drill) : null,
    });
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
