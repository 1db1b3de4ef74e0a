/**
 * An engraving turned, once, into what a PDF page needs: PDF path operators for every line and
 * shape, and text runs that only wait for the document's fonts. pdfmake's SVG path (svg-to-pdfkit)
 * parses the SVG string and resolves every element's style afresh for each export, most of an
 * export's time; this does that work once per drawing, and the drawing is cached with the art.
 *
 * It reads the SVG as svg-to-pdfkit does (pdfmake/js/3rd-party/svg-to-pdfkit/source.js): the same
 * property defaults and inheritance, `pt` as 4/3 of a unit, `currentColor` as black, a
 * `<tspan>`'s opacity applied to its paint, and stroke joins/caps/miter limit as SVG's initial
 * values. Only what VexFlow and the notation code write is understood; anything else throws, so a
 * change in the engraving fails in the specs rather than printing something different.
 */
import { SvgNode } from '../notation/svg-document';
import { num, pathOperators } from './path-operators';

export interface Paint {
  /** PDF colour operands, `r g b`. */
  readonly rgb: string;
  readonly opacity: number;
}

/** A run of text from one text node, styled by the element holding it. */
export interface TextPiece {
  readonly family: string;
  readonly bold: boolean;
  readonly italic: boolean;
  readonly size: number;
  readonly text: string;
  /** Absolute position of the run's first glyph, where the element sets one. */
  readonly x?: number;
  readonly y?: number;
  readonly anchor: 'start' | 'middle' | 'end';
  readonly fill: Paint | null;
  readonly stroke: Paint | null;
  readonly strokeWidth: number;
  /** PDF dash operator for the run's stroke. */
  readonly dash: string;
}

export type PrintItem =
  | { readonly kind: 'ops'; readonly ops: string }
  | { readonly kind: 'text'; readonly pieces: readonly TextPiece[] };

export interface PrintDrawing {
  /** The viewBox, in drawing units. */
  readonly width: number;
  readonly height: number;
  readonly items: readonly PrintItem[];
}

interface Style {
  readonly fill: string;
  readonly stroke: string;
  readonly strokeWidth: number;
  /** PDF dash operator, `[on off …] 0 d`. */
  readonly dash: string;
  readonly family: string;
  readonly size: number;
  readonly weight: string;
  readonly fontStyle: string;
  readonly anchor: 'start' | 'middle' | 'end';
}

/** svg-to-pdfkit's initial values (its `Properties` table). */
const INITIAL: Style = {
  fill: 'black',
  stroke: 'none',
  strokeWidth: 1,
  dash: '[] 0 d',
  family: 'sans-serif',
  size: 16,
  weight: 'normal',
  fontStyle: 'normal',
  anchor: 'start',
};

const STYLE_ATTRIBUTES = new Set([
  'fill',
  'stroke',
  'stroke-width',
  'stroke-dasharray',
  'font-family',
  'font-size',
  'font-weight',
  'font-style',
  'text-anchor',
  'opacity',
]);

const OWN_ATTRIBUTES: Record<string, readonly string[]> = {
  svg: ['xmlns', 'width', 'height', 'viewBox'],
  g: ['transform'],
  path: ['d'],
  rect: ['x', 'y', 'width', 'height'],
  text: ['x', 'y'],
  tspan: ['x', 'y'],
};

/** Compile a print engraving's tree (svg-document.ts) into a drawing for PDF pages. */
export function compilePrintDrawing(root: SvgNode): PrintDrawing {
  if (root.nodeName !== 'svg') throw new Error(`print-drawing: root <${root.nodeName}>`);
  check(root);
  const box = (root.getAttribute('viewBox') ?? '')
    .trim()
    .split(/[\s,]+/)
    .map(Number);
  if (box.length !== 4 || box[0] !== 0 || box[1] !== 0 || box.some((n) => !Number.isFinite(n)))
    throw new Error(`print-drawing: viewBox ${root.getAttribute('viewBox')}`);
  const items = new Items();
  const style = styleOf(root, INITIAL);
  // SVG's initial stroke joins, caps and miter limit, as svg-to-pdfkit sets them for each stroke.
  items.ops('4 M 0 j 0 J');
  // The outermost <svg> clips to its viewport (svg-to-pdfkit: overflow is hidden initially).
  items.ops(`0 0 ${num(box[2]!)} ${num(box[3]!)} re W n`);
  drawChildren(root, style, items);
  return { width: box[2]!, height: box[3]!, items: items.done() };
}

