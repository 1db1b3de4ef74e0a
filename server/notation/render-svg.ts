/**
 * Server-side engraving: a drill as a standalone SVG string (for PDF worksheets), drawn by the
 * same VexFlow code as the browser, in a jsdom document.
 *
 * jsdom cannot measure text, and VexFlow lays out by measured glyph widths, so the Bravura and
 * Academico fonts are registered with @napi-rs/canvas and VexFlow measures with that canvas.
 */
import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts } from '@napi-rs/canvas';
import { JSDOM } from 'jsdom';
import { Element as VexElement } from 'vexflow/bravura';
import { buildNotation, type NotationSource } from '../../shared/notation/notation-model';
import {
  renderNotation,
  type NotationLayout,
  type RenderOptions,
} from '../../shared/notation/render-vexflow';

const require = createRequire(import.meta.url);
let fontsReady = false;

/** Register the music and text fonts for measuring, once per process. */
function prepareFonts(): void {
  if (fontsReady) return;
  GlobalFonts.registerFromPath(require.resolve('@vexflow-fonts/bravura/bravura.otf'), 'Bravura');
  GlobalFonts.registerFromPath(
    require.resolve('@vexflow-fonts/academico/academico.otf'),
    'Academico',
  );
  GlobalFonts.registerFromPath(
    require.resolve('@vexflow-fonts/academico/academico-bold.otf'),
    'Academico',
  );
  VexElement.setTextMeasurementCanvas(createCanvas(400, 200) as unknown as HTMLCanvasElement);
  fontsReady = true;
}

export interface SvgRender {
  readonly svg: string;
  readonly layout: Omit<NotationLayout, 'svg'>;
}

/** Engrave a drill to an SVG document string. */
export function renderDrillSvg(
  drill: NotationSource,
  options: RenderOptions = { width: 1000, showSticking: true, showCounts: true },
): SvgRender {
  prepareFonts();
  const dom = new JSDOM('<!doctype html><html><body><div id="score"></div></body></html>');
  const { document } = dom.window;
  const global = globalThis as { document?: Document };
  const previous = global.document;
  // VexFlow's SVG context creates its elements through the global `document`.
  global.document = document;
  try {
    const container = document.getElementById('score') as HTMLElement;
    const { svg, ...layout } = renderNotation(container, buildNotation(drill), options);
    // XMLSerializer writes the SVG namespace declaration (innerHTML would drop it).
    return { svg: new dom.window.XMLSerializer().serializeToString(svg), layout };
  } finally {
    if (previous === undefined) delete global.document;
    else global.document = previous;
    dom.window.close();
  }
}
