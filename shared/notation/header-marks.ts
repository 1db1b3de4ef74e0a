/**
 * The marks above the first system: the metronome mark ("♩ = 92") and, when the card swings, the
 * swing marking. Computed here (pure) and drawn by `drawHeaderMarks`, so the browser and the
 * server render share them.
 *
 * Both are written the trade's way (common practice): the metronome mark names the note that
 * carries the beat (a dotted note in compound time) and its beats per minute; swing is the word
 * "Swing" over straight notation with the equivalence of a written pair and a long-short triplet
 * pair (♫ = ♩♪ under a "3"), the notes staying straight on the staff.
 *
 * Music symbols are Bravura glyphs (the font VexFlow's `vexflow/bravura` entry embeds), from the
 * SMuFL ranges "Metronome marks" and "Beamed groups of notes", the latter made to be set in a
 * line of text; words are in Academico, as every other text of the score.
 */
import type { SVGContext } from 'vexflow/core';
import { swingFeel } from '../playback/swing';

/** A note value in a mark: 1 whole, 2 half, 4 quarter, 8 eighth, 16 sixteenth. */
export interface MarkNote {
  readonly value: 1 | 2 | 4 | 8 | 16;
  readonly dotted: boolean;
}

export interface MetronomeMark {
  readonly note: MarkNote;
  /** Beats of `note` a minute, rounded to a whole number when the exact value is not one. */
  readonly bpm: number;
  /** `bpm` is rounded (written "c."); `exact` then gives the card's own unit and tempo. */
  readonly approximate: boolean;
  readonly exact: { readonly note: MarkNote; readonly bpm: number } | null;
}

export interface SwingMark {
  /** 8: swung eighths; 16: swung sixteenths. */
  readonly unit: 8 | 16;
  readonly words: string;
  /** The pair is written as a triplet quarter-eighth (2:1), or a dotted pair (3:1, eighths). */
  readonly equivalence: 'triplet' | 'dotted';
  /** Long : short in per cent when the equivalence is not exact, e.g. "60:40". */
  readonly ratio: string | null;
}

export interface HeaderMarks {
  readonly tempo: MetronomeMark | null;
  readonly swing: SwingMark | null;
}

/** The part of a card the marks read (a normalised `RuleCard` satisfies it). */
export interface MarkedCard {
  readonly meter: {
    readonly beats: number;
    readonly unit: number;
    readonly grouping?: readonly number[] | undefined;
  };
  readonly tempo?: number | undefined;
  readonly swing?: { readonly unit: number; readonly ratio: number } | undefined;
}

const NOTE_VALUES = [1, 2, 4, 8, 16] as const;

function noteValue(n: number): MarkNote['value'] | null {
  return NOTE_VALUES.find((v) => v === n) ?? null;
}

/**
 * The note a beat of the meter is counted in: the meter's unit, or in compound time (every group
 * of the grouping three beats: 6/8, 9/8, 12/8 as dotted quarters) the dotted note of three units.
 */
export function beatNote(meter: MarkedCard['meter']): { note: MarkNote; units: number } | null {
  const unit = noteValue(meter.unit);
  if (unit === null) return null;
  const grouping = meter.grouping ?? [];
  const compound = grouping.length > 0 && grouping.every((g) => g === 3);
  const dottedValue = compound ? noteValue(meter.unit / 2) : null;
  if (dottedValue !== null) return { note: { value: dottedValue, dotted: true }, units: 3 };
  return { note: { value: unit, dotted: false }, units: 1 };
}

/** The marks for a card; the card's tempo counts beats of the meter's unit (as playback does). */
export function headerMarks(card: MarkedCard): HeaderMarks {
  return { tempo: metronomeMark(card), swing: swingMark(card) };
}

function metronomeMark(card: MarkedCard): MetronomeMark | null {
  const tempo = card.tempo;
  const beat = beatNote(card.meter);
  const unit = noteValue(card.meter.unit);
  if (tempo === undefined || beat === null || unit === null) return null;
  const whole = tempo % beat.units === 0;
  return {
    note: beat.note,
    bpm: Math.round(tempo / beat.units),
    approximate: !whole,
    exact: whole ? null : { note: { value: unit, dotted: false }, bpm: tempo },
  };
}