class Items {
  private readonly list: PrintItem[] = [];
  private pending: string[] = [];

  ops(op: string): void {
    this.pending.push(op);
  }

  text(pieces: TextPiece[]): void {
    this.flush();
    this.list.push({ kind: 'text', pieces });
  }

  done(): PrintItem[] {
    this.flush();
    return this.list;
  }

  private flush(): void {
    if (this.pending.length) this.list.push({ kind: 'ops', ops: this.pending.join('\n') });
    this.pending = [];
  }
}

function check(node: SvgNode): void {
  const own = OWN_ATTRIBUTES[node.nodeName];
  if (!own) throw new Error(`print-drawing: element <${node.nodeName}> not supported`);
  for (const name of node.attributeNames())
    if (!own.includes(name) && !STYLE_ATTRIBUTES.has(name))
      throw new Error(`print-drawing: attribute ${name} on <${node.nodeName}> not supported`);
  if (node.nodeName !== 'tspan' && node.getAttribute('opacity') !== null)
    throw new Error(`print-drawing: opacity on <${node.nodeName}> not supported`);
}

function styleOf(node: SvgNode, parent: Style): Style {
  const fill = node.getAttribute('fill');
  const stroke = node.getAttribute('stroke');
  const width = node.getAttribute('stroke-width');
  const dash = node.getAttribute('stroke-dasharray');
  const family = node.getAttribute('font-family');
  const size = node.getAttribute('font-size');
  const weight = node.getAttribute('font-weight');
  const fontStyle = node.getAttribute('font-style');
  const anchor = node.getAttribute('text-anchor') ?? parent.anchor;
  // Most elements set nothing that inherits: their parent's style serves unchanged.
  if (
    fill === null &&
    stroke === null &&
    width === null &&
    dash === null &&
    family === null &&
    size === null &&
    weight === null &&
    fontStyle === null &&
    anchor === parent.anchor
  )
    return parent;
  if (anchor !== 'start' && anchor !== 'middle' && anchor !== 'end')
    throw new Error(`print-drawing: text-anchor ${anchor}`);
  return {
    fill: fill ?? parent.fill,
    stroke: stroke ?? parent.stroke,
    strokeWidth: width === null ? parent.strokeWidth : length(width),
    dash: dash === null ? parent.dash : dashOf(dash),
    family: family ?? parent.family,
    size: size === null ? parent.size : length(size),
    weight: weight ?? parent.weight,
    fontStyle: fontStyle ?? parent.fontStyle,
    anchor,
  };
}

/** svg-to-pdfkit's reading of `stroke-dasharray`: an odd list is doubled, all zeros is solid. */
function dashOf(value: string): string {
  if (value.trim() === 'none') return '[] 0 d';
  let dashes = value
    .trim()
    .split(/[\s,]+/)
    .map(length);
  // A zero dash or gap would need svg-to-pdfkit's merging of neighbours; VexFlow writes none.
  if (dashes.some((d) => d <= 0)) throw new Error(`print-drawing: stroke-dasharray ${value}`);
  if (dashes.length % 2 === 1) dashes = dashes.concat(dashes);
  return `[${dashes.map(num).join(' ')}] 0 d`;
}

/** A length in drawing units: plain or px, or pt at 96/72 (svg-to-pdfkit's `computeUnits`). */
function length(value: string): number {
  const plain = Number(value);
  if (value !== '' && Number.isFinite(plain)) return plain;
  const known = LENGTHS.get(value);
  if (known !== undefined) return known;
  const match = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)(px|pt)?\s*$/i.exec(value);
  if (!match) throw new Error(`print-drawing: length ${value} not supported`);
  const result = Number(match[1]) * (match[2] === 'pt' ? 96 / 72 : 1);
  if (LENGTHS.size >= MEMO_LIMIT) LENGTHS.clear();
  LENGTHS.set(value, result);
  return result;
}

