import { createCanvas, SvgExportFlag } from '@napi-rs/canvas';
import { JSDOM } from 'jsdom';

/**
 * Replaces every `<text>` of an engraved SVG with the outline of its glyphs, drawn by the same
 * registered fonts (Bravura, Academico) the engraving measured with. The result needs no font:
 * an `<img>` of it shows noteheads, clefs and digits on a page that never loaded the music font
 * (an SVG shown as an image cannot load fonts of its own).
 */
export function outlineText(svg: string): string {
  const dom = new JSDOM(svg, { contentType: 'image/svg+xml' });
  const document = dom.window.document;
  try {
    const root = document.documentElement;
    // A score repeats few glyphs many times: each is outlined once, at the origin, and placed.
    const outlines = new Map<string, string>();
    for (const text of [...document.getElementsByTagName('text')]) {
      const font = fontOf(text);
      const content = text.textContent ?? '';
      const key = `${font.css}|${font.align}|${content}`;
      let d = outlines.get(key);
      if (d === undefined) {
        d = glyphOutline(font, content);
        outlines.set(key, d);
      }
      const x = Number.parseFloat(text.getAttribute('x') ?? '0') || 0;
      const y = Number.parseFloat(text.getAttribute('y') ?? '0') || 0;
      const path = document.createElementNS('http://www.w3.org/2000/svg', 'path');
      if (d) path.setAttribute('d', d);
      const own = text.getAttribute('transform');
      path.setAttribute('transform', `${own ? `${own} ` : ''}translate(${x} ${y})`);
      for (const name of ['fill', 'class', 'opacity']) {
        const value = text.getAttribute(name);
        if (value !== null) path.setAttribute(name, value);
      }
      text.replaceWith(path);
    }
    return new dom.window.XMLSerializer().serializeToString(root);
  } finally {
    dom.window.close();
  }
}

interface Font {
  readonly css: string;
  readonly align: 'start' | 'center' | 'end';
}

/** The font a text element draws with, from its own or inherited attributes. */
function fontOf(text: Element): Font {
  const style = inherited(text, 'font-style') ?? 'normal';
  const weight = inherited(text, 'font-weight') ?? 'normal';
  const size = pixels(inherited(text, 'font-size') ?? '10pt');
  const family = inherited(text, 'font-family') ?? 'Bravura,Academico';
  const anchor = inherited(text, 'text-anchor');
  const align = anchor === 'middle' ? 'center' : anchor === 'end' ? 'end' : 'start';
  return { css: `${style} ${weight} ${size}px ${family}`, align };
}

/**
 * The path data of a text drawn at the origin. The canvas only records paths, so its size does
 * not clip them; glyph parts above the baseline come out with negative y.
 */
function glyphOutline(font: Font, content: string): string {
  const canvas = createCanvas(1, 1, SvgExportFlag.ConvertTextToPaths);
  const context = canvas.getContext('2d');
  context.font = font.css;
  context.textAlign = font.align;
  context.fillText(content, 0, 0);
  const drawn = canvas.getContent().toString();
  return [...drawn.matchAll(/<path[^>]*\sd="([^"]*)"/g)].map((m) => m[1]).join(' ');
}

/** An attribute on the element or the nearest ancestor that sets it. */
function inherited(element: Element, name: string): string | undefined {
  for (let at: Element | null = element; at; at = at.parentElement) {
    const value = at.getAttribute(name);
    if (value !== null && value !== '') return value;
  }
  return undefined;
}

/** A CSS font size in pixels (`30pt` is 40 px: 1 pt = 4/3 px). */
function pixels(size: string): number {
  const value = Number.parseFloat(size);
  if (!Number.isFinite(value)) return 13.333;
  return size.trim().endsWith('pt') ? (value * 4) / 3 : value;
}
