import { describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { renderDrillSvg } from '../notation/render-svg';
import { SvgDocument, type SvgNode } from '../notation/svg-document';
import { compilePrintDrawing, type TextPiece } from './print-drawing';
import { presetDrill } from './testing/sample-print';

const NS = 'http://www.w3.org/2000/svg';

function svg(attrs: Record<string, string>, ...children: (SvgNode | string)[]): SvgNode {
  return element(
    'svg',
    { width: '100', height: '50', viewBox: '0 0 100 50', ...attrs },
    ...children,
  );
}

function element(
  name: string,
  attrs: Record<string, string>,
  ...children: (SvgNode | string)[]
): SvgNode {
  const node = new SvgDocument().createElementNS(NS, name);
  for (const [key, value] of Object.entries(attrs)) node.setAttribute(key, value);
  node.append(...children);
  return node;
}

function pieces(root: SvgNode): TextPiece[] {
  return compilePrintDrawing(root).items.flatMap((i) => (i.kind === 'text' ? i.pieces : []));
}

function ops(root: SvgNode): string {
  return compilePrintDrawing(root)
    .items.map((i) => (i.kind === 'ops' ? i.ops : ''))
    .join('\n');
}

describe('compilePrintDrawing', () => {
  it('fills, strokes or both as the inherited paint says, with SVG’s defaults', () => {
    // SVG 1.1 §11.2–11.4: fill black, stroke none and stroke-width 1 initially, all inherited.
    const root = svg(
      { stroke: 'black' },
      element('rect', { x: '1', y: '2', width: '3', height: '4', stroke: 'none' }),
      element('path', { d: 'M0 0L10 0', fill: 'none', 'stroke-width': '1.5' }),
      element('g', { fill: '#ff0000' }, element('path', { d: 'M0 0L5 5L0 5Z' })),
    );
    expect(ops(root)).toContain('/DeviceRGB cs 0 0 0 scn\n1 2 3 4 re\nf');
    expect(ops(root)).toContain('/DeviceRGB CS 0 0 0 SCN 1.5 w [] 0 d\n0 0 m 10 0 l\nS');
    expect(ops(root)).toContain(
      '/DeviceRGB cs 1 0 0 scn\n/DeviceRGB CS 0 0 0 SCN 1 w [] 0 d\n0 0 m 5 5 l 0 5 l h\nB',
    );
  });

  it('applies a group’s translate and scale to what it holds, and clips to the viewBox', () => {
    const root = svg(
      {},
      element(
        'g',
        { transform: 'translate(1219.2 0) scale(0.7)' },
        element('rect', { x: '0', y: '0', width: '1', height: '1' }),
      ),
    );
    expect(ops(root)).toMatch(
      /0 0 100 50 re W n[\s\S]*q 0.7 0 0 0.7 1219.2 0 cm[\s\S]*re\nf\nQ\nQ$/,
    );
  });

  it('reads text sizes in pt as 4/3 of a unit and finds each run’s font, anchor and place', () => {
    const root = svg(
      { 'font-family': 'Bravura,Academico', 'font-size': '10pt' },
      element(
        'text',
        { x: '20', y: '30', 'text-anchor': 'middle', 'font-weight': 'bold' },
        element('tspan', { x: '20', y: '30' }, 'R'),
        element('tspan', { x: '40', y: '30', opacity: '0.55', 'font-size': '15' }, 'e'),
      ),
    );
    const [r, e] = pieces(root);
    expect(r).toMatchObject({ family: 'Bravura,Academico', bold: true, x: 20 });
    expect(r!.size * 0.75).toBeCloseTo(10);
    expect(e).toMatchObject({ size: 15, x: 40, y: 30, anchor: 'middle', text: 'e' });
    // A lighter count: the tspan's opacity goes into its paint.
    expect(e!.fill).toEqual({ rgb: '0 0 0', opacity: 0.55 });
    expect(r!.fill).toEqual({ rgb: '0 0 0', opacity: 1 });
  });

  it('collapses white space as SVG does without xml:space', () => {
    // SVG 1.1 §10.15: drop newlines, tabs to spaces, strip leading and trailing spaces, and
    // consolidate runs of spaces into one.
    const root = svg(
      {},
      element(
        'text',
        { x: '0', y: '0' },
        element('tspan', {}, '  \u{E1D5}'),
        element('tspan', { 'font-family': 'Academico' }, '  = \n 76  '),
      ),
    );
    expect(pieces(root).map((p) => p.text)).toEqual(['\u{E1D5}', ' = 76']);
  });

  it('refuses what it does not know how to print', () => {
    expect(() => compilePrintDrawing(svg({}, element('circle', { r: '1' })))).toThrow(/circle/);
    expect(() => compilePrintDrawing(svg({}, element('path', { d: 'M0 0', filter: 'x' })))).toThrow(
      /filter/,
    );
    expect(() => compilePrintDrawing(svg({}, element('g', { transform: 'rotate(3)' })))).toThrow(
      /transform/,
    );
    expect(() =>
      compilePrintDrawing(
        svg({}, element('rect', { width: '1', height: '1', fill: 'rgb(1,2,3)' })),
      ),
    ).toThrow(/colour/);
  });

  it('compiles every built-in preset’s print engraving, shape for shape', () => {
    for (const preset of BUILT_IN_PRESETS) {
      const drill = presetDrill(preset.id, 4, 'compile-1').drill;
      const { svg: markup, tree } = renderDrillSvg(
        drill,
        {
          width: 1100,
          showSticking: true,
          showCounts: true,
          showLegend: true,
          showMarks: true,
          ink: 'black',
        },
        { forPrint: true },
      );
      const drawing = compilePrintDrawing(tree);
      // Every path and rectangle of the markup is painted once (each ends in f, S or B).
      const shapes = (markup.match(/<(path|rect)\b/g) ?? []).length;
      const painted = drawing.items
        .flatMap((i) => (i.kind === 'ops' ? i.ops.split('\n') : []))
        .filter((op) => op === 'f' || op === 'S' || op === 'B').length;
      const empty = (markup.match(/ d="M[\d.-]+ [\d.-]+"/g) ?? []).length;
      expect(painted, preset.id).toBe(shapes - empty);
      // Every non-blank text node comes out as a run.
      const texts = [...markup.matchAll(/>([^<]+)</g)].filter((m) => m[1]!.trim() !== '').length;
      expect(pieces(tree).length, preset.id).toBe(texts);
    }
  }, 120_000);
});