/** Engravings repeat a handful of sizes and paints; the bound only guards odd input. */
const MEMO_LIMIT = 256;

/** Lengths with units already read: a drawing repeats a few (`30pt` on every glyph). */
const LENGTHS = new Map<string, number>();

function drawChildren(node: SvgNode, style: Style, items: Items): void {
  for (const child of node.childNodes) {
    if (!isElement(child)) {
      if (child.data.trim() !== '') throw new Error('print-drawing: text outside <text>');
      continue;
    }
    check(child);
    const own = styleOf(child, style);
    switch (child.nodeName) {
      case 'g': {
        const transform = child.getAttribute('transform');
        if (transform) items.ops(`q ${matrix(transform).map(num).join(' ')} cm`);
        drawChildren(child, own, items);
        if (transform) items.ops('Q');
        break;
      }
      case 'path':
        shape(pathOperators(child.getAttribute('d') ?? ''), own, items);
        break;
      case 'rect': {
        const x = length(child.getAttribute('x') ?? '0');
        const y = length(child.getAttribute('y') ?? '0');
        const w = length(child.getAttribute('width') ?? '0');
        const h = length(child.getAttribute('height') ?? '0');
        if (w > 0 && h > 0) shape(`${num(x)} ${num(y)} ${num(w)} ${num(h)} re`, own, items);
        break;
      }
      case 'text':
        items.text(textPieces(child, own));
        break;
      default:
        throw new Error(`print-drawing: <${child.nodeName}> here not supported`);
    }
  }
}

/** A filled and/or stroked shape, in its own graphics state as svg-to-pdfkit draws each. */
function shape(outline: string, style: Style, items: Items): void {
  const fill = paint(style.fill, 1);
  const stroke = style.strokeWidth === 0 ? null : paint(style.stroke, 1);
  if ((!fill && !stroke) || outline === '') return;
  const ops = ['q'];
  if (fill) ops.push(`/DeviceRGB cs ${fill.rgb} scn`);
  if (stroke) ops.push(`/DeviceRGB CS ${stroke.rgb} SCN ${num(style.strokeWidth)} w ${style.dash}`);
  ops.push(outline, fill && stroke ? 'B' : fill ? 'f' : 'S', 'Q');
  items.ops(ops.join('\n'));
}

const NAMED: Record<string, string> = { black: '0 0 0', white: '1 1 1' };

function paint(value: string, opacity: number): Paint | null {
  if (value === 'none' || opacity === 0) return null;
  const key = `${value} ${opacity}`;
  const known = PAINTS.get(key);
  if (known) return known;
  const result = readPaint(value, opacity);
  if (PAINTS.size >= MEMO_LIMIT) PAINTS.clear();
  PAINTS.set(key, result);
  return result;
}

/** Paints already read, shared between runs (they are never changed). */
const PAINTS = new Map<string, Paint>();

function readPaint(value: string, opacity: number): Paint {
  if (value === 'currentColor') return { rgb: NAMED['black']!, opacity };
  const named = NAMED[value];
  if (named) return { rgb: named, opacity };
  const hex = /^#([0-9a-f]{6})$/i.exec(value);
  if (!hex) throw new Error(`print-drawing: colour ${value} not supported`);
  const n = parseInt(hex[1]!, 16);
  return { rgb: [n >> 16, (n >> 8) & 255, n & 255].map((c) => num(c / 255)).join(' '), opacity };
}

