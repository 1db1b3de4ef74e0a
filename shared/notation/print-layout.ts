/**
 * How a drill is engraved for paper, shared by every host that prints (the browser's print, the
 * worksheet PDF to come). Kept apart from the renderer so a page can read it without loading
 * VexFlow.
 *
 * A printed system holds four bars of sixteenths, as drum-set parts are usually set on A4 or US
 * Letter (common practice): the score is engraved on a line of `width` pixels and zoomed onto
 * the page's printable width, and notes may stand `noteRoom` pixels apart (a screen keeps more
 * air, 22 px, for a cursor and touch).
 */
export const PRINT_LAYOUT = {
  /** The line the score is engraved on, in pixels at the renderer's scale. */
  width: 1280,
  /** Least room per written note on paper, in pixels at the renderer's scale. */
  noteRoom: 15,
  /** Least room per counted slot on paper (a one-letter syllable with its gap). */
  countRoom: 14,
  /** Room beyond a bar's tightest setting (a screen's is 1.2). */
  air: 1,
  maxBarsPerSystem: 4,
} as const;
