/**
 * A text row draws the same in a browser's document and in the server's light one: both are
 * checked against the markup written out by hand below, not against each other.
 */
import { JSDOM } from 'jsdom';
import type { SVGContext } from 'vexflow/core';
import { describe, expect, it } from 'vitest';
import { SvgDocument } from '../../server/notation/svg-document';
import { SvgTextRow } from './svg-text';

const SVG_NS = 'http://www.w3.org/2000/svg';

interface Host {
  createElementNS(ns: string, name: string): unknown;
}

/** The two calls of VexFlow's context a row makes, over `doc`, and the row's parent. */
function contextOver(doc: Host): { ctx: SVGContext; parent: { append(node: unknown): void } } {
  const parent = doc.createElementNS(SVG_NS, 'g') as { append(node: unknown): void };
  const ctx = {
    create: (name: string) => doc.createElementNS(SVG_NS, name),
    add: (node: unknown) => parent.append(node),
  } as unknown as SVGContext;
  return { ctx, parent };
}

function drawRow(ctx: SVGContext): void {
  const row = new SvgTextRow(ctx, 'tensile-count-row', { size: 12 });
  const items = [
    row.add('1', 10.04, 50, 'tensile-count', { weight: 'bold' }),
    row.add('&', 30.26, 48.01, 'tensile-count tensile-count-silent', { opacity: 0.55 }),
  ];
  row.add('a<"', 44, 50, 'tensile-count', { weight: 'normal' });
  items.forEach((item, slot) => {
    item.setAttribute('data-beat', '1');
    item.setAttribute('data-slot', String(slot * 2));
  });
}

// The row takes the highest baseline (48) and its x; an item's weight only where it differs
// from the row's; text and attribute values escaped as XML requires.
const EXPECTED =
  '<g xmlns="http://www.w3.org/2000/svg"><text class="tensile-count-row" ' +
  'font-family="Academico, serif" font-size="12" font-weight="normal" text-anchor="middle" ' +
  'fill="currentColor" x="30.3" y="48">' +
  '<tspan x="10" y="50" class="tensile-count" font-weight="bold" data-beat="1" data-slot="0">1</tspan>' +
  '<tspan x="30.3" y="48" class="tensile-count tensile-count-silent" opacity="0.55" ' +
  'data-beat="1" data-slot="2">&amp;</tspan>' +
  '<tspan x="44" y="50" class="tensile-count">a&lt;"</tspan></text></g>';

describe('SvgTextRow', () => {
  it('draws its items in a browser document', () => {
    const { window } = new JSDOM('<!doctype html><body></body>');
    const { ctx, parent } = contextOver(window.document);
    drawRow(ctx);
    expect(new window.XMLSerializer().serializeToString(parent as unknown as Node)).toBe(EXPECTED);
  });

  it('draws the same items in the light document', () => {
    const doc = new SvgDocument();
    const { ctx, parent } = contextOver(doc);
    drawRow(ctx);
    expect((parent as unknown as { serialize(): string }).serialize()).toBe(EXPECTED);
  });
});
