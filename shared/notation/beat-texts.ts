/**
 * The text rows of a bar: sticking (R, L, or R over L stacked) over the struck instants and the counting
 * syllables under every slot of every beat.
 */
import type { Stave, SVGContext } from 'vexflow/core';
import {
  countPositions,
  fittingSyllableSize,
  SMALLEST_TEXT,
  spreadPositions,
  SYLLABLE_GAP,
  syllableGaps,
  syllableWidth,
} from './count-positions';
import type { NotationBar } from './notation-model';
import { SvgTextRow } from './svg-text';
import { noteExtents, type EngravedBar } from './vexflow-bar';

/** Clear space kept between a syllable and a bar line (half the gap between two bars' syllables). */
const BAR_LINE_CLEARANCE = SYLLABLE_GAP;

/** Syllables on slots where nothing sounds are printed lighter (still ≥ 4.5:1 on white). */
const SILENT_COUNT_OPACITY = 0.55;

/** Centre x of the note or rest that starts at each struck instant, keyed `beat:slot`. */
function instantX(engraved: EngravedBar): Map<string, number> {
  const xs = new Map<string, number>();
  const extents = noteExtents(engraved);
  for (const [i, { beat, event }] of engraved.notes.entries()) {
    const key = `${beat}:${event.slot}`;
    const centre = extents[i]!.left + extents[i]!.width / 2;
    if (event.kind === 'note' || !xs.has(key)) xs.set(key, centre);
  }
  return xs;
}

/** Baselines of the text rows, or null for a row that is not shown. */
export interface TextRows {
  readonly stickingY: number | null;
  readonly countsY: number | null;
  /** The counting syllables' size (see `CountLayout.size`). */
  readonly countSize: number;
  /** The bar's count as `layoutCounts` placed it, when the count is shown. */
  readonly counts: CountLayout | null;
  /** The smallest the sticking letters may shrink to (default `SMALLEST_TEXT`). */
  readonly leastSize?: number;
}

/** Sticking over the notes and the count under them, for one engraved and formatted bar. */
export function drawBeatTexts(
  ctx: SVGContext,
  bar: NotationBar,
  engraved: EngravedBar,
  stave: Stave,
  rows: TextRows,
): void {
  const { stickingY, countsY, countSize, counts } = rows;
  const least = rows.leastSize ?? SMALLEST_TEXT;
  if (stickingY !== null)
    drawSticking(ctx, bar, counts?.xs ?? instantX(engraved), stickingY, least, stave);
  if (countsY !== null)
    drawCounts(ctx, bar, counts ?? layoutCounts(bar, engraved, stave), stave, countsY, countSize);
}

/** Sticking letters' size where they have room. */
const STICKING_SIZE = 15;
/** Width of a bold capital R or L as a share of the font size (Academico; a safe over-estimate). */
export const LETTER_WIDTH = 0.72;
/** Space kept between neighbouring letters, in pixels, before they are set smaller. */
export const LETTER_GAP = 2;
/**
 * The least clear space between two sticking letters, as a share of their size: half an em, twice
 * a word space, so neighbouring hands never read as one word ("LR") however tight the notes.
 */
export const STICKING_GAP = 0.5;
/** Ink width of the wider letter, a bold R, as a share of the size (Academico bold: 12 px at 15). */
const LETTER_INK = 0.8;
/**
 * Centre-to-centre room two neighbouring sticking letters need to keep their full size (at least
 * `least` pixels) and the least gap between them without being moved apart.
 */
export function stickingPitch(least = 0): number {
  return Math.max(STICKING_SIZE, least) * (LETTER_INK + STICKING_GAP);
}

/** Baseline distance between the two letters of a stack. */
export const STICKING_LINE = 14;

/**
 * One letter per hand over each struck instant. Two hands at once are stacked, the hand of the
 * voice higher on the staff on top (R over L), so an instant never takes more than one letter's
 * width and neighbours never run into each other ("R+L" written inline collides in dense bars).
 * Where instants sit closer than a letter's width, the bar's letters are set smaller (down to
 * `least`, 10 px on a screen). Stacked sticking for simultaneous hands is common practice in
 * drum-set parts.
 */
function drawSticking(
  ctx: SVGContext,
  bar: NotationBar,
  xs: ReadonlyMap<string, number>,
  y: number,
  least: number,
  stave: Stave,
): void {
  const placed = bar.beats.flatMap((beat) =>
    beat.sticking.flatMap(({ slot, hands }) => {
      const x = xs.get(`${beat.beat}:${slot}`);
      return x === undefined ? [] : [{ x, hands, beat: beat.beat, slot }];
    }),
  );
  const sorted = placed.map((p) => p.x).sort((a, b) => a - b);
  let tightest = Infinity;
  for (let i = 1; i < sorted.length; i++)
    tightest = Math.min(tightest, sorted[i]! - sorted[i - 1]!);
  const fits = Math.floor((tightest - LETTER_GAP) / LETTER_WIDTH);
  const size = Math.max(least, Math.min(Math.max(STICKING_SIZE, least), fits));
  if (placed.length === 0) return;
  // Letters still closer than a letter and the least gap move apart, as little as they can and
  // inside the bar (as the counting syllables do): each stays nearest its own note.
  placed.sort((a, b) => a.x - b.x);
  const half = (size * LETTER_INK) / 2;
  const pitch = size * (LETTER_INK + STICKING_GAP);
  const spread = spreadPositions(
    centredApart(
      placed.map((p) => p.x),
      pitch,
    ),
    stave.getX() + half,
    stave.getX() + stave.getWidth() - half,
    pitch,
  );
  const letters = new SvgTextRow(ctx, 'tensile-sticking-row', { size, weight: 'bold' });
  for (const [i, { hands, beat, slot }] of placed.entries()) {
    const x = spread[i]!;
    hands.forEach((hand, i) => {
      const row = hands.length - 1 - i;
      const label = letters.add(hand, x, y - row * STICKING_LINE, 'tensile-sticking');
      label.setAttribute('data-beat', String(beat));
      label.setAttribute('data-slot', String(slot));
    });
  }
}

