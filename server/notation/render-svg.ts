/**
 * Server-side engraving: a drill as a standalone SVG string (for PDF worksheets), drawn by the
 * same VexFlow code as the browser, into a minimal string-building SVG document (svg-document.ts;
 * a spec checks it writes what a full DOM, jsdom, writes).
 *
 * There is no DOM to measure text, and VexFlow lays out by measured glyph widths, so the Bravura
 * and Academico fonts are registered with @napi-rs/canvas and VexFlow measures with that canvas.
 */
import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts } from '@napi-rs/canvas';
import { Element as VexElement } from 'vexflow/bravura';
import { buildNotation, type NotationSource } from '../../shared/notation/notation-model';
import {
  renderNotation,
  type NotationLayout,
  type RenderOptions,
} from '../../shared/notation/render-vexflow';
import { simplifyForPrint } from './print-svg';
import { SvgDocument, type SvgNode } from './svg-document';

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

/** VexFlow's first automatic element id (`Element.ID` starts there). */
const FIRST_ELEMENT_ID = 1000;

/**
 * VexFlow numbers its elements (`id="vf-auto…"`) from one counter per process, so without this
 * the same drill would be written differently depending on what the process drew before (a
 * thumbnail drawn in a worker would not match one drawn here). Drawing is synchronous, so no
 * other drawing can interleave.
 */
function restartElementIds(): void {
  (VexElement as unknown as { ID: number }).ID = FIRST_ELEMENT_ID;
}

export interface SvgRender {
  readonly svg: string;
  readonly layout: Omit<NotationLayout, 'svg'>;
  /** The drawing's element tree, for a renderer that need not parse `svg` again. */
  readonly tree: SvgNode;
}

/**
 * Engrave a drill to an SVG document string. `forPrint` leaves out the app's hooks (classes,
 * ids, data attributes) and the groups that only held them (see print-svg.ts).
 */
export function renderDrillSvg(
  drill: NotationSource,
  options: RenderOptions = { width: 1000, showSticking: true, showCounts: true },
  { forPrint = false }: { readonly forPrint?: boolean } = {},
): SvgRender {
  prepareFonts();
  restartElementIds();
  const document = new SvgDocument();
  const global = globalThis as { document?: unknown };
  const previous = global.document;
  // VexFlow's SVG context creates its elements through the global `document`.
  global.document = document;
  try {
    const container = document.createElement('div') as unknown as HTMLElement;
    const { svg, ...layout } = renderNotation(container, buildNotation(drill), options);
    const root = svg as unknown as SvgNode;
    if (forPrint) simplifyForPrint(root);
    return { svg: root.serialize(), layout, tree: root };
  } finally {
    if (previous === undefined) delete global.document;
    else global.document = previous;
  }
}
