import { createHash } from 'node:crypto';
import type { Drill } from '../../shared/generator/index';
import { renderDrillSvg } from '../notation/render-svg';
import { compilePrintDrawing, type PrintDrawing } from './print-drawing';
import type { PrintAids } from './worksheet-print';

/**
 * Width the notation is engraved at, in VexFlow pixels. Scaled onto a page's ~520 pt text width,
 * a stave space of 10 px prints at about 1.7 mm, a staff about 6.6 mm high, near the rastral
 * sizes used for printed parts (common practice).
 */
export const PRINT_ENGRAVING_WIDTH = 1100;
/** The widest engraving: beyond it the staff would print too small to read from a stand. */
const WIDEST_ENGRAVING = 2000;
/** Bars a system holds at most (the browser's setting). */
const BARS_PER_SYSTEM = 4;

export interface NotationArt {
  readonly svg: string;
  /** The same drawing ready for a PDF page (print-drawing.ts). */
  readonly drawing: PrintDrawing;
  /** Size of the drawing in its own units; pdfmake scales it to the width it is given. */
  readonly width: number;
  readonly height: number;
}

/**
 * The drill engraved as for the browser, with the aids the teacher chose, in black. `maxAspect`
 * is the tallest height-to-width ratio the page has room for: a drill taller than that (wide
 * tuplet bars, one to a line) is engraved once more on a wider line, so more bars share a system
 * and the page shrinks it less.
 */
export function notationArt(drill: Drill, aids: PrintAids, maxAspect = Infinity): NotationArt {
  // A drill is engraved from its own data alone: the same drill, aids and room draw the same.
  const key = createHash('sha256')
    .update(JSON.stringify([drill, aids, maxAspect, PRINT_ENGRAVING_WIDTH]))
    .digest('base64');
  const known = engraved.get(key);
  if (known) {
    // Most recently used last, so the oldest goes first when the cache is full.
    engraved.delete(key);
    engraved.set(key, known);
    return known;
  }
  const art = engraveToFit(drill, aids, maxAspect);
  engraved.set(key, art);
  if (engraved.size > CACHED_DRAWINGS) engraved.delete(engraved.keys().next().value!);
  return art;
}

/**
 * Drawings kept for a worksheet exported again (a teacher re-prints after editing the notes or
 * the ladder): a 16-bar drawing is 60–140 kB, so 64 of them stay under 10 MB.
 */
const CACHED_DRAWINGS = 64;
const engraved = new Map<string, NotationArt>();

/** Forget every kept drawing (the benchmark's cold runs). */
export function clearNotationCache(): void {
  engraved.clear();
}

function engraveToFit(drill: Drill, aids: PrintAids, maxAspect: number): NotationArt {
  const first = engrave(drill, aids, PRINT_ENGRAVING_WIDTH);
  const aspect = first.height / first.width;
  const perSystem = drill.bars.length / first.systems;
  if (aspect <= maxAspect || perSystem >= Math.min(BARS_PER_SYSTEM, drill.bars.length))
    return first;
  const width = Math.min(WIDEST_ENGRAVING, PRINT_ENGRAVING_WIDTH * Math.sqrt(aspect / maxAspect));
  const wider = engrave(drill, aids, Math.round(width));
  // Keep whichever prints larger once fitted into the page's room.
  return printedScale(wider, maxAspect) > printedScale(first, maxAspect) ? wider : first;
}

/** How large a drawing prints, fitted to a unit width and to `maxAspect` of height. */
function printedScale(art: NotationArt, maxAspect: number): number {
  return Math.min(1 / art.width, maxAspect / art.height);
}

function engrave(
  drill: Drill,
  aids: PrintAids,
  width: number,
): NotationArt & { readonly systems: number } {
  const { svg, layout, tree } = renderDrillSvg(
    drill,
    {
      width,
      showSticking: aids.sticking,
      showCounts: aids.counts,
      showLegend: true,
      showMarks: true,
      ink: 'black',
    },
    { forPrint: true },
  );
  const systems = new Set(layout.bars.map((b) => b.system)).size;
  const drawing = compilePrintDrawing(tree);
  return { svg, drawing, width: layout.width, height: layout.height, systems };
}
