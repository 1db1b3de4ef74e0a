/**
 * The voice key drawn beside the first system: each voice of the drill once, on its own line or
 * space, with its notehead, stem direction and name, so the reader can tell voices apart by
 * position and notehead, as in print, without colour.
 */
import {
  Formatter,
  Ornament,
  Stave,
  StaveNote,
  Stem,
  SVGContext,
  Voice,
  VoiceMode,
} from 'vexflow/core';
import type { NotationModel } from './notation-model';
import { STAFF_PLACEMENTS, vexKeyOf } from './staff-placement';
import { svgText } from './svg-text';

const PER_VOICE = 30;
const CLEF_ROOM = 44;
const GAP_AFTER = 22;
const LABEL_SIZE = 12;
/** First label baseline under the bottom line: clear of the kick's down-stem. */
const LABEL_DROP = 50;
const LABEL_ROW = 14;
/** Average advance of the key's font per character, as a share of its size (a safe over-estimate). */
const CHAR_WIDTH = 0.56;
const LABEL_GAP = 6;

/** Width the key takes, including the gap before the first bar. */
export function legendWidth(model: NotationModel): number {
  return CLEF_ROOM + model.voices.length * PER_VOICE + GAP_AFTER;
}

/** Draw the key with its stave at (x, staveY). */
export function drawLegend(
  ctx: SVGContext,
  model: NotationModel,
  x: number,
  staveY: number,
  ink: string,
): void {
  const width = legendWidth(model) - GAP_AFTER;
  const group = ctx.openGroup();
  group.setAttribute('class', 'tensile-legend');
  group.setAttribute(
    'aria-label',
    `Voice key: ${model.voices.map((v) => STAFF_PLACEMENTS[v].label).join(', ')}`,
  );
  const stave = new Stave(x, staveY, width).addClef('percussion');
  stave.setStyle({ strokeStyle: ink, fillStyle: ink });
  stave.setDefaultLedgerLineStyle({ strokeStyle: ink, lineWidth: 2 });
  stave.setContext(ctx).draw();
  const notes = model.voices.map((voice) => {
    const placement = STAFF_PLACEMENTS[voice];
    const note = new StaveNote({
      keys: [vexKeyOf(voice)],
      duration: 'q',
      clef: 'percussion',
      stemDirection: placement.stem === 'up' ? Stem.UP : Stem.DOWN,
    });
    if (placement.mark === 'open') note.addModifier(new Ornament('plungerOpen'));
    return note;
  });
  const voice = new Voice({ numBeats: notes.length, beatValue: 4 }).setMode(VoiceMode.SOFT);
  voice.addTickables(notes);
  new Formatter().joinVoices([voice]).formatToStave([voice], stave);
  voice.draw(ctx, stave);
  const labels = placeLabels(
    notes.map((note, i) => ({
      text: STAFF_PLACEMENTS[model.voices[i]!].label,
      x: note.getAbsoluteX() + note.getGlyphWidth() / 2,
    })),
    x,
    x + legendWidth(model) - LABEL_GAP,
  );
  const firstRowY = stave.getYForLine(4) + LABEL_DROP;
  for (const label of labels) {
    svgText(ctx, label.text, label.x, firstRowY + label.row * LABEL_ROW, 'tensile-legend-label', {
      size: LABEL_SIZE,
    });
  }
  ctx.closeGroup();
}

interface PlacedLabel {
  readonly text: string;
  /** Centre of the label. */
  readonly x: number;
  readonly row: number;
}

/**
 * Upright labels centred under their noteheads, kept inside [left, right]; a label that would
 * touch its left neighbour drops to the first row where it fits, so names never overlap and
 * read without tilting the head.
 */
function placeLabels(
  labels: readonly { readonly text: string; readonly x: number }[],
  left: number,
  right: number,
): PlacedLabel[] {
  const rowEnds: number[] = [];
  return labels.map(({ text, x }) => {
    const half = (text.length * LABEL_SIZE * CHAR_WIDTH) / 2;
    const cx = Math.min(Math.max(x, left + half), right - half);
    let row = rowEnds.findIndex((end) => end + LABEL_GAP <= cx - half);
    if (row === -1) row = rowEnds.length;
    rowEnds[row] = cx + half;
    return { text, x: cx, row };
  });
}