function swingMark(card: MarkedCard): SwingMark | null {
  // Marked exactly where playback swings, so the page never promises what it does not play.
  const feel = swingFeel(card.swing, card.meter.unit);
  if (feel === null || !card.swing) return null;
  const unit = card.swing.unit === 16 ? 16 : 8;
  const { num, den } = feel.ratio;
  const triplet = num * 3 === den * 2;
  const dotted = unit === 8 && num * 4 === den * 3;
  const long = Math.round((num / den) * 100);
  return {
    unit,
    words: unit === 8 ? 'Swing' : 'Swing 16ths',
    equivalence: dotted ? 'dotted' : 'triplet',
    ratio: triplet || dotted ? null : `${long}:${100 - long}`,
  };
}

/** The marks in words, for screen readers and tests. */
export function describeHeaderMarks(marks: HeaderMarks): string {
  const parts: string[] = [];
  if (marks.tempo) {
    const { note, bpm, approximate, exact } = marks.tempo;
    let text = `Tempo: ${noteName(note)} = ${approximate ? 'about ' : ''}${bpm}`;
    if (exact) text += ` (${noteName(exact.note)} = ${exact.bpm})`;
    parts.push(text);
  }
  if (marks.swing) {
    const { unit, equivalence, ratio } = marks.swing;
    const pair = unit === 8 ? 'eighths' : 'sixteenths';
    const played =
      equivalence === 'dotted'
        ? 'a dotted pair'
        : `a triplet ${unit === 8 ? 'quarter and eighth' : 'eighth and sixteenth'}`;
    parts.push(
      `Swing ${pair}: each pair played as ${played}${ratio ? `, long to short ${ratio}` : ''}`,
    );
  }
  return parts.join('. ');
}

function noteName(note: MarkNote): string {
  const names = { 1: 'whole', 2: 'half', 4: 'quarter', 8: 'eighth', 16: 'sixteenth' } as const;
  return `${note.dotted ? 'dotted ' : ''}${names[note.value]} note`;
}

// ---------------------------------------------------------------------------------------------
// Drawing

/**
 * Bravura code points and advance widths in staff spaces (from the font's metadata,
 * `@vexflow-fonts/bravura/metadata.json`, `glyphAdvanceWidths`; a test checks them).
 */
export const MARK_GLYPHS = {
  metNoteWhole: { code: '\uECA2', advance: 1.836 },
  metNoteHalfUp: { code: '\uECA3', advance: 1.364 },
  metNoteQuarterUp: { code: '\uECA5', advance: 1.328 },
  metNote8thUp: { code: '\uECA7', advance: 2.136 },
  metNote16thUp: { code: '\uECA9', advance: 2.088 },
  metAugmentationDot: { code: '\uECB7', advance: 0.4 },
  textBlackNoteShortStem: { code: '\uE1F0', advance: 1.328 },
  textBlackNoteFrac8thShortStem: { code: '\uE1F2', advance: 1.368 },
  textBlackNoteFrac16thShortStem: { code: '\uE1F4', advance: 1.368 },
  textCont8thBeamShortStem: { code: '\uE1F7', advance: 1.368 },
  textCont16thBeamShortStem: { code: '\uE1F9', advance: 1.368 },
  textAugmentationDot: { code: '\uE1FC', advance: 0.4 },
  textTupletBracketStartShortStem: { code: '\uE1FE', advance: 1.272 },
  textTuplet3ShortStem: { code: '\uE1FF', advance: 0.944 },
  textTupletBracketEndShortStem: { code: '\uE200', advance: 1.272 },
} as const;

type GlyphName = keyof typeof MARK_GLYPHS;

/** Font size of the music symbols in the marks, in pixels (a staff space is a quarter of it). */
export const MARK_GLYPH_SIZE = 24;
const TEXT_SIZE = 15;
/** Height of one line of marks: the triplet bracket's top to the noteheads' bottom, with air. */
export const MARK_LINE_HEIGHT = 34;
/** Baseline of a line of marks below the line's top. */
const MARK_BASELINE = 28;
/** Average advance of Academico per character, as a share of its size (a safe over-estimate). */
const CHAR_WIDTH = 0.56;
const GAP = 14;

