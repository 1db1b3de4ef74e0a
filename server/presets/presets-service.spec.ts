import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { renderDrillSvg } from '../notation/render-svg';
import { outlineText } from './outline-text';
import { engraveThumbnail } from './presets-service';

const drill = () => {
  const card = parseRuleCard(findBuiltInPreset('early-backbeat')!.card);
  const full = generateDrill(card, 'early-backbeat');
  return { ...full, bars: full.bars.slice(0, 2) };
};

const parse = (svg: string) =>
  new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document.documentElement;

describe('engraveThumbnail', () => {
  it('draws the bars as a standalone SVG that needs no font', async () => {
    const svg = await engraveThumbnail(drill());
    const root = parse(svg);
    expect(root.namespaceURI).toBe('http://www.w3.org/2000/svg');
    expect(root.getElementsByTagName('text')).toHaveLength(0);
    expect(root.getElementsByTagName('path').length).toBeGreaterThan(10);
  });
});

describe('outlineText', () => {
  it('turns each glyph into a path where the text stood', () => {
    const { svg } = renderDrillSvg(drill(), { width: 480, showLegend: false, showMarks: false });
    const texts = [...parse(svg).getElementsByTagName('text')];
    expect(texts.length).toBeGreaterThan(0);
    const paths = parse(svg).getElementsByTagName('path').length;
    const outlined = parse(outlineText(svg));
    expect(outlined.getElementsByTagName('text')).toHaveLength(0);
    expect(outlined.getElementsByTagName('path')).toHaveLength(paths + texts.length);
    // The first glyph's outline starts near where its text was placed (within one staff space).
    const x = Number(texts[0]!.getAttribute('x'));
    const firstGlyph = [...outlined.getElementsByTagName('path')].find(
      (p) => Math.abs(Number(/^M\s*([-\d.]+)/.exec(p.getAttribute('d') ?? '')?.[1]) - x) < 10,
    );
    expect(firstGlyph).toBeDefined();
  });
});
