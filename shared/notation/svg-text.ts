/** Plain text in the notation SVG (sticking, counts, key labels), centred on x by default. */
import type { SVGContext } from 'vexflow/core';

export interface TextStyle {
  readonly size: number;
  readonly weight?: 'normal' | 'bold';
  readonly anchor?: 'start' | 'middle' | 'end';
  /** Degrees, clockwise, around the text's anchor point. */
  readonly rotate?: number;
  /** Opacity (fill and inherited stroke), for text printed lighter than the music. */
  readonly opacity?: number;
}

/** Add a `<text>` to the context's current group. */
export function svgText(
  ctx: SVGContext,
  content: string,
  x: number,
  y: number,
  className: string,
  style: TextStyle,
): SVGTextElement {
  const text = ctx.create('text') as SVGTextElement;
  text.setAttribute('x', round(x));
  text.setAttribute('y', round(y));
  text.setAttribute('class', className);
  text.setAttribute('font-family', 'Academico, serif');
  text.setAttribute('font-size', String(style.size));
  text.setAttribute('font-weight', style.weight ?? 'normal');
  text.setAttribute('text-anchor', style.anchor ?? 'middle');
  text.setAttribute('fill', 'currentColor');
  if (style.opacity !== undefined) text.setAttribute('opacity', String(style.opacity));
  if (style.rotate)
    text.setAttribute('transform', `rotate(${style.rotate} ${round(x)} ${round(y)})`);
  text.textContent = content;
  ctx.add(text);
  return text;
}

function round(n: number): string {
  return String(Math.round(n * 10) / 10);
}

/**
 * A row of short texts (one bar's counting syllables or sticking letters) as one `<text>` with a
 * `<tspan>` per item: the font, size, anchor and colour are set once on the row, not on each of
 * the hundreds of items a dense drill prints (SVG elements and their attributes are most of a
 * score's drawing time).
 */
export class SvgTextRow {
  private readonly row: SVGTextElement;
  private readonly weight: 'normal' | 'bold';
  /** The highest baseline so far, which the row's own `y` states for readers of the SVG. */
  private top = Infinity;

  constructor(ctx: SVGContext, className: string, style: TextStyle) {
    this.row = ctx.create('text') as SVGTextElement;
    this.weight = style.weight ?? 'normal';
    this.row.setAttribute('class', className);
    this.row.setAttribute('font-family', 'Academico, serif');
    this.row.setAttribute('font-size', String(style.size));
    this.row.setAttribute('font-weight', this.weight);
    this.row.setAttribute('text-anchor', style.anchor ?? 'middle');
    this.row.setAttribute('fill', 'currentColor');
    ctx.add(this.row);
  }

  /** One item at (x, y); weight and opacity only where they differ from the row's. */
  add(
    content: string,
    x: number,
    y: number,
    className: string,
    extra: { weight?: 'normal' | 'bold'; opacity?: number } = {},
  ): SVGTSpanElement {
    if (y < this.top) {
      this.top = y;
      this.row.setAttribute('x', round(x));
      this.row.setAttribute('y', round(y));
    }
    const span = this.row.ownerDocument.createElementNS(SVG_NS, 'tspan');
    span.setAttribute('x', round(x));
    span.setAttribute('y', round(y));
    span.setAttribute('class', className);
    if (extra.weight !== undefined && extra.weight !== this.weight)
      span.setAttribute('font-weight', extra.weight);
    if (extra.opacity !== undefined) span.setAttribute('opacity', String(extra.opacity));
    span.textContent = content;
    this.row.append(span);
    return span;
  }
}

const SVG_NS = 'http://www.w3.org/2000/svg';
