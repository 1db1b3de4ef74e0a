import { createHash } from 'node:crypto';
import type { Drill } from '../../shared/generator/index';
import { PRINT_LAYOUT } from '../../shared/notation/print-layout';
import type { RenderOptions } from '../../shared/notation/render-vexflow';
import { renderDrillSvg } from '../notation/render-svg';
import { keptDrawings } from './drawing-cache';
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
const BARS_PER_SYSTEM = PRINT_LAYOUT.maxBarsPerSystem;

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
  const key = notationKey(drill, aids, maxAspect);
  const art = keptDrawings.get(key) ?? engraveNotation(drill, aids, maxAspect);
  keptDrawings.set(key, art);
  return art;
}

/** The cache's key: a drill is engraved from its own data alone, so the same key draws the same. */
export function notationKey(drill: Drill, aids: PrintAids, maxAspect: number): string {
  return createHash('sha256')
    .update(JSON.stringify([drill, aids, maxAspect, PRINT_ENGRAVING_WIDTH]))
    .digest('base64');
}

/** Forget every kept drawing (the benchmark's cold runs). */
export function clearNotationCache(): void {
  keptDrawings.clear();
}

/** The drill engraved afresh (no cache): what `notationArt` draws, here or in a worker thread. */
export function engraveNotation(drill: Drill, aids: PrintAids, maxAspect: number): NotationArt {
  const { svg, drawing, width, height } = engraveToFit(drill, aids, maxAspect);
  return { svg, drawing, width, height };
}

function engraveToFit(drill: Drill, aids: PrintAids, maxAspect: number): NotationArt {
  const first = evenlyEngraved(drill, aids);
  const aspect = first.height / first.width;
  const perSystem = drill.bars.length / first.systems;
  if (aspect <= maxAspect || perSystem >= Math.min(BARS_PER_SYSTEM, drill.bars.length))
    return first;
  const width = Math.min(WIDEST_ENGRAVING, PRINT_ENGRAVING_WIDTH * Math.sqrt(aspect / maxAspect));
  const wider = engrave(drill, aids, Math.round(width));
  // Keep whichever prints larger once fitted into the page's room.
  return printedScale(wider, maxAspect) > printedScale(first, maxAspect) ? wider : first;
}

/**
 * Lines a little longer than the page's own, tried where its systems come out uneven or hold one
 * bar each (a quintuplet drill's wide bars): up to 1.3×, a staff of about 5 mm on A4, as small as
 * a printed part's staff goes (E. Gould, "Behind Bars", Faber Music 2011, ch. "Staff sizes";
 * from memory).
 */
const EVENING_WIDTHS = [1.15, 1.3];

/**
 * The drill engraved on the page's line, or on a slightly longer one where that sets its bars
 * in systems of two or more, all of one count (the last perhaps fewer): every system then fills
 * the width with bars of about one width, rather than lone bars stretched across line after line
 * and half the page left empty. Bars are never set tighter than their room on paper, and the
 * text rows keep their least printed size, so a longer line only prints the staff smaller.
 */
function evenlyEngraved(drill: Drill, aids: PrintAids): Engraved {
  const first = engrave(drill, aids, PRINT_ENGRAVING_WIDTH);
  if (settled(first.sizes)) return first;
  for (const factor of EVENING_WIDTHS) {
    const wider = engrave(drill, aids, Math.round(PRINT_ENGRAVING_WIDTH * factor));
    if (settled(wider.sizes)) return wider;
  }
  return first;
}

/**
 * Every system holds as many bars as the first, the last perhaps fewer, and (with more than one
 * bar in the drill) at least two.
 */
function settled(sizes: readonly number[]): boolean {
  const [first = 0, ...rest] = sizes;
  if (first < 2 && rest.length > 0) return false;
  return rest.every((size, i) => size === first || (i === rest.length - 1 && size < first));
}

/** How large a drawing prints, fitted to a unit width and to `maxAspect` of height. */
function printedScale(art: NotationArt, maxAspect: number): number {
  return Math.min(1 / art.width, maxAspect / art.height);
}

/**
 * The engraving options of a printed drill: paper's spacing (`PRINT_LAYOUT`, as the browser
 * prints), so each bar takes the room its notes and text rows need on paper rather than a
 * screen's, and the line breaking fits as many bars to a system as that room allows, each system
 * then justified to the full width. The text rows' least size is scaled from the browser's print
 * line to this one, so it prints at the same size (about 7 pt on A4) on a longer line too.
 */
export function printOptions(aids: PrintAids, width: number): RenderOptions {
  return {
    width,
    showSticking: aids.sticking,
    showCounts: aids.counts,
    showLegend: true,
    showMarks: true,
    ink: 'black',
    noteRoom: PRINT_LAYOUT.noteRoom,
    countRoom: PRINT_LAYOUT.countRoom,
    air: PRINT_LAYOUT.air,
    maxBarsPerSystem: PRINT_LAYOUT.maxBarsPerSystem,
    leastTextSize: (PRINT_LAYOUT.leastTextSize * width) / PRINT_LAYOUT.width,
  };
}

interface Engraved extends NotationArt {
  readonly systems: number;
  /** Bars in each system, in order. */
  readonly sizes: readonly number[];
}

function engrave(drill: Drill, aids: PrintAids, width: number): Engraved {
  const { svg, layout, tree } = renderDrillSvg(drill, printOptions(aids, width), {
    forPrint: true,
  });
  const sizes: number[] = [];
  for (const bar of layout.bars) sizes[bar.system] = (sizes[bar.system] ?? 0) + 1;
  const drawing = compilePrintDrawing(tree);
  return { svg, drawing, width: layout.width, height: layout.height, systems: sizes.length, sizes };
}
