/**
 * How a drill is engraved for paper, shared by every host that prints (the browser's print, the
 * worksheet PDF to come). Kept apart from the renderer so a page can read it without loading
 * VexFlow.
 *
 * The score is engraved on a line of `width` pixels and zoomed onto
 * the page's printable width (`PRINT_PAGE_WIDTH`), and notes may stand `noteRoom` pixels apart
 * (a screen keeps more air, 22 px, for a cursor and touch).
 *
 * The zoom sets the printed sizes. A 1050 px line on a 700 px page is a zoom of 2/3: the staff's
 * 40 px become 26.7 CSS px, 7.06 mm, where an engraved part's staff is about 7–7.5 mm high
 * (E. Gould, "Behind Bars", Faber Music 2011, ch. "Staff sizes"; from memory), and the text rows'
 * least 14.5 px print at 9.7 CSS px, 7.25 pt (at least 7 pt, read from a music stand). At that
 * size VexFlow's tightest setting of a bar of sixteenths (about 22 staff spaces, more with
 * ghost-note parentheses) lets three such bars share a system, four where the bars are plain;
 * quintuplet bars (twenty notes and syllables) go two to a system.
 */
export const PRINT_LAYOUT = {
  /** The line the score is engraved on, in pixels at the renderer's scale. */
  width: 1050,
  /** Least room per written note on paper, in pixels at the renderer's scale. */
  noteRoom: 15,
  /** Least room per counted slot on paper (a one-letter syllable with its gap). */
  countRoom: 14,
  /** Room beyond a bar's tightest setting (a screen's is 1.2). */
  air: 1,
  maxBarsPerSystem: 4,
  /** Sticking letters and counting syllables never smaller than this, in pixels (7.25 pt). */
  leastTextSize: 14.5,
} as const;

/**
 * The printable width, in CSS pixels, of A4 or US Letter inside 12 mm margins (the narrower, A4:
 * 186 mm at 96 px to the inch): the score is zoomed to it in print.
 */
export const PRINT_PAGE_WIDTH = 700;

/** Printed size, in millimetres, of `px` pixels of a score engraved for print. */
export function printedMm(px: number): number {
  return ((px * PRINT_PAGE_WIDTH) / PRINT_LAYOUT.width / 96) * 25.4;
}

/** Printed size, in points, of `px` pixels of a score engraved for print. */
export function printedPt(px: number): number {
  return ((px * PRINT_PAGE_WIDTH) / PRINT_LAYOUT.width / 96) * 72;
}
