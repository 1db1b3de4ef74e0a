/** Browser side of `bench/notation.ts`: engraves a drill into the page and times it. */
import type { NotationSource } from '../shared/notation/notation-model';
import { buildNotation } from '../shared/notation/notation-model';
import { renderNotation } from '../shared/notation/render-vexflow';

/** Resolves once the embedded Bravura and Academico fonts have loaded. */
export async function fontsReady(): Promise<void> {
  await document.fonts.ready;
}

/** Milliseconds for one model build + engraving of `drill` at `width` pixels. */
export function timeRender(
  drill: NotationSource,
  width: number,
): { ms: number; bars: number; systems: number } {
  const container =
    document.getElementById('score') ?? document.body.appendChild(document.createElement('div'));
  container.id = 'score';
  const start = performance.now();
  const layout = renderNotation(container, buildNotation(drill), {
    width,
    showSticking: true,
    showCounts: true,
    gapBelowSystem: 52,
  });
  const ms = performance.now() - start;
  return { ms, bars: layout.bars.length, systems: new Set(layout.bars.map((b) => b.system)).size };
}
