/**
 * The pdfmake document of a worksheet: a header (title, studio, logo, date, notes), then each
 * drill as one unbreakable stack (title, notation, tension plot, tempo ladder, seed link and QR
 * code), and a footer with the page number and a practice caution on every page.
 */
import type { NotationArt } from './notation-art';
import { TEXT_FONT } from './pdf-fonts';
import { ladderRungs } from './tempo-ladder';
import { PLOT_HEIGHT, PLOT_WIDTH } from './tension-plot';
import type { WorksheetPrint, WorksheetPrintDrill } from './worksheet-print';

/** Page sizes in points (ISO 216 A4 is 210 × 297 mm; US Letter 8.5 × 11 in; 72 pt an inch). */
export const PAGE_SIZES = {
  a4: { name: 'A4', width: 595.28, height: 841.89 },
  letter: { name: 'LETTER', width: 612, height: 792 },
} as const;

/** Left, top, right, bottom; the bottom margin holds the footer. */
const MARGINS = [40, 36, 40, 58] as const;
const QR_SIZE = 78;
/** Room a drill needs beside its notation: title, plot, ladder, link (measured on print-outs). */
const DRILL_EXTRAS = 220;

export const PRACTICE_CAUTION =
  'Practise safely: wear hearing protection, take a short break at least every 30 minutes, and keep a ' +
  'relaxed, upright posture. Stop if anything hurts, and follow the advice of a qualified teacher.';

/** What each drill brings to the page besides its text: notation, QR code, tension plot. */
export interface DrillArt {
  readonly notation: NotationArt;
  readonly qr: string;
  readonly tension: string | null;
}

export interface DocumentOptions {
  /** Leave the notation out, keeping its place on the page (the benchmark's floor). */
  readonly withoutNotation?: boolean;
}

type Content = Record<string, unknown> | string;

export function worksheetDocument(
  print: WorksheetPrint,
  art: readonly DrillArt[],
  options: DocumentOptions = {},
): Record<string, unknown> {
  const page = PAGE_SIZES[print.paper];
  const { width: textWidth, height: textHeight } = textArea(print.paper);
  return {
    pageSize: page.name,
    pageMargins: [...MARGINS],
    info: { title: print.title, author: print.studioName, creator: 'Tensile' },
    defaultStyle: { font: TEXT_FONT, fontSize: 10, lineHeight: 1.15 },
    content: [
      header(print, textWidth),
      ...print.drills.map((drill, i) =>
        drillBlock(drill, art[i]!, textWidth, textHeight, options, i),
      ),
    ],
    footer: (current: number, count: number) => ({
      margin: [MARGINS[0], 10, MARGINS[2], 0],
      columns: [
        { text: PRACTICE_CAUTION, fontSize: 7, color: '#444', width: '*' },
        { text: `Page ${current} of ${count}`, fontSize: 8, alignment: 'right', width: 70 },
      ],
    }),
  };
}

/** Width and height of the page's text area, in points. */
export function textArea(paper: WorksheetPrint['paper']): { width: number; height: number } {
  const page = PAGE_SIZES[paper];
  return {
    width: page.width - MARGINS[0] - MARGINS[2],
    height: page.height - MARGINS[1] - MARGINS[3],
  };
}

/** The most height a drill's notation may take so the whole drill fits on one page. */
export function notationRoom(textWidth: number, textHeight: number, tension: boolean): number {
  return textHeight - DRILL_EXTRAS - (tension ? (textWidth * PLOT_HEIGHT) / PLOT_WIDTH : 0);
}

