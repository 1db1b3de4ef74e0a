import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { buildNotation } from '../../shared/notation/notation-model';
import { renderNotation, type RenderOptions } from '../../shared/notation/render-vexflow';
import { renderDrillSvg } from './render-svg';
import { SvgDocument } from './svg-document';

const SVG_NS = 'http://www.w3.org/2000/svg';

/** The same engraving in a full DOM (jsdom), serialised by its XMLSerializer: the oracle. */
function jsdomSvg(drill: Parameters<typeof buildNotation>[0], options: RenderOptions): string {
  const dom = new JSDOM('<!doctype html><html><body><div id="score"></div></body></html>');
  const global = globalThis as { document?: unknown };
  const previous = global.document;
  global.document = dom.window.document;
  try {
    const container = dom.window.document.getElementById('score') as HTMLElement;
    const { svg } = renderNotation(container, buildNotation(drill), options);
    return new dom.window.XMLSerializer().serializeToString(svg);
  } finally {
    global.document = previous;
    if (previous === undefined) delete global.document;
    dom.window.close();
  }
}

/** VexFlow numbers its elements from a process-wide counter: number them from 1 in order. */
function renumbered(svg: string): string {
  const ids = new Map<string, number>();
  return svg.replace(/vf-auto\d+/g, (id) => {
    if (!ids.has(id)) ids.set(id, ids.size + 1);
    return `vf-id${ids.get(id)}`;
  });
}

describe('SvgDocument', () => {
  it('writes a standalone SVG element with its namespace once, attributes in order, escaped', () => {
    const doc = new SvgDocument();
    const svg = doc.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('width', 10);
    svg.setAttributeNS(null, 'data-note', 'a<b & "c"\n');
    svg.setAttribute('width', 12);
    const text = doc.createElementNS(SVG_NS, 'text');
    text.textContent = 'x < y & z';
    svg.appendChild(text);
    svg.append(doc.createElementNS(SVG_NS, 'g'));
    svg.classList.add('one');
    svg.classList.add('two', 'one');
    expect(svg.serialize()).toBe(
      '<svg xmlns="http://www.w3.org/2000/svg" width="12" data-note="a&lt;b &amp; &quot;c&quot;&#xA;"' +
        ' class="one two"><text>x &lt; y &amp; z</text><g/></svg>',
    );
  });

  it('finds, removes and replaces children as a DOM does', () => {
    const doc = new SvgDocument();
    const root = doc.createElementNS(SVG_NS, 'svg');
    const group = doc.createElementNS(SVG_NS, 'g');
    root.appendChild(group);
    const hidden = doc.createElementNS(SVG_NS, 'rect');
    hidden.setAttribute('opacity', '0');
    const shown = doc.createElementNS(SVG_NS, 'rect');
    group.append(hidden, shown);
    expect(root.querySelectorAll('rect[opacity="0"]')).toEqual([hidden]);
    hidden.remove();
    expect(group.childNodes).toEqual([shown]);
    expect(root.lastChild).toBe(group);
    // Appending moves a node from its old parent.
    root.appendChild(shown);
    expect(group.childNodes).toEqual([]);
    const host = doc.createElement('div');
    host.replaceChildren(root);
    expect(root.parentNode).toBe(host);
    expect(host.nodeName).toBe('DIV');
  });

  it('refuses what it does not implement rather than writing wrong notation', () => {
    const doc = new SvgDocument();
    const node = doc.createElementNS(SVG_NS, 'g');
    expect(() => node.querySelectorAll('g > rect')).toThrow(/unsupported selector/);
    expect(() => (node.style.font = 'small-caps 10pt/12pt serif')).toThrow(/not supported/);
    expect(() => doc.createElementNS('http://www.w3.org/1999/xhtml', 'div')).toThrow();
  });

  it('reads a CSS font shorthand back as a DOM does', () => {
    const dom = new JSDOM('').window.document;
    const doc = new SvgDocument();
    for (const font of [
      '30pt Bravura,Academico',
      'italic bold 12pt Academico, serif',
      'bold 10pt Bravura',
      'normal normal 10.5pt Bravura',
      'oblique 600 9px x',
    ]) {
      const theirs = dom.createElement('span').style;
      theirs.font = font;
      const ours = doc.createElement('span').style;
      ours.font = font;
      const fields = (s: {
        fontFamily: string;
        fontSize: string;
        fontWeight: string;
        fontStyle: string;
      }) => [s.fontFamily, s.fontSize, s.fontWeight, s.fontStyle];
      expect(fields(ours), font).toEqual(fields(theirs));
    }
  });
});

describe('renderDrillSvg writes what a full DOM writes', () => {
  const optionSets: readonly RenderOptions[] = [
    {
      width: 1100,
      showSticking: true,
      showCounts: true,
      showLegend: true,
      showMarks: true,
      ink: 'black',
    },
    { width: 480, showLegend: false, showMarks: false, showTension: true, title: 'Tom & "fills"' },
  ];
  // Every built-in preset (straight, swung, tuplets, 4:3, compound and odd meters).
  for (const preset of BUILT_IN_PRESETS) {
    it(`${preset.id}: byte for byte, up to VexFlow's running ids`, () => {
      const card = parseRuleCard({ ...(preset.card as object), bars: 4 });
      const drill = generateDrill(card, `same-${preset.id}`);
      for (const options of optionSets) {
        const ours = renderDrillSvg(drill, options).svg;
        expect(renumbered(ours)).toBe(renumbered(jsdomSvg(drill, options)));
      }
    }, 60_000);
  }
});
