/**
 * "Show the tension": the notes that make a bar tense (see `syncopatedInstants`) are printed in
 * a colour and with a small triangle under the staff, and a one-line key says what the triangle
 * means, so the mark never depends on colour alone.
 */
import type { SVGContext } from 'vexflow/core';
import type { NotationBar } from './notation-model';
import { svgText } from './svg-text';
import type { EngravedBar } from './vexflow-bar';

/** The tension colour: a deep magenta, readable on white and on the dark theme's ground. */
export const TENSION_INK = '#c2185b';
/** Height of the key's line above the first system. */
export const TENSION_LEGEND_HEIGHT = 24;
const TRIANGLE = 7;

/** Colour the syncopating heads (not the ostinato's) of one bar; call before drawing it. */
export function colourSyncopations(bar: NotationBar, engraved: EngravedBar, ink: string): void {
  const at = new Set(bar.syncopated.map((i) => `${i.beat}:${i.slot}`));
  for (const { note, event, beat } of engraved.notes) {
    if (event.kind !== 'note' || !at.has(`${beat}:${event.slot}`)) continue;
    event.heads.forEach((head, index) => {
      if (!head.keepsTime) note.setKeyStyle(index, { fillStyle: ink, strokeStyle: ink });
    });
  }
}

/** A small upward triangle under each syncopating instant of one bar, tip at `y`. */
export function drawTensionMarks(
  ctx: SVGContext,
  bar: NotationBar,
  engraved: EngravedBar,
  y: number,
  ink: string,
): void {
  const xs = new Map<string, number>();
  for (const { note, event, beat } of engraved.notes) {
    if (event.kind === 'note')
      xs.set(`${beat}:${event.slot}`, note.getAbsoluteX() + note.getGlyphWidth() / 2);
  }
  for (const { beat, slot } of bar.syncopated) {
    const x = xs.get(`${beat}:${slot}`);
    if (x === undefined) continue;
    const mark = triangle(ctx, x, y, ink);
    mark.setAttribute('class', 'tensile-tension-mark');
    mark.setAttribute('data-bar', String(bar.bar));
    mark.setAttribute('data-beat', String(beat));
    mark.setAttribute('data-slot', String(slot));
  }
}

/** The key: a triangle and what it means, starting at `x` with its baseline at `y`. */
export function drawTensionLegend(ctx: SVGContext, x: number, y: number, ink: string): void {
  const group = ctx.openGroup();
  group.setAttribute('class', 'tensile-tension-legend');
  triangle(ctx, x + TRIANGLE / 2, y - 10, ink);
  svgText(
    ctx,
    'tension: a note before a silent stronger beat',
    x + TRIANGLE + 6,
    y,
    'tensile-tension-legend-text',
    { size: 13, anchor: 'start' },
  );
  ctx.closeGroup();
}

function triangle(ctx: SVGContext, x: number, tipY: number, ink: string): SVGPathElement {
  const path = ctx.create('path') as SVGPathElement;
  const h = TRIANGLE;
  path.setAttribute(
    'd',
    `M${round(x)} ${round(tipY)}L${round(x + h / 2)} ${round(tipY + h)}L${round(x - h / 2)} ${round(tipY + h)}Z`,
  );
  path.setAttribute('fill', ink);
  path.setAttribute('stroke', 'none');
  ctx.add(path);
  return path;
}

function round(n: number): string {
  return String(Math.round(n * 10) / 10);
}
