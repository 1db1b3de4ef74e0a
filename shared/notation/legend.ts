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

/** Width of the staff fragment under each voice's notehead. */
const FRAGMENT = 30;
const LABEL_SIZE = 12;
const HEADING_SIZE = 13;
/** Average advance of the key's font per character, as a share of its size (a safe over-estimate). */
const CHAR_WIDTH = 0.56;
/** Space between a fragment and its name, and after each name. */
const LABEL_GAP = 6;
const ITEM_GAP = 18;
/** The heading's width ("Key", bold) and the space after it. */
const HEADING_ROOM = 44;
/**
 * Height of one line of the key: the fragment's staff (4 spaces) with room above for a crash's
 * ledger line and an up-stem, and below for the kick's down-stem.
 */
const ROW_HEIGHT = 104;
/** The fragment's top line lies this far under its line's top. */
const TOP_LINE = 44;
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

/** Height the key takes on a line `width` pixels wide. */
export function legendHeight(model: NotationModel, width: number): number {
  return linesOf(model, width).length * ROW_HEIGHT;
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
  linesOf(model, width).forEach((line, row) => {
    const lineTop = top + row * ROW_HEIGHT;
    const middle = lineTop + TOP_LINE + 20;
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
      drawItem(ctx, item, itemX, lineTop + TOP_LINE - STAVE_TOP_OFFSET, ink);
      svgText(ctx, item.label, itemX + FRAGMENT + LABEL_GAP, middle + 4, 'tensile-legend-label', {
        size: LABEL_SIZE,
        anchor: 'start',
      });
      itemX += item.width;
    }
  });
  ctx.closeGroup();
}

/** One voice's notehead on its own staff fragment, stem as in the music. */
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
  if (placement.mark === 'open') note.addModifier(new Ornament('plungerOpen'));
  const voice = new Voice({ numBeats: 1, beatValue: 4 }).setMode(VoiceMode.SOFT);
  voice.addTickables([note]);
  new Formatter().joinVoices([voice]).formatToStave([voice], stave);
  voice.draw(ctx, stave);
}
