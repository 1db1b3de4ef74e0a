/** Browser side of the notation geometry checks: engraves a drill into the page. */
// The entry that embeds Bravura and Academico: the notation code itself imports VexFlow's core.
import 'vexflow/bravura';
import { buildNotation, type NotationSource } from '../../shared/notation/notation-model';
import { renderNotation, type RenderOptions } from '../../shared/notation/render-vexflow';

/** Resolves once the embedded Bravura and Academico fonts have loaded. */
export async function fontsReady(): Promise<void> {
  await document.fonts.ready;
}

/** Engrave `drill` into `#score` (replacing what was there); returns the layout without the SVG. */
export function engrave(drill: NotationSource, options: RenderOptions): { height: number } {
  const container =
    document.getElementById('score') ?? document.body.appendChild(document.createElement('div'));
  container.id = 'score';
  const { height } = renderNotation(container, buildNotation(drill), options);
  return { height };
}
