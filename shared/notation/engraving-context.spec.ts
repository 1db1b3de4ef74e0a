import { JSDOM } from 'jsdom';
import { Element, Metrics, SVGContext } from 'vexflow/bravura';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EngravingContext, fastEngravingPass, withFastEngraving } from './engraving-context';

const dom = new JSDOM('<!doctype html><div id="a"></div><div id="b"></div>');
const global = globalThis as { document?: Document };

beforeAll(() => {
  global.document = dom.window.document; // VexFlow creates SVG elements through it
  Element.setTextMeasurementCanvas(countingCanvas().canvas); // jsdom cannot measure text
});
afterAll(() => {
  delete global.document;
  dom.window.close();
});

/** The same drawing-state changes, nested saves included, on any SVG context. */
function exercise(ctx: SVGContext) {
  const seen: unknown[] = [];
  ctx.setFillStyle('red').setLineWidth(2);
  ctx.save();
  ctx.setFont('Academico', 14, 'bold');
  ctx.setStrokeStyle('blue').setLineDash([3, 1]);
  ctx.save();
  ctx.scale(2, 2);
  ctx.setShadowBlur(4);
  seen.push(structuredClone({ state: ctx.state, attributes: ctx.attributes }));
  ctx.restore();
  seen.push(structuredClone({ state: ctx.state, attributes: ctx.attributes }));
  ctx.attributes.fill = 'green'; // a change after restore must not reach the saved copy
  ctx.restore();
  seen.push(structuredClone({ state: ctx.state, attributes: ctx.attributes }));
  ctx.restore(); // one too many: VexFlow ignores it
  seen.push(structuredClone({ state: ctx.state, attributes: ctx.attributes }));
  return seen;
}

describe('EngravingContext', () => {
  it("saves and restores exactly as VexFlow's SVGContext does", () => {
    const plain = new SVGContext(dom.window.document.getElementById('a') as HTMLElement);
    const fast = new EngravingContext(dom.window.document.getElementById('b') as HTMLElement);
    const expected = exercise(plain);
    expect(exercise(fast)).toEqual(expected);
    expect((expected[2] as { attributes: { fill: string } }).attributes.fill).toBe('red');
    expect(fast.svg.outerHTML).toBe(plain.svg.outerHTML);
  });
});

/** A stand-in measuring canvas that counts how often text is measured. */
function countingCanvas() {
  const calls: string[] = [];
  const context = {
    font: '10px sans-serif',
    measureText(text: string) {
      calls.push(`${context.font}|${text}`);
      return { width: text.length * 7, actualBoundingBoxAscent: 8, actualBoundingBoxDescent: 2 };
    },
  };
  return { calls, canvas: { getContext: () => context } as unknown as HTMLCanvasElement };
}

describe('withFastEngraving', () => {
  it('measures each glyph once per pass, with the same metrics, and puts the canvas back', () => {
    const previous = Element.getTextMeasurementCanvas();
    const { calls, canvas } = countingCanvas();
    Element.setTextMeasurementCanvas(canvas);
    try {
      // A black notehead (SMuFL U+E0A4), as VexFlow measures every glyph element it builds.
      const widthOf = () => new Element().setText('\uE0A4').getWidth();
      const plain = [widthOf(), widthOf()];
      const plainCalls = calls.length;
      calls.length = 0;
      const fast = withFastEngraving(() => [widthOf(), widthOf()]);
      expect(fast).toEqual(plain);
      expect(calls.length).toBeLessThan(plainCalls);
      expect(new Set(calls).size).toBe(calls.length); // never the same font and text twice
      expect(Element.getTextMeasurementCanvas()).toBe(canvas);
    } finally {
      if (previous) Element.setTextMeasurementCanvas(previous);
    }
  });

  it('keeps its measurements from pass to pass once the page fonts are in, until one loads', () => {
    const previous = Element.getTextMeasurementCanvas();
    const { calls, canvas } = countingCanvas();
    Element.setTextMeasurementCanvas(canvas);
    // The page's font set, as a browser has it: a status and a "loadingdone" event.
    const fonts = Object.assign(new EventTarget(), { status: 'loaded' });
    Object.defineProperty(dom.window.document, 'fonts', { value: fonts, configurable: true });
    const measuredBy = (pass: () => void) => {
      calls.length = 0;
      pass();
      return calls.length;
    };
    const widthOf = () => new Element().setText('\uE0A4').getWidth();
    const pass = () => withFastEngraving(() => widthOf());
    try {
      const width = widthOf();
      expect(measuredBy(pass)).toBeGreaterThan(0);
      expect(measuredBy(pass)).toBe(0);
      expect(withFastEngraving(widthOf)).toBe(width);
      // A font came in: what was measured before may have changed.
      fonts.dispatchEvent(new Event('loadingdone'));
      expect(measuredBy(pass)).toBeGreaterThan(0);
      expect(measuredBy(pass)).toBe(0);
      // While fonts are loading, every pass measures for itself.
      fonts.status = 'loading';
      expect(measuredBy(pass)).toBeGreaterThan(0);
      expect(measuredBy(pass)).toBeGreaterThan(0);
    } finally {
      delete (dom.window.document as { fonts?: unknown }).fonts;
      if (previous) Element.setTextMeasurementCanvas(previous);
    }
  });

  it('hands out equal but separate font and style records, and restores the lookups', () => {
    const { getFontInfo, getStyle } = Metrics;
    const deep = { font: Metrics.getFontInfo('StaveNote'), style: Metrics.getStyle('StaveNote') };
    withFastEngraving(() => {
      expect(Metrics.getFontInfo).not.toBe(getFontInfo);
      const first = Metrics.getFontInfo('StaveNote');
      expect(first).toEqual(deep.font);
      first.size = 99; // a caller changing its copy must not change the next one
      expect(Metrics.getFontInfo('StaveNote')).toEqual(deep.font);
      expect(Metrics.getStyle('StaveNote')).toEqual(deep.style);
      expect(Metrics.getStyle('StaveNote')).not.toBe(Metrics.getStyle('StaveNote'));
    });
    expect(Metrics.getFontInfo).toBe(getFontInfo);
    expect(Metrics.getStyle).toBe(getStyle);
  });

  it('puts everything back when the pass throws', () => {
    const { getFontInfo } = Metrics;
    expect(() =>
      withFastEngraving(() => {
        throw new Error('bad bar');
      }),
    ).toThrow('bad bar');
    expect(Metrics.getFontInfo).toBe(getFontInfo);
  });
});

describe('fastEngravingPass', () => {
  it('shares its measurements between steps and puts the library back after each', () => {
    const previous = Element.getTextMeasurementCanvas();
    const { calls, canvas } = countingCanvas();
    Element.setTextMeasurementCanvas(canvas);
    const { getFontInfo } = Metrics;
    try {
      const widthOf = () => new Element().setText('\uE0A4').getWidth();
      const pass = fastEngravingPass();
      const first = pass(widthOf);
      expect(Metrics.getFontInfo).toBe(getFontInfo);
      expect(Element.getTextMeasurementCanvas()).toBe(canvas);
      const measured = calls.length;
      // The same glyph in a later step of the pass is not measured again.
      expect(pass(widthOf)).toBe(first);
      expect(calls.length).toBe(measured);
      expect(Metrics.getFontInfo).toBe(getFontInfo);
    } finally {
      if (previous) Element.setTextMeasurementCanvas(previous);
    }
  });
});
