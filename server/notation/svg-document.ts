/**
 * The few DOM calls VexFlow's SVGContext and Tensile's notation code make, over plain objects
 * that serialise straight to an SVG string: a server engraving needs no layout, style or event
 * machinery, and a full DOM (jsdom) cost about as much as VexFlow's own work.
 *
 * What is used (read from vexflow/build/esm/src/svgcontext.js and shared/notation): elements
 * made by `createElementNS`/`createElement`, `setAttribute(NS)`, `append(Child)`,
 * `removeChild`/`remove`/`replaceChildren`, `lastChild`, `textContent`, `classList.add`,
 * `nodeName`, `ownerDocument`, a `style` that is written but never read back (unitless sizes a
 * browser would ignore) and a `font` shorthand VexFlow reads back, and one `querySelectorAll('tag[attr="value"]')`. Anything else is
 * missing on purpose, so a new DOM call fails loudly in the server specs instead of printing
 * wrong notation.
 */

const SVG_NS = 'http://www.w3.org/2000/svg';

type Child = SvgNode | SvgTextNode;

class SvgTextNode {
  parentNode: SvgNode | null = null;
  constructor(readonly data: string) {}
}

/**
 * Inline style. VexFlow writes unitless sizes a DOM ignores (never serialised here either), and
 * reads fonts back from a CSS `font` shorthand, which is parsed as a DOM parses the shorthands
 * VexFlow writes (`[style] [weight] size family[, family]`).
 */
class ShimStyle {
  width = '';
  height = '';
  fontFamily = '';
  fontSize = '';
  fontWeight = '';
  fontStyle = '';

  set font(value: string) {
    const match = FONT_SHORTHAND.exec(value.trim());
    if (!match) throw new Error(`svg-document: CSS font shorthand not supported: ${value}`);
    const [, first, second, size, family] = match;
    const words = [first, second].filter((w): w is string => w !== undefined);
    this.fontStyle = words.find((w) => FONT_STYLES.has(w)) ?? 'normal';
    this.fontWeight = words.find((w) => !FONT_STYLES.has(w) && w !== 'normal') ?? 'normal';
    this.fontSize = size!;
    this.fontFamily = family!
      .split(',')
      .map((f) => f.trim())
      .join(', ');
  }
}

const FONT_STYLES = new Set(['italic', 'oblique']);
const FONT_WORD = '(normal|italic|oblique|bold|bolder|lighter|[1-9]00)';
const FONT_SHORTHAND = new RegExp(
  `^(?:${FONT_WORD}\\s+)?(?:${FONT_WORD}\\s+)?(\\d+(?:\\.\\d+)?(?:pt|px|em|rem|%))\\s+([^\\s].*)$`,
);

export class SvgNode {
  readonly childNodes: Child[] = [];
  parentNode: SvgNode | null = null;
  readonly style = new ShimStyle();
  private readonly attrs = new Map<string, string>();

  constructor(
    readonly ownerDocument: SvgDocument,
    readonly nodeName: string,
    readonly namespaceURI: string | null,
  ) {}

  get lastChild(): Child | null {
    return this.childNodes[this.childNodes.length - 1] ?? null;
  }

  get firstChild(): Child | null {
    return this.childNodes[0] ?? null;
  }

  setAttribute(name: string, value: unknown): void {
    this.attrs.set(name, String(value));
  }

  setAttributeNS(namespace: string | null, name: string, value: unknown): void {
    if (namespace !== null) throw new Error(`svg-document: namespaced attribute ${name}`);
    this.setAttribute(name, value);
  }

  getAttribute(name: string): string | null {
    return this.attrs.get(name) ?? null;
  }

  removeAttribute(name: string): void {
    this.attrs.delete(name);
  }

  attributeNames(): string[] {
    return [...this.attrs.keys()];
  }