/** `translate(x y)`, `scale(s [t])` and `matrix(…)`, composed left to right. */
function matrix(transform: string): number[] {
  let m = [1, 0, 0, 1, 0, 0];
  const re = /\s*(translate|scale|matrix)\s*\(([^)]*)\)\s*,?/gy;
  let at = 0;
  let match: RegExpExecArray | null;
  while ((match = re.exec(transform))) {
    at = re.lastIndex;
    const v = match[2]!
      .trim()
      .split(/[\s,]+/)
      .map(Number);
    const next =
      match[1] === 'translate'
        ? [1, 0, 0, 1, v[0]!, v[1] ?? 0]
        : match[1] === 'scale'
          ? [v[0]!, 0, 0, v[1] ?? v[0]!, 0, 0]
          : v;
    if (next.length !== 6 || next.some((n) => !Number.isFinite(n)))
      throw new Error(`print-drawing: transform ${transform}`);
    m = multiply(m, next);
  }
  if (at !== transform.length) throw new Error(`print-drawing: transform ${transform}`);
  return m;
}

function multiply(a: number[], b: number[]): number[] {
  return [
    a[0]! * b[0]! + a[2]! * b[1]!,
    a[1]! * b[0]! + a[3]! * b[1]!,
    a[0]! * b[2]! + a[2]! * b[3]!,
    a[1]! * b[2]! + a[3]! * b[3]!,
    a[0]! * b[4]! + a[2]! * b[5]! + a[4]!,
    a[1]! * b[4]! + a[3]! * b[5]! + a[5]!,
  ];
}

/**
 * A `<text>`'s runs in order, with svg-to-pdfkit's white-space rule (runs of white space become
 * one space, none at the start of the element's text or after a space, none at its end) and its
 * positions: an element's single `x`/`y` places the first glyph drawn inside it.
 */
function textPieces(text: SvgNode, style: Style): TextPiece[] {
  const pieces: TextPiece[] = [];
  let remaining = text.textContent;
  let processed = '';
  let pendingX: number | undefined;
  let pendingY: number | undefined;
  const visit = (node: SvgNode, own: Style) => {
    const x = coordinate(node, 'x');
    const y = coordinate(node, 'y');
    const [outerX, outerY] = [pendingX, pendingY];
    if (x !== undefined) pendingX = x;
    if (y !== undefined) pendingY = y;
    const opacity = Math.max(0, Math.min(1, Number(node.getAttribute('opacity') ?? 1)));
    for (const child of node.childNodes) {
      if (isElement(child)) {
        if (child.nodeName !== 'tspan')
          throw new Error(`print-drawing: <${child.nodeName}> in text`);
        check(child);
        visit(child, styleOf(child, own));
        continue;
      }
      const raw = child.data;
      remaining = remaining.substring(raw.length);
      let rendered = raw.replace(/\s+/g, ' ');
      if (/\s$|^$/.test(processed)) rendered = rendered.replace(/^\s/, '');
      if (/^\s*$/.test(remaining)) rendered = rendered.replace(/\s$/, '');
      processed += raw;
      if (rendered === '') continue;
      pieces.push({
        family: own.family,
        bold: own.weight === 'bold',
        italic: own.fontStyle === 'italic',
        size: own.size,
        text: rendered,
        ...(pendingX !== undefined ? { x: pendingX } : {}),
        ...(pendingY !== undefined ? { y: pendingY } : {}),
        anchor: own.anchor,
        fill: paint(own.fill, opacity),
        stroke: own.strokeWidth === 0 ? null : paint(own.stroke, opacity),
        strokeWidth: own.strokeWidth,
        dash: own.dash,
      });
      pendingX = pendingY = undefined;
    }
    // An element's own position unused by its own glyphs does not pass to its siblings.
    if (x !== undefined && pendingX === x) pendingX = outerX;
    if (y !== undefined && pendingY === y) pendingY = outerY;
  };
  visit(text, style);
  return pieces;
}

function coordinate(node: SvgNode, name: string): number | undefined {
  const value = node.getAttribute(name);
  if (value === null) return undefined;
  if (/[\s,]/.test(value.trim())) throw new Error(`print-drawing: ${name} list ${value}`);
  return length(value);
}

function isElement(child: SvgNode['childNodes'][number]): child is SvgNode {
  return child instanceof SvgNode;
}
