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
    const width = Math.ceil(Number.parseFloat(root.getAttribute('width') ?? '')) || 1000;
    const height = Math.ceil(Number.parseFloat(root.getAttribute('height') ?? '')) || 1000;
    for (const text of [...document.getElementsByTagName('text')]) {
      const d = glyphOutline(text, width, height);
      const path = document.createElementNS('http://www.w3.org/2000/svg', 'path');
      if (d) path.setAttribute('d', d);
      for (const name of ['fill', 'class', 'transform', 'opacity']) {
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

/** The path data of one text element's glyphs, in the element's own coordinates. */
function glyphOutline(text: Element, width: number, height: number): string {
  const canvas = createCanvas(width, height, SvgExportFlag.ConvertTextToPaths);
  const context = canvas.getContext('2d');
  const style = inherited(text, 'font-style') ?? 'normal';
  const weight = inherited(text, 'font-weight') ?? 'normal';
  const size = pixels(inherited(text, 'font-size') ?? '10pt');
  const family = inherited(text, 'font-family') ?? 'Bravura,Academico';
  context.font = `${style} ${weight} ${size}px ${family}`;
  const anchor = inherited(text, 'text-anchor');
  context.textAlign = anchor === 'middle' ? 'center' : anchor === 'end' ? 'end' : 'start';
  const x = Number.parseFloat(text.getAttribute('x') ?? '0') || 0;
  const y = Number.parseFloat(text.getAttribute('y') ?? '0') || 0;
  context.fillText(text.textContent ?? '', x, y);
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