  readonly classList = {
    add: (...names: string[]): void => {
      const present = (this.getAttribute('class') ?? '').split(/\s+/).filter(Boolean);
      for (const name of names) if (!present.includes(name)) present.push(name);
      this.setAttribute('class', present.join(' '));
    },
  };

  appendChild<T extends Child>(child: T): T {
    child.parentNode?.removeChild(child);
    child.parentNode = this;
    this.childNodes.push(child);
    return child;
  }

  append(...children: (Child | string)[]): void {
    for (const child of children)
      this.appendChild(typeof child === 'string' ? new SvgTextNode(child) : child);
  }

  removeChild<T extends Child>(child: T): T {
    const at = this.childNodes.indexOf(child);
    if (at < 0) throw new Error('svg-document: not a child');
    this.childNodes.splice(at, 1);
    child.parentNode = null;
    return child;
  }

  remove(): void {
    this.parentNode?.removeChild(this);
  }

  replaceChildren(...children: (Child | string)[]): void {
    for (const child of [...this.childNodes]) this.removeChild(child);
    this.append(...children);
  }

  get textContent(): string {
    return this.childNodes.map((c) => (c instanceof SvgTextNode ? c.data : c.textContent)).join('');
  }

  set textContent(value: string) {
    this.replaceChildren(...(value === '' ? [] : [value]));
  }

  /** Only `tag[attr="value"]`, the one selector the notation code uses. */
  querySelectorAll(selector: string): SvgNode[] {
    const match = /^([a-z]+)\[([a-z-]+)="([^"]*)"\]$/.exec(selector);
    if (!match) throw new Error(`svg-document: unsupported selector ${selector}`);
    const [, tag, attr, value] = match;
    const found: SvgNode[] = [];
    const visit = (node: SvgNode) => {
      for (const child of node.childNodes) {
        if (!(child instanceof SvgNode)) continue;
        if (child.nodeName === tag && child.getAttribute(attr!) === value) found.push(child);
        visit(child);
      }
    };
    visit(this);
    return found;
  }

  /** The element as XML, as an XML serialiser writes a standalone SVG element. */
  serialize(): string {
    return this.markup(null);
  }

  // String concatenation: V8 joins the pieces as ropes, cheaper than collecting an array.
  private markup(inheritedNs: string | null): string {
    let out = '<' + this.nodeName;
    if (this.namespaceURI !== inheritedNs && this.namespaceURI !== null)
      out += ' xmlns="' + escapeAttribute(this.namespaceURI) + '"';
    for (const [name, value] of this.attrs) out += ' ' + name + '="' + escapeAttribute(value) + '"';
    if (this.childNodes.length === 0) return out + '/>';
    out += '>';
    for (const child of this.childNodes)
      out +=
        child instanceof SvgTextNode ? escapeText(child.data) : child.markup(this.namespaceURI);
    return out + '</' + this.nodeName + '>';
  }
}

export class SvgDocument {
  createElementNS(namespace: string, name: string): SvgNode {
    if (namespace !== SVG_NS) throw new Error(`svg-document: namespace ${namespace}`);
    return new SvgNode(this, name, SVG_NS);
  }

  /** A host element (VexFlow's container `div`); it is never serialised. */
  createElement(name: string): SvgNode {
    return new SvgNode(this, name.toUpperCase(), 'http://www.w3.org/1999/xhtml');
  }
}

const ATTRIBUTE_SPECIALS = /[&"<>\t\n\r]/;
const TEXT_SPECIALS = /[&<>]/;

function escapeAttribute(value: string): string {
  if (!ATTRIBUTE_SPECIALS.test(value)) return value;
  return value
    .replace(/&/g, '&amp;')
    .replace(/"/g, '&quot;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/\t/g, '&#x9;')
    .replace(/\n/g, '&#xA;')
    .replace(/\r/g, '&#xD;');
}

function escapeText(value: string): string {
  if (!TEXT_SPECIALS.test(value)) return value;
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
