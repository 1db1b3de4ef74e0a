import type { Readable } from 'node:stream';
import type { EngravingJob } from './engraving-pool';
import { drawPrintDrawing, type FontTable, type PdfKitDocument } from './draw-print';
import { preparedPdfmake, TEXT_FONT } from './pdf-fonts';
import type { PrintDrawing } from './print-drawing';
import { sharedPrintEngraver, type PrintEngraver } from './print-engraver';
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
 * Drawings come from the engraver's cache (engraved in the background as the worksheet was
 * composed) or are engraved now in worker threads; `signal` (a cancelled download) stops the
 * work between drills.
 */
export async function renderWorksheetPdf(
  print: WorksheetPrint,
  signal?: AbortSignal,
  engraver: PrintEngraver = sharedPrintEngraver(),
): Promise<Readable> {
  return layOutPdf(print, await drawArt(print, signal, engraver), {}, signal);
}

/** What the engraver is asked for to print these drills on this paper. */
export function engravingJobs(print: Pick<WorksheetPrint, 'paper' | 'drills'>): EngravingJob[] {
  const text = textArea(print.paper);
  return print.drills.map((drill) => ({
    drill: drill.drill,
    aids: drill.aids,
    maxAspect: notationRoom(text.width, text.height, drill.aids.tension) / text.width,
  }));
}

/** Each drill's notation, QR code and tension plot. */
export async function drawArt(
  print: WorksheetPrint,
  signal?: AbortSignal,
  engraver: PrintEngraver = sharedPrintEngraver(),
): Promise<DrillArt[]> {
  const notation = await engraver.drawings(engravingJobs(print), signal);
  const art: DrillArt[] = [];
  for (const [i, drill] of print.drills.entries()) {
    signal?.throwIfAborted();
    art.push({
      notation: notation[i]!,
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
