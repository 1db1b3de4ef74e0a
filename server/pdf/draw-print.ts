/**
 * Draw a compiled print drawing (print-drawing.ts) onto a PDFKit page, fitted into a box as an
 * SVG of that viewBox is fitted (xMidYMid meet). Text is set in the document's own embedded fonts,
 * glyph by glyph where svg-to-pdfkit places glyph by glyph, so it selects and copies as before.
 */
import { num } from './path-operators';
import type { PrintDrawing, TextPiece } from './print-drawing';

interface GlyphPosition {
  readonly xAdvance: number;
  readonly yAdvance: number;
  readonly xOffset: number;
  readonly yOffset: number;
  readonly advanceWidth: number;
}

/** A PDFKit embedded font (pdfkit/js/font/embedded.js). */
interface PdfFont {
  readonly id: string;
  /** PDFKit's shaped runs by text (its `fontLayoutCache`, on by default in pdfmake). */
  layoutCache?: Record<string, unknown>;
  encode(text: string): [string[], GlyphPosition[]];
  ref(): unknown;
}

/** The PDFKit document calls used here (pdfkit 0.19, and pdfmake 0.3's subclass for fonts). */
export interface PdfKitDocument {
  readonly page: { readonly fonts: Record<string, unknown> };
  /** pdfmake's font table, by family. */
  readonly fonts: Record<string, unknown>;
  getFontFile(family: string, bold: boolean, italic: boolean): string | null;
  font(src: string): PdfKitDocument;
  readonly _font: PdfFont;
  addContent(data: string): PdfKitDocument;
  fillOpacity(opacity: number): PdfKitDocument;
  strokeOpacity(opacity: number): PdfKitDocument;
}

/** Fonts of one document, by family list, weight and style. */
export type FontTable = Map<string, PdfFont>;

export function drawPrintDrawing(
  doc: PdfKitDocument,
  drawing: PrintDrawing,
  box: { readonly x: number; readonly y: number; readonly width: number; readonly height: number },
  fonts: FontTable,
  fallbackFamily: string,
): void {
  const scale = Math.min(box.width / drawing.width, box.height / drawing.height);
  const x = box.x + (box.width - drawing.width * scale) / 2;
  const y = box.y + (box.height - drawing.height * scale) / 2;
  const out = new Content(doc);
  // Six decimals, as PDFKit writes a transform: a scale rounded to four would drift by a point.
  const fine = (n: number) => String(Math.round(n * 1e6) / 1e6 || 0);
  out.raw(`q ${fine(scale)} 0 0 ${fine(scale)} ${fine(x)} ${fine(y)} cm`);
  // Whatever opacity the page's content left, the drawing starts opaque.
  out.opacity(1, 1, true);
  for (const item of drawing.items) {
    if (item.kind === 'ops') out.raw(item.ops);
    else drawText(doc, out, item.pieces, fonts, fallbackFamily);
  }
  out.raw('Q');
  out.flush();
}

/** Content for the current page, written in as few PDFKit calls as the resources allow. */
class Content {
  private parts: string[] = [];
  private fill = 1;
  private stroke = 1;

  constructor(private readonly doc: PdfKitDocument) {}

  raw(ops: string): void {
    this.parts.push(ops);
  }

  /** Set the opacities through PDFKit, which names and registers the graphics state. */
  opacity(fill: number, stroke: number, force = false): void {
    if (!force && fill === this.fill && stroke === this.stroke) return;
    this.flush();
    if (force || fill !== this.fill) this.doc.fillOpacity(fill);
    if (force || stroke !== this.stroke) this.doc.strokeOpacity(stroke);
    this.fill = fill;
    this.stroke = stroke;
  }

  save(): { fill: number; stroke: number } {
    this.raw('q');
    return { fill: this.fill, stroke: this.stroke };
  }

  restore(saved: { fill: number; stroke: number }): void {
    this.raw('Q');
    this.fill = saved.fill;
    this.stroke = saved.stroke;
  }

  flush(): void {
    if (this.parts.length) this.doc.addContent(this.parts.join('\n'));
    this.parts = [];
  }
}

interface Glyph {
  readonly hex: string;
  x: number;
  readonly y: number;
  readonly width: number;
  readonly kern: number;
  readonly continuous: boolean;
}

