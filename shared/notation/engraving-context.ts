/**
 * Speed-ups for one engraving pass that leave VexFlow's output unchanged.
 *
 * Profiling a 16-bar render in Chromium showed most of VexFlow's own time going to three things:
 * `structuredClone` of the drawing state on every `save()`/`restore()` (once per note, stem,
 * flag, beam and modifier); `structuredClone` of the default font and style in the constructor of
 * every VexFlow element (each notehead, stem, flag, glyph); and canvas `measureText` for every
 * glyph element (the same few Bravura characters, measured again and again). All three are
 * replaced by equivalents: the state, font and style records hold only strings and numbers, so a
 * shallow copy is an exact copy, and a glyph's metrics cannot change within one pass.
 */
import { Element, Metrics, SVGContext } from 'vexflow/core';

/** An SVG context whose save/restore copy the (flat) drawing state without `structuredClone`. */
export class EngravingContext extends SVGContext {
  /**
   * Whether VexFlow's invisible hit areas (a transparent `<rect>` over every note and tuplet,
   * VexFlow's default) are drawn; a drawing that has no use for them skips creating them.
   */
  hitAreas = true;

  override pointerRect(x: number, y: number, width: number, height: number): this {
    if (this.hitAreas) super.pointerRect(x, y, width, height);
    return this;
  }

  override save(): this {
    this.stateStack.push({ state: { ...this.state }, attributes: { ...this.attributes } });
    return this;
  }

  override restore(): this {
    const saved = this.stateStack.pop();
    if (saved) {
      this.state = { ...saved.state };
      this.attributes = { ...saved.attributes };
    }
    return this;
  }
}

type MeasuringCanvas = HTMLCanvasElement | OffscreenCanvas;

/**
 * Run `engrave` (synchronous) with VexFlow's default fonts and styles copied shallowly and its
 * text measured through a (font, text) → metrics cache. Everything is put back afterwards and the
 * caches live for this call only, so fonts that finish loading later are measured afresh on the
 * next pass and other VexFlow users see the library unchanged.
 */
export function withFastEngraving<T>(engrave: () => T): T {
  const { getFontInfo, getStyle } = Metrics;
  Metrics.getFontInfo = copiedPerKey(getFontInfo.bind(Metrics));
  Metrics.getStyle = copiedPerKey(getStyle.bind(Metrics));
  const canvas = Element.getTextMeasurementCanvas();
  const context = canvas?.getContext('2d') as CanvasRenderingContext2D | null | undefined;
  if (canvas && context) Element.setTextMeasurementCanvas(cachingCanvas(context));
  try {
    return engrave();
  } finally {
    Metrics.getFontInfo = getFontInfo;
    Metrics.getStyle = getStyle;
    if (canvas && context) Element.setTextMeasurementCanvas(canvas);
  }
}

/**
 * `lookUp` asked once per key; later calls get a fresh shallow copy of that first answer, which
 * equals the deep copy VexFlow makes as long as every value is a string, number or missing.
 * Records with anything else keep going to `lookUp`.
 */
function copiedPerKey<R extends object>(lookUp: (key: string) => R): (key: string) => R {
  const first = new Map<string, R | null>();
  return (key) => {
    let record = first.get(key);
    if (record === undefined) {
      const looked = lookUp(key);
      record = Object.values(looked).every(isFlat) ? looked : null;
      first.set(key, record);
      if (record === null) return looked;
      return { ...record };
    }
    return record === null ? lookUp(key) : { ...record };
  };
}

function isFlat(value: unknown): boolean {
  return value === undefined || value === null || typeof value !== 'object';
}

/** The slice of a canvas VexFlow uses to measure text: `getContext('2d')`, `font`, `measureText`. */
function cachingCanvas(real: CanvasRenderingContext2D): MeasuringCanvas {
  const metrics = new Map<string, TextMetrics>();
  let font = real.font;
  const context = {
    get font(): string {
      return font;
    },
    set font(value: string) {
      font = value;
    },
    measureText(text: string): TextMetrics {
      const key = `${font}\u0000${text}`;
      let measured = metrics.get(key);
      if (measured === undefined) {
        real.font = font;
        measured = real.measureText(text);
        metrics.set(key, measured);
      }
      return measured;
    },
  };
  return { getContext: () => context } as unknown as MeasuringCanvas;
}
