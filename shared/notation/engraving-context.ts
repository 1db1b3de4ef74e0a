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

  /**
   * Everything of the drawing state that what is drawn next inherits (colours, font, stroke), as
   * text: a system kept from an earlier pass is reused only after the state it was drawn in, and
   * leaves the state it left then (see EngravingCache).
   */
  drawingState(): string {
    return JSON.stringify([
      this.state,
      this.attributes,
      this.fontCSSString,
      this.backgroundFillStyle,
      this.groupAttributes,
      this.path,
      this.pen,
    ]);
  }

  setDrawingState(text: string): void {
    const [state, attributes, font, background, groupAttributes, path, pen] = JSON.parse(text) as [
      SVGContext['state'],
      SVGContext['attributes'],
      string,
      string,
      SVGContext['attributes'][],
      string,
      SVGContext['pen'],
    ];
    Object.assign(this, {
      state,
      attributes,
      fontCSSString: font,
      backgroundFillStyle: background,
    });
    Object.assign(this, { groupAttributes, path, pen });
  }
}

type MeasuringCanvas = HTMLCanvasElement | OffscreenCanvas;

/**
 * Run `engrave` (synchronous) with VexFlow's default fonts and styles copied shallowly and its
 * text measured through a (font, text) → metrics cache. Everything is put back afterwards, so
 * other VexFlow users see the library unchanged; the caches live for this call only, except the
 * text measurements of a page whose fonts have all loaded (see `metricsFor`).
 */
export function withFastEngraving<T>(engrave: () => T): T {
  return fastEngravingPass()(engrave);
}

/**
 * One engraving pass run in several steps (the page draws a score a system at a time, giving the
 * browser the main thread between steps): each step runs as `withFastEngraving` runs its
 * callback, with the library put back between steps, but the caches are shared by the pass's
 * steps, as they are within one call.
 */
export function fastEngravingPass(): <T>(step: () => T) => T {
  const { getFontInfo, getStyle } = Metrics;
  const fastFontInfo = copiedPerKey(getFontInfo.bind(Metrics));
  const fastStyle = copiedPerKey(getStyle.bind(Metrics));
  let measuring: { canvas: MeasuringCanvas; caching: MeasuringCanvas } | null | undefined;
  return (step) => {
    if (measuring === undefined) {
      const canvas = Element.getTextMeasurementCanvas();
      const context = canvas?.getContext('2d') as CanvasRenderingContext2D | null | undefined;
      measuring =
        canvas && context ? { canvas, caching: cachingCanvas(context, metricsFor(canvas)) } : null;
    }
    Metrics.getFontInfo = fastFontInfo;
    Metrics.getStyle = fastStyle;
    if (measuring) Element.setTextMeasurementCanvas(measuring.caching);
    try {
      return step();
    } finally {
      Metrics.getFontInfo = getFontInfo;
      Metrics.getStyle = getStyle;
      if (measuring) Element.setTextMeasurementCanvas(measuring.canvas);
    }
  };
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

/**
 * Measurements kept from pass to pass in a page whose fonts have all loaded: a glyph measures the
 * same until a font loads (which empties them). Elsewhere (a server, fonts still loading) each
 * pass measures afresh.
 */
let settled: { canvas: MeasuringCanvas; metrics: TextMeasures } | null = null;
let watchingFonts = false;

/** Text measurements by font (as CSS) and text. */
type TextMeasures = Map<string, Map<string, TextMetrics>>;

function metricsFor(canvas: MeasuringCanvas): TextMeasures {
  const fonts = typeof document === 'undefined' ? undefined : document.fonts;
  if (!fonts?.addEventListener || fonts.status !== 'loaded') {
    settled = null;
    return new Map();
  }
  if (!watchingFonts) {
    watchingFonts = true;
    fonts.addEventListener('loadingdone', () => (settled = null));
  }
  if (settled?.canvas !== canvas) settled = { canvas, metrics: new Map() };
  return settled.metrics;
}

/** The slice of a canvas VexFlow uses to measure text: `getContext('2d')`, `font`, `measureText`. */
function cachingCanvas(real: CanvasRenderingContext2D, metrics: TextMeasures): MeasuringCanvas {
  let font = real.font;
  // The current font's measurements, looked up once per change of font (VexFlow sets the font
  // before every measurement, mostly to the one it had).
  let byText: Map<string, TextMetrics> | undefined;
  const context = {
    get font(): string {
      return font;
    },
    set font(value: string) {
      if (value === font && byText) return;
      font = value;
      byText = metrics.get(font);
      if (!byText) metrics.set(font, (byText = new Map()));
    },
    measureText(text: string): TextMetrics {
      if (!byText) context.font = font;
      let measured = byText!.get(text);
      if (measured === undefined) {
        real.font = font;
        measured = real.measureText(text);
        byText!.set(text, measured);
      }
      return measured;
    },
  };
  return { getContext: () => context } as unknown as MeasuringCanvas;
}
