/**
 * The voice key drawn above the first system: a "Key" heading, then each voice of the drill
 * once, its notehead on a short piece of staff (no clef, no bar lines) with its name beside it,
 * on one compact line (two or more on a narrow page). A key set like a bar of music (a clef, a
 * full-width staff, notes in a row) is read as an extra bar; a short fragment per voice is how
 * a part's instrument key is usually shown (common practice), and it still tells the voices
 * apart by position, notehead and stem direction, without colour.
 */
import {
  BarlineType,
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

/**
 * The key is drawn at this share of the music's size: a compact line that reads as a caption,
 * not as music, and takes no more height than the tempo mark beside it.
 */
const KEY_SCALE = 0.7;
/** Width of the staff fragment under each voice's notehead. */
const FRAGMENT = 30;
const LABEL_SIZE = 15;
const HEADING_SIZE = 16;
/** Average advance of the key's font per character, as a share of its size (a safe over-estimate). */
const CHAR_WIDTH = 0.56;
/** Space between a fragment and its name, and after each name. */
const LABEL_GAP = 6;
const ITEM_GAP = 18;
/** The heading's width ("Key", bold) and the space after it. */
const HEADING_ROOM = 44;
/**
 * Height of one line of the key: the fragment's staff (4 spaces) with room above for a crash's
 * ledger line. The heads stand without stems: the key names positions and noteheads, and stems
 * would double its height.
 */
/** The most one key line takes. */
const ROW_HEIGHT = 64;
/** Pixels a staff step (half a space) takes, and the steps from the middle to the top line. */
const STEP = 5;
const TOP_STEPS = 4;

/**
 * The room a key line needs above its top line and under its bottom line: only as much as its
 * highest and lowest heads take (a crash's ledger line above, a pedal under), so a key of voices
 * on the staff stays a slim line.
 */
function rowMetrics(model: NotationModel): { top: number; height: number } {
  const positions = model.voices.map((v) => STAFF_PLACEMENTS[v].position);
  const above = Math.max(0, (Math.max(...positions) - TOP_STEPS) * STEP + STEP) + 2;
  const below = Math.max(0, (-TOP_STEPS - Math.min(...positions)) * STEP + STEP) + 2;
  return { top: above, height: Math.min(ROW_HEIGHT, above + 8 * STEP + below) };
}
/** VexFlow places a stave's top line this far under its y. */
const STAVE_TOP_OFFSET = 40;

interface KeyItem {
  readonly voice: NotationModel['voices'][number];
  readonly label: string;
  readonly width: number;
}

function itemsOf(model: NotationModel): KeyItem[] {
  return model.voices.map((voice) => {
    const label = STAFF_PLACEMENTS[voice].label;
    const width = FRAGMENT + LABEL_GAP + label.length * LABEL_SIZE * CHAR_WIDTH + ITEM_GAP;
    return { voice, label, width };
  });
}

/** The key's items on lines that fit `width` (the heading opens the first line). */
function linesOf(model: NotationModel, width: number): KeyItem[][] {
  const lines: KeyItem[][] = [[]];
  let used = HEADING_ROOM;
  for (const item of itemsOf(model)) {
    const line = lines[lines.length - 1]!;
    if (line.length > 0 && used + item.width > width) {
      lines.push([item]);
      used = HEADING_ROOM + item.width;
    } else {
      line.push(item);
      used += item.width;
    }
  }
  return lines;
}

/** Width of the key set on one line. */
export function legendLineWidth(model: NotationModel): number {
  return (
    KEY_SCALE * (itemsOf(model).reduce((sum, item) => sum + item.width, HEADING_ROOM) - ITEM_GAP)
  );
}

/** Height the key takes on a line `width` pixels wide. */
export function legendHeight(model: NotationModel, width: number): number {
  return KEY_SCALE * linesOf(model, width / KEY_SCALE).length * rowMetrics(model).height;
}

/** Draw the key in the band from (x, top), `width` pixels wide. */
export function drawLegend(
  ctx: SVGContext,
  model: NotationModel,
  x: number,
  top: number,
  width: number,
  ink: string,
): void {
  const group = ctx.openGroup();
  group.setAttribute('class', 'tensile-legend');
  group.setAttribute(
    'aria-label',
    `Voice key: ${model.voices.map((v) => STAFF_PLACEMENTS[v].label).join(', ')}`,
  );
  const scaled = ctx.openGroup();
  scaled.setAttribute('transform', `translate(${x} ${top}) scale(${KEY_SCALE})`);
  x = 0;
  top = 0;
  linesOf(model, width / KEY_SCALE).forEach((line, row) => {
    const metrics = rowMetrics(model);
    const lineTop = top + row * metrics.height;
    const middle = lineTop + metrics.top + 20;
    if (row === 0) {
      const heading = svgText(ctx, 'Key', x, middle + 5, 'tensile-legend-heading', {
        size: HEADING_SIZE,
        weight: 'bold',
        anchor: 'start',
      });
      heading.setAttribute('font-style', 'italic');
    }
    let itemX = x + HEADING_ROOM;
    for (const item of line) {
      drawItem(ctx, item, itemX, lineTop + metrics.top - STAVE_TOP_OFFSET, ink);
      svgText(ctx, item.label, itemX + FRAGMENT + LABEL_GAP, middle + 4, 'tensile-legend-label', {
        size: LABEL_SIZE,
        anchor: 'start',
      });
      itemX += item.width;
    }
  });
  ctx.closeGroup();
  ctx.closeGroup();
}

/** One voice's notehead on its own staff fragment, without a stem. */
function drawItem(ctx: SVGContext, item: KeyItem, x: number, staveY: number, ink: string): void {
  const placement = STAFF_PLACEMENTS[item.voice];
  const stave = new Stave(x, staveY, FRAGMENT, { leftBar: false, rightBar: false });
  stave.setBegBarType(BarlineType.NONE).setEndBarType(BarlineType.NONE);
  stave.setStyle({ strokeStyle: ink, fillStyle: ink });
  stave.setDefaultLedgerLineStyle({ strokeStyle: ink, lineWidth: 2 });
  stave.setContext(ctx).draw();
  const note = new StaveNote({
    keys: [vexKeyOf(item.voice)],
    duration: 'q',
    clef: 'percussion',
    stemDirection: placement.stem === 'up' ? Stem.UP : Stem.DOWN,
  });
  note.getStem()?.setVisibility(false);
  if (placement.mark === 'open') note.addModifier(new Ornament('plungerOpen'));
  const voice = new Voice({ numBeats: 1, beatValue: 4 }).setMode(VoiceMode.SOFT);
  voice.addTickables([note]);
  new Formatter().joinVoices([voice]).formatToStave([voice], stave);
  voice.draw(ctx, stave);
}