const SPACE = MARK_GLYPH_SIZE / 4;

/** A piece of a line: words, or music glyphs (optionally overlaid on the glyphs before them). */
type Run =
  | { readonly kind: 'text'; readonly text: string; readonly bold?: boolean }
  | { readonly kind: 'glyphs'; readonly names: readonly GlyphName[] }
  /** Glyphs drawn over the last `over` staff spaces, centred on them; the pen does not move. */
  | {
      readonly kind: 'overlay';
      readonly names: readonly GlyphName[];
      readonly over: number;
      readonly from?: number;
    };

/** One mark: the runs drawn together, and its class name. */
interface Piece {
  readonly className: string;
  readonly runs: readonly Run[];
}

function advanceOf(names: readonly GlyphName[]): number {
  return names.reduce((w, name) => w + MARK_GLYPHS[name].advance, 0);
}

function codesOf(names: readonly GlyphName[]): string {
  return names.map((name) => MARK_GLYPHS[name].code).join('');
}

function noteGlyphs(note: MarkNote): GlyphName[] {
  const head: Record<MarkNote['value'], GlyphName> = {
    1: 'metNoteWhole',
    2: 'metNoteHalfUp',
    4: 'metNoteQuarterUp',
    8: 'metNote8thUp',
    16: 'metNote16thUp',
  };
  return note.dotted ? [head[note.value], 'metAugmentationDot'] : [head[note.value]];
}

function tempoPiece(mark: MetronomeMark): Piece {
  const runs: Run[] = [
    { kind: 'glyphs', names: noteGlyphs(mark.note) },
    { kind: 'text', text: `  = ${mark.approximate ? 'c. ' : ''}${mark.bpm}` },
  ];
  if (mark.exact) {
    runs.push(
      { kind: 'text', text: '  (' },
      { kind: 'glyphs', names: noteGlyphs(mark.exact.note) },
      { kind: 'text', text: `  = ${mark.exact.bpm})` },
    );
  }
  return { className: 'tensile-tempo-mark', runs };
}

function swingPieces(mark: SwingMark): { words: Piece; sign: Piece } {
  const pair: GlyphName[] =
    mark.unit === 8
      ? ['textBlackNoteShortStem', 'textCont8thBeamShortStem', 'textBlackNoteFrac8thShortStem']
      : ['textBlackNoteShortStem', 'textCont16thBeamShortStem', 'textBlackNoteFrac16thShortStem'];
  const runs: Run[] = [
    { kind: 'glyphs', names: pair },
    { kind: 'text', text: '  =  ' },
  ];
  if (mark.equivalence === 'dotted') {
    // A dotted eighth beamed to a sixteenth: the dot sits under the beam, after the first note.
    const figure: GlyphName[] = [
      'textBlackNoteShortStem',
      'textCont8thBeamShortStem',
      'textBlackNoteFrac16thShortStem',
    ];
    runs.push(
      { kind: 'glyphs', names: figure },
      {
        kind: 'overlay',
        names: ['textAugmentationDot'],
        over: advanceOf(figure),
        from: MARK_GLYPHS.textBlackNoteShortStem.advance + 0.2,
      },
    );
  } else {
    const figure: GlyphName[] =
      mark.unit === 8
        ? ['textBlackNoteShortStem', 'metNote8thUp']
        : ['textBlackNoteShortStem', 'textCont8thBeamShortStem', 'textBlackNoteFrac16thShortStem'];
    runs.push(
      { kind: 'glyphs', names: figure },
      {
        kind: 'overlay',
        names: [
          'textTupletBracketStartShortStem',
          'textTuplet3ShortStem',
          'textTupletBracketEndShortStem',
        ],
        over: advanceOf(figure),
      },
    );
  }
  if (mark.ratio) runs.push({ kind: 'text', text: `  (${mark.ratio})` });
  return {
    words: {
      className: 'tensile-swing-words',
      runs: [{ kind: 'text', text: mark.words, bold: true }],
    },
    sign: { className: 'tensile-swing-mark', runs },
  };
}