/**
 * `xs` (ascending) moved so that neighbours stand at least `pitch` apart, each as near its own x
 * as the others allow (least squares): a crowded pair moves apart about its middle, rather than
 * the later letter alone leaving its note. Pools runs of crowded points into blocks, each at the
 * mean of its points' wishes.
 */
function centredApart(xs: readonly number[], pitch: number): number[] {
  // With point i shifted back by i pitches, the rule is "never decreasing".
  const blocks: { first: number; count: number; at: number }[] = [];
  xs.forEach((x, i) => {
    let block = { first: i, count: 1, at: x - i * pitch };
    while (blocks.length > 0 && blocks[blocks.length - 1]!.at > block.at) {
      const prev = blocks.pop()!;
      const count = prev.count + block.count;
      block = {
        first: prev.first,
        count,
        at: (prev.at * prev.count + block.at * block.count) / count,
      };
    }
    blocks.push(block);
  });
  const out: number[] = [];
  for (const block of blocks)
    for (let k = 0; k < block.count; k++) out.push(block.at + (block.first + k) * pitch);
  return out;
}

/** Where a formatted bar's counting syllables go; measured once, for sizing and for drawing. */
export interface CountLayout {
  /** Centre x of each struck instant (see `instantX`). */
  readonly xs: ReadonlyMap<string, number>;
  /** The syllables' raw x in time order (slot by slot, beat by beat) and their texts. */
  readonly raw: readonly number[];
  readonly texts: readonly string[];
  readonly positions: readonly (readonly number[])[];
  /**
   * The largest size at which the bar's syllables keep their gaps without moving; a score sets
   * all its syllables in the smallest of its bars' sizes, so the count reads as one line.
   */
  readonly size: number;
}

/** Place a formatted bar's counting syllables, set no smaller than `least` pixels. */
export function layoutCounts(
  bar: NotationBar,
  engraved: EngravedBar,
  stave: Stave,
  least = SMALLEST_TEXT,
): CountLayout {
  const xs = instantX(engraved);
  const anchors = bar.beats.map((beat) => {
    const written = new Map<number, number>();
    for (let slot = 0; slot < beat.subdivision; slot++) {
      const x = xs.get(`${beat.beat}:${slot}`);
      if (x !== undefined) written.set(slot, x);
    }
    return { subdivision: beat.subdivision, written };
  });
  const positions = countPositions(anchors, stave.getNoteStartX(), stave.getNoteEndX());
  // The syllables in time order, as the slots are.
  const texts = bar.beats.flatMap((beat, index) =>
    Array.from(
      { length: positions[index]?.length ?? 0 },
      (_, slot) => beat.counts.find((c) => c.slot === slot)?.text ?? '',
    ),
  );
  const raw = positions.flat();
  const barLine = stave.getX() + stave.getWidth();
  const tail = barLine - BAR_LINE_CLEARANCE - (raw.at(-1) ?? 0);
  const size = fittingSyllableSize(texts, raw, tail, least);
  return { xs, raw, texts, positions, size };
}

/**
 * Every syllable of every beat, under its slot; lighter where nothing sounds. All syllables of
 * a bar share one size and each stays under the note it counts (common practice: the count
 * reads as the rhythm's words); only where the notes stand too close even at `size` are
 * syllables moved apart. Half the gap stays clear on each side of a bar line, so the last
 * syllable of a bar and the first of the next never read as one word ("a1").
 */
function drawCounts(
  ctx: SVGContext,
  bar: NotationBar,
  counts: CountLayout,
  stave: Stave,
  y: number,
  size: number,
): void {
  const { raw, texts, positions } = counts;
  const barLine = stave.getX() + stave.getWidth();
  const lastHalf = syllableWidth(texts.at(-1) ?? '', size) / 2;
  const firstHalf = syllableWidth(texts[0] ?? '', size) / 2;
  const flat = spreadPositions(
    raw,
    stave.getX() + BAR_LINE_CLEARANCE + firstHalf,
    barLine - BAR_LINE_CLEARANCE - lastHalf,
    syllableGaps(texts, size),
  );
  const syllables = new SvgTextRow(ctx, 'tensile-count-row', { size });
  let next = 0;
  bar.beats.forEach((beat, index) => {
    const slots = flat.slice(next, next + (positions[index]?.length ?? 0));
    next += slots.length;
    for (const { slot, text, strong, sounding } of beat.counts) {
      const x = slots[slot];
      if (x === undefined) continue;
      const className = sounding ? 'tensile-count' : 'tensile-count tensile-count-silent';
      const label = syllables.add(text, x, y, className, {
        weight: strong ? 'bold' : 'normal',
        ...(sounding ? {} : { opacity: SILENT_COUNT_OPACITY }),
      });
      label.setAttribute('data-beat', String(beat.beat));
      label.setAttribute('data-slot', String(slot));
    }
  });
}
