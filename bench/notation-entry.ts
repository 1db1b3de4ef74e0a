/** Browser side of `bench/notation.ts`: engraves a drill into the page and times it. */
// The entry that embeds Bravura and Academico: the notation code itself imports VexFlow's core.
import { Formatter, Stave } from 'vexflow/bravura';
import { EngravingContext, withFastEngraving } from '../shared/notation/engraving-context';
import type { NotationSource } from '../shared/notation/notation-model';
import { buildNotation } from '../shared/notation/notation-model';
import { renderNotation } from '../shared/notation/render-vexflow';
import { engraveBar } from '../shared/notation/vexflow-bar';

/** Resolves once the embedded Bravura and Academico fonts have loaded. */
export async function fontsReady(): Promise<void> {
  await document.fonts.ready;
}

function container(): HTMLElement {
  const found =
    document.getElementById('score') ?? document.body.appendChild(document.createElement('div'));
  found.id = 'score';
  return found;
}

/** Milliseconds for one model build + engraving of `drill` at `width` pixels. */
export function timeRender(
  drill: NotationSource,
  width: number,
): { ms: number; bars: number; systems: number } {
  const target = container();
  const start = performance.now();
  const layout = renderNotation(target, buildNotation(drill), {
    width,
    showSticking: true,
    showCounts: true,
    gapBelowSystem: 52,
  });
  const ms = performance.now() - start;
  return { ms, bars: layout.bars.length, systems: new Set(layout.bars.map((b) => b.system)).size };
}

/**
 * The floor: VexFlow drawing the same notes (the same voices, beams, tuplets and note modifiers)
 * with none of our layout: four equal bars a line, no line breaking by content, no key, marks,
 * sticking, counts, brackets or tension marks. It runs with the same engine settings as ours
 * (the drawing context and the speed-ups of `engraving-context.ts`, a detached element attached
 * once), so the difference is what our layout costs. The model is built before the clock starts.
 */
export function timeFloor(drill: NotationSource, width: number): { ms: number } {
  const target = container();
  const model = buildNotation(drill);
  const start = performance.now();
  withFastEngraving(() => {
    const ctx = new EngravingContext(document.createElement('div'));
    const lines = Math.ceil(model.bars.length / 4);
    ctx.resize(width, lines * 200);
    const barWidth = (width - 24) / 4;
    model.bars.forEach((bar, i) => {
      const stave = new Stave(12 + (i % 4) * barWidth, Math.floor(i / 4) * 200 + 40, barWidth);
      if (i % 4 === 0) stave.addClef('percussion');
      stave.setContext(ctx).draw();
      const engraved = engraveBar(bar, model);
      const voices = engraved.voices.map((v) => v.voice);
      new Formatter().joinVoices(voices).formatToStave(voices, stave);
      for (const voice of voices) voice.draw(ctx, stave);
      for (const { beam } of engraved.beams) beam.setContext(ctx).draw();
      for (const { tuplet } of engraved.tuplets) tuplet.setContext(ctx).draw();
    });
    target.replaceChildren(ctx.svg);
  });
  return { ms: performance.now() - start };
}
