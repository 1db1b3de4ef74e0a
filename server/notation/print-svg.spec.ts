import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { renderDrillSvg } from './render-svg';

const PAINTED = new Set(['path', 'rect', 'text', 'tspan', 'line', 'circle', 'ellipse', 'polygon']);
const HOOK = /^(class|id|role|pointer-events|shadowColor|data-.*|aria-.*)$/;

/**
 * Every painted element in document order, with its text, its own attributes and those of each
 * ancestor (what it inherits), leaving out the hooks no renderer paints with. Two drawings with
 * equal lists paint the same.
 */
function painted(svg: string): string[] {
  const doc = new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document;
  const attributesOf = (el: Element) =>
    [...el.attributes]
      .filter((a) => !HOOK.test(a.name))
      .map((a) => `${a.name}=${a.value}`)
      .join(' ');
  return [...doc.querySelectorAll('*')]
    .filter((el) => PAINTED.has(el.localName))
    .map((el) => {
      const chain: string[] = [];
      for (let at = el.parentElement; at; at = at.parentElement) {
        const own = attributesOf(at);
        if (own) chain.push(`${at.localName}[${own}]`);
      }
      const text =
        el.localName === 'text' ? [...el.childNodes].filter((n) => n.nodeType === 3) : [];
      return `${el.localName}[${attributesOf(el)}]"${text.map((n) => n.textContent).join('')}" < ${chain.join(' < ')}`;
    });
}

describe('renderDrillSvg for print', () => {
  for (const [id, options] of [
    ['quintuplets-hihat-1-3-5', { width: 1100, showSticking: true, showCounts: true }],
    ['four-over-three', { width: 700, showTension: true, title: 'Four over three' }],
    ['six-eight-groove', { width: 1100, showSticking: true, showCounts: true, ink: 'black' }],
  ] as const) {
    it(`${id}: paints the same, without the app's hooks and with far fewer groups`, () => {
      const card = parseRuleCard({ ...(findBuiltInPreset(id)!.card as object), bars: 8 });
      const drill = generateDrill(card, `print-${id}`);
      const full = renderDrillSvg(drill, options).svg;
      const print = renderDrillSvg(drill, options, { forPrint: true }).svg;
      expect(painted(print)).toEqual(painted(full));
      expect(print).not.toMatch(/ (class|id|data-[a-z-]+)="/);
      const groups = (svg: string) => svg.match(/<g[ >/]/g)?.length ?? 0;
      expect(groups(print)).toBeLessThan(groups(full) / 4);
      expect(print.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    }, 60_000);
  }
});