/** Estimated width of a piece in pixels: glyphs exactly, words over-estimated. */
function pieceWidth(piece: Piece): number {
  return piece.runs.reduce((w, run) => {
    if (run.kind === 'glyphs') return w + advanceOf(run.names) * SPACE;
    if (run.kind === 'overlay') return w;
    return w + run.text.length * TEXT_SIZE * CHAR_WIDTH;
  }, 0);
}

/** The marks laid out in lines that fit `width`: one line if it fits, else one mark a line. */
export interface MarkLines {
  readonly lines: readonly (readonly Piece[])[];
  /** Widest line, in pixels (estimated). */
  readonly width: number;
  readonly height: number;
}

export function layoutHeaderMarks(marks: HeaderMarks, width: number): MarkLines {
  const swing = marks.swing ? swingPieces(marks.swing) : null;
  const tempo = marks.tempo ? tempoPiece(marks.tempo) : null;
  const first = [swing?.words, tempo].filter((p): p is Piece => p !== undefined && p !== null);
  const all = [...first, ...(swing ? [swing.sign] : [])];
  if (all.length === 0) return { lines: [], width: 0, height: 0 };
  const lineWidth = (pieces: readonly Piece[]) =>
    pieces.reduce((w, p) => w + pieceWidth(p), 0) + GAP * (pieces.length - 1);
  const lines =
    lineWidth(all) <= width || swing === null
      ? [all]
      : [first, [swing.sign]].filter((l) => l.length);
  return {
    lines,
    width: Math.max(...lines.map(lineWidth)),
    height: lines.length * MARK_LINE_HEIGHT,
  };
}

/** Draw laid-out marks with the top of their first line at `top`, starting at `x`. */
export function drawHeaderMarks(
  ctx: SVGContext,
  marks: HeaderMarks,
  layout: MarkLines,
  x: number,
  top: number,
): void {
  if (layout.lines.length === 0) return;
  const group = ctx.openGroup();
  group.setAttribute('class', 'tensile-marks');
  group.setAttribute('aria-label', describeHeaderMarks(marks));
  layout.lines.forEach((pieces, line) => {
    const text = ctx.create('text') as SVGTextElement;
    text.setAttribute('x', round(x));
    text.setAttribute('y', round(top + line * MARK_LINE_HEIGHT + MARK_BASELINE));
    text.setAttribute('fill', 'currentColor');
    text.setAttribute('stroke', 'none');
    let lead = 0;
    for (const piece of pieces) {
      const { span, trailing } = pieceSpan(ctx, piece, lead);
      text.appendChild(span);
      lead = trailing + GAP;
    }
    ctx.add(text);
  });
  ctx.closeGroup();
}

/**
 * One `<text>` a line and one `<tspan>` a run, so the SVG renderer sets words and glyphs side by
 * side at their real widths; an overlay moves back over the glyphs it covers (known exactly from
 * the font's metrics), and the run after it moves forward again.
 */
function pieceSpan(
  ctx: SVGContext,
  piece: Piece,
  lead: number,
): { span: SVGTSpanElement; trailing: number } {
  const outer = ctx.create('tspan') as SVGTSpanElement;
  outer.setAttribute('class', piece.className);
  let dx = lead;
  for (const run of piece.runs) {
    const span = ctx.create('tspan') as SVGTSpanElement;
    let after = 0;
    if (run.kind === 'text') {
      span.setAttribute('font-family', 'Academico, serif');
      span.setAttribute('font-size', String(TEXT_SIZE));
      span.setAttribute('font-weight', run.bold ? 'bold' : 'normal');
      // No-break spaces: SVG would collapse the spaces around "=".
      span.textContent = run.text.replace(/ /g, '\u00a0');
    } else {
      span.setAttribute('font-family', 'Bravura');
      span.setAttribute('font-size', String(MARK_GLYPH_SIZE));
      span.textContent = codesOf(run.names);
      if (run.kind === 'overlay') {
        const width = advanceOf(run.names);
        const back =
          run.from === undefined ? run.over - (run.over - width) / 2 : run.over - run.from;
        dx -= back * SPACE;
        after = (back - width) * SPACE;
      }
    }
    if (dx !== 0) span.setAttribute('dx', round(dx));
    outer.appendChild(span);
    dx = after;
  }
  return { span: outer, trailing: dx };
}

function round(n: number): string {
  return String(Math.round(n * 100) / 100);
}
