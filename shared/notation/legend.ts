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
} from 'vexflow/bravura';
import type { NotationModel } from './notation-model';
import { STAFF_PLACEMENTS, vexKeyOf } from './staff-placement';
import { svgText } from './svg-text';

const PER_VOICE = 26;
const CLEF_ROOM = 44;
const GAP_AFTER = 22;

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
  const labelY = stave.getYForLine(4) + 52;
  notes.forEach((note, i) => {
    const label = STAFF_PLACEMENTS[model.voices[i]!].label;
    const cx = note.getAbsoluteX() + note.getGlyphWidth() / 2;
    svgText(ctx, label, cx, labelY, 'tensile-legend-label', {
      size: 12,
      anchor: 'start',
      rotate: 55,
    });
  });
  ctx.closeGroup();
}
