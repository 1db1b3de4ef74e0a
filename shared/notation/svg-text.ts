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
