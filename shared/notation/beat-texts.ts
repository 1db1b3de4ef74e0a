/**
 * The text rows of a bar: sticking (R, L, R+L) over the struck instants and the counting
 * syllables under every slot of every beat.
 */
import type { Stave, SVGContext } from 'vexflow/bravura';
import { countPositions, syllableSize } from './count-positions';
import type { NotationBar } from './notation-model';
import { svgText } from './svg-text';
import type { EngravedBar } from './vexflow-bar';

/** Syllables on slots where nothing sounds are printed lighter (still ≥ 4.5:1 on white). */
const SILENT_COUNT_OPACITY = 0.55;

/** Centre x of the note or rest that starts at each struck instant, keyed `beat:slot`. */
function instantX(engraved: EngravedBar): Map<string, number> {
  const xs = new Map<string, number>();
  for (const { note, beat, event } of engraved.notes) {
    const key = `${beat}:${event.slot}`;
    const centre = note.getAbsoluteX() + note.getGlyphWidth() / 2;
    if (event.kind === 'note' || !xs.has(key)) xs.set(key, centre);
  }
  return xs;
}

/** Baselines of the text rows, or null for a row that is not shown. */
export interface TextRows {
  readonly stickingY: number | null;
  readonly countsY: number | null;
}

/** Sticking over the notes and the count under them, for one engraved and formatted bar. */
export function drawBeatTexts(
  ctx: SVGContext,
  bar: NotationBar,
  engraved: EngravedBar,
  stave: Stave,
  rows: TextRows,
): void {
  const xs = instantX(engraved);
  const { stickingY, countsY } = rows;
  for (const beat of bar.beats) {
    if (stickingY !== null) {
      for (const { slot, hands } of beat.sticking) {
        const x = xs.get(`${beat.beat}:${slot}`);
        if (x === undefined) continue;
        const label = hands.length > 1 ? hands.join('+') : (hands[0] ?? '');
        svgText(ctx, label, x, stickingY, 'tensile-sticking', { size: 15, weight: 'bold' });
      }
    }
  }
  if (countsY !== null) drawCounts(ctx, bar, xs, stave, countsY);
}

/** Every syllable of every beat, under its slot; lighter where nothing sounds. */
function drawCounts(
  ctx: SVGContext,
  bar: NotationBar,
  xs: ReadonlyMap<string, number>,
  stave: Stave,
  y: number,
): void {
  const anchors = bar.beats.map((beat) => {
    const written = new Map<number, number>();
    for (let slot = 0; slot < beat.subdivision; slot++) {
      const x = xs.get(`${beat.beat}:${slot}`);
      if (x !== undefined) written.set(slot, x);
    }
    return { subdivision: beat.subdivision, written };
  });
  const positions = countPositions(anchors, stave.getNoteStartX(), stave.getNoteEndX());
  bar.beats.forEach((beat, index) => {
    const xs = positions[index] ?? [];
    const size = syllableSize([...xs, positions[index + 1]?.[0] ?? stave.getNoteEndX()]);
    for (const { slot, text, strong, sounding } of beat.counts) {
      const x = xs[slot];
      if (x === undefined) continue;
      const className = sounding ? 'tensile-count' : 'tensile-count tensile-count-silent';
      const label = svgText(ctx, text, x, y, className, {
        size: strong ? 15 : size,
        weight: strong ? 'bold' : 'normal',
        ...(sounding ? {} : { opacity: SILENT_COUNT_OPACITY }),
      });
      label.setAttribute('data-beat', String(beat.beat));
      label.setAttribute('data-slot', String(slot));
    }
  });
}