function header(print: WorksheetPrint, textWidth: number): Content {
  const words: Content[] = [
    { text: print.title, fontSize: 18, bold: true },
    { text: print.studioName, fontSize: 11, margin: [0, 2, 0, 0] },
    { text: print.date, fontSize: 9, color: '#444', margin: [0, 2, 0, 0] },
  ];
  const logo = print.logo
    ? {
        image: `data:${print.logo.mime};base64,${print.logo.bytes.toString('base64')}`,
        fit: [120, 56],
        width: 120,
        alignment: 'right',
      }
    : null;
  return {
    stack: [
      logo ? { columns: [{ stack: words, width: '*' }, logo] } : { stack: words },
      ...(print.notes ? [{ text: print.notes, margin: [0, 8, 0, 0] }] : []),
      {
        canvas: [{ type: 'line', x1: 0, y1: 0, x2: textWidth, y2: 0, lineWidth: 0.6 }],
        margin: [0, 8, 0, 10],
      },
    ],
  };
}

function drillBlock(
  drill: WorksheetPrintDrill,
  art: DrillArt,
  textWidth: number,
  textHeight: number,
  options: DocumentOptions,
  index: number,
): Content {
  const { notation } = art;
  // The whole drill must fit one page: a tall drill is printed narrower rather than split.
  const room = notationRoom(textWidth, textHeight, art.tension !== null);
  const width = Math.min(textWidth, (room * notation.width) / notation.height);
  const height = (width * notation.height) / notation.width;
  const meter = drill.card.meter;
  const facts = [
    `${meter.beats}/${meter.unit}`,
    `${drill.drill.bars.length} bars`,
    `seed ${drill.drill.seed}`,
  ].join(' · ');
  return {
    unbreakable: true,
    margin: [0, index === 0 ? 0 : 14, 0, 0],
    stack: [
      { text: drill.title, fontSize: 13, bold: true },
      { text: facts, fontSize: 8, color: '#444', margin: [0, 1, 0, 4] },
      options.withoutNotation
        ? { canvas: [{ type: 'rect', x: 0, y: 0, w: width, h: height, lineColor: '#ffffff' }] }
        : notationPlace(notation, width),
      ...(art.tension ? [{ svg: art.tension, width: textWidth, margin: [0, 4, 0, 0] }] : []),
      {
        margin: [0, 8, 0, 0],
        columns: [
          {
            width: '*',
            stack: [
              ladder(drill),
              { text: 'Open this drill:', fontSize: 8, color: '#444', margin: [0, 8, 0, 0] },
              { text: drill.seedLink, fontSize: 9, link: drill.seedLink },
            ],
          },
          { svg: art.qr, width: QR_SIZE, height: QR_SIZE },
        ],
        columnGap: 12,
      },
    ],
  };
}

/**
 * Where the notation goes: an empty SVG of the drawing's size, which pdfmake lays out as it would
 * the drawing itself, carrying the drawing for `drawNotation` to put there once pages are laid out.
 */
function notationPlace(notation: NotationArt, width: number): Content {
  const size = `width="${notation.width}" height="${notation.height}"`;
  return {
    svg: `<svg xmlns="http://www.w3.org/2000/svg" ${size} viewBox="0 0 ${notation.width} ${notation.height}"/>`,
    width,
    alignment: 'center',
    [NOTATION_DRAWING]: notation.drawing,
  };
}

/** The key a notation place carries its drawing under (pdfmake ignores keys it does not know). */
export const NOTATION_DRAWING = 'tensileNotationDrawing';

function ladder(drill: WorksheetPrintDrill): Content {
  const rungs = ladderRungs(drill.ladder);
  return {
    stack: [
      {
        text: `Tempo ladder: tick each tempo once you can play the drill cleanly (BPM)`,
        fontSize: 8,
        color: '#444',
        margin: [0, 0, 0, 3],
      },
      {
        table: {
          widths: rungs.map(() => 28),
          heights: [12, 16],
          body: [
            rungs.map((t) => ({ text: String(t), alignment: 'center', fontSize: 9 })),
            rungs.map(() => ({ text: '' })),
          ],
        },
        layout: {
          hLineWidth: () => 0.6,
          vLineWidth: () => 0.6,
          paddingTop: () => 1,
          paddingBottom: () => 1,
        },
      },
    ],
  };
}