/** One `<text>`: glyphs placed and anchored chunk by chunk as svg-to-pdfkit does, then set. */
function drawText(
  doc: PdfKitDocument,
  out: Content,
  pieces: readonly TextPiece[],
  fonts: FontTable,
  fallbackFamily: string,
): void {
  let currentX = 0;
  let currentY = 0;
  let chunk: Glyph[] = [];
  let anchor: TextPiece['anchor'] = 'start';
  const anchorChunk = () => {
    if (chunk.length) {
      const first = chunk[0]!;
      const last = chunk[chunk.length - 1]!;
      const shift = { start: 0, middle: 0.5, end: 1 }[anchor] * (last.x + last.width - first.x);
      for (const glyph of chunk) glyph.x -= shift;
    }
    chunk = [];
  };
  const runs = pieces.map((piece) => {
    const font = fontFor(doc, fonts, piece, fallbackFamily);
    const [hex, positions] = font.encode(piece.text);
    const unit = piece.size / 1000;
    const glyphs: Glyph[] = hex.map((code, j) => {
      const pos = positions[j]!;
      if (j === 0 && (piece.x !== undefined || piece.y !== undefined)) {
        anchorChunk();
        if (piece.x !== undefined) currentX = piece.x;
        if (piece.y !== undefined) currentY = piece.y;
      }
      const glyph: Glyph = {
        hex: code,
        x: currentX + pos.xOffset * unit,
        y: currentY + pos.yOffset * unit,
        width: pos.advanceWidth * unit,
        kern: pos.advanceWidth - pos.xAdvance,
        continuous: j > 0,
      };
      chunk.push(glyph);
      if (chunk.length === 1) anchor = piece.anchor;
      currentX += pos.xAdvance * unit;
      currentY += pos.yAdvance * unit;
      return glyph;
    });
    return { piece, font, glyphs };
  });
  anchorChunk();

  const saved = out.save();
  for (const { piece, font, glyphs } of runs) {
    const { fill, stroke } = piece;
    if (!fill && !stroke) continue;
    if (fill) out.raw(`/DeviceRGB cs ${fill.rgb} scn`);
    if (stroke)
      out.raw(`/DeviceRGB CS ${stroke.rgb} SCN ${num(piece.strokeWidth)} w ${piece.dash}`);
    out.opacity(fill?.opacity ?? saved.fill, stroke?.opacity ?? saved.stroke);
    doc.page.fonts[font.id] ??= font.ref();
    out.raw(`BT /${font.id} ${num(piece.size)} Tf ${fill && stroke ? 2 : stroke ? 1 : 0} Tr`);
    out.raw(glyphOperators(glyphs));
    out.raw('ET');
  }
  out.restore(saved);
}

/** svg-to-pdfkit's `docWriteGlyphs`: a text matrix where a run breaks, TJ with kerning within. */
function glyphOperators(glyphs: readonly Glyph[]): string {
  const ops: string[] = [];
  let commands: string[] = [];
  let codes = '';
  const flush = () => {
    if (codes) commands.push(`<${codes}> 0`);
    codes = '';
    if (commands.length) ops.push(`[${commands.join(' ')}] TJ`);
    commands = [];
  };
  for (const glyph of glyphs) {
    if (glyph.width === 0) {
      flush();
      continue;
    }
    if (!glyph.continuous) {
      flush();
      ops.push(`1 0 0 -1 ${num(glyph.x)} ${num(glyph.y)} Tm`);
    }
    codes += glyph.hex;
    if (glyph.kern !== 0) {
      commands.push(`<${codes}> ${num(glyph.kern)}`);
      codes = '';
    }
  }
  flush();
  return ops.join('\n');
}

/** The face pdfmake would give svg-to-pdfkit: the first listed family it knows, else the page's. */
function fontFor(
  doc: PdfKitDocument,
  fonts: FontTable,
  piece: TextPiece,
  fallbackFamily: string,
): PdfFont {
  const key = `${piece.family}|${piece.bold}|${piece.italic}`;
  const known = fonts.get(key);
  if (known) return known;
  const families = piece.family.split(',').map((f) => f.trim().replace(/['"]/g, '').toLowerCase());
  const registered = Object.keys(doc.fonts);
  const family =
    families.map((f) => registered.find((r) => r.toLowerCase() === f)).find(Boolean) ??
    fallbackFamily;
  const file = doc.getFontFile(family, piece.bold, piece.italic);
  if (file === null) throw new Error(`draw-print: no font file for ${family}`);
  const font = doc.font(file)._font;
  shareLayouts(font, file);
  fonts.set(key, font);
  return font;
}

/**
 * PDFKit shapes each distinct text once per document and font; a worksheet's notation sets the
 * same few dozen glyph strings every time, so the shaped runs are kept across documents, by font
 * file (a run depends only on the font and the text).
 */
function shareLayouts(font: PdfFont, file: string): void {
  if (!font.layoutCache) return;
  let shared = SHARED_LAYOUTS.get(file);
  if (!shared || Object.keys(shared).length > SHARED_LAYOUT_LIMIT) {
    shared = font.layoutCache;
    SHARED_LAYOUTS.set(file, shared);
  }
  font.layoutCache = shared;
}

const SHARED_LAYOUTS = new Map<string, Record<string, unknown>>();
/** Far above what engravings set (glyphs, counts, sticking, the key); it only bounds odd input. */
const SHARED_LAYOUT_LIMIT = 5000;
