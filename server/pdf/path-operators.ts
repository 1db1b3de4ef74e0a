/**
 * SVG path data as PDF path operators (m, l, c, h), in the same coordinates. Arcs become cubic
 * Béziers of at most a quarter turn each (SVG 1.1, appendix F.6.5, centre parametrisation).
 * A sub-path that goes nowhere is left out, as svg-to-pdfkit leaves it out.
 */

const TOKEN = /[\s,]*(?:([MmLlHhVvCcZzAa])|([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?))/y;
const ARITY: Record<string, number> = { M: 2, L: 2, H: 1, V: 1, C: 6, A: 7, Z: 0 };

function tokenize(d: string): (string | number)[] {
  const tokens: (string | number)[] = [];
  TOKEN.lastIndex = 0;
  let match: RegExpExecArray | null;
  while (TOKEN.lastIndex < d.length && (match = TOKEN.exec(d)))
    tokens.push(match[1] !== undefined ? match[1] : Number(match[2]));
  if (TOKEN.lastIndex < d.length && d.slice(TOKEN.lastIndex).trim() !== '')
    throw new Error(`path-operators: path data not supported: ${d.slice(0, 60)}`);
  return tokens;
}

/** Sub-paths written out, each kept only once it has gone somewhere. */
class PathWriter {
  readonly out: string[] = [];
  private sub: string[] = [];
  private moved = false;
  x = 0;
  y = 0;
  startX = 0;
  startY = 0;

  op(text: string): void {
    this.sub.push(text);
  }

  to(x: number, y: number): void {
    if (x !== this.x || y !== this.y) this.moved = true;
    this.x = x;
    this.y = y;
  }

  /** A curve goes somewhere if any of its points is off the current point. */
  touch(): void {
    this.moved = true;
  }

  endSub(): void {
    if (this.moved) for (const op of this.sub) this.out.push(op);
    this.sub = [];
    this.moved = false;
  }
}

export function pathOperators(d: string): string {
  const tokens = tokenize(d);
  const w = new PathWriter();
  let i = 0;
  let command = '';
  while (i < tokens.length) {
    const token = tokens[i]!;
    if (typeof token === 'string') {
      command = token;
      i++;
      if (command === 'Z' || command === 'z') {
        w.op('h');
        w.to(w.startX, w.startY);
        continue;
      }
    } else if (command === '' || command === 'Z' || command === 'z') {
      throw new Error(`path-operators: number without a command in ${d.slice(0, 60)}`);
    }
    const upper = command.toUpperCase();
    const n = ARITY[upper]!;
    for (let k = i; k < i + n; k++)
      if (typeof tokens[k] !== 'number')
        throw new Error(`path-operators: ${command} needs ${n} numbers in ${d.slice(0, 60)}`);
    const v = tokens as number[];
    const dx = command !== upper ? w.x : 0;
    const dy = command !== upper ? w.y : 0;
    switch (upper) {
      case 'M':
        w.endSub();
        w.x = w.startX = v[i]! + dx;
        w.y = w.startY = v[i + 1]! + dy;
        w.op(`${num(w.x)} ${num(w.y)} m`);
        // Further pairs after a moveto are linetos.
        command = command === upper ? 'L' : 'l';
        break;
      case 'L':
        w.op(`${num(v[i]! + dx)} ${num(v[i + 1]! + dy)} l`);
        w.to(v[i]! + dx, v[i + 1]! + dy);
        break;
      case 'H':
        w.op(`${num(v[i]! + dx)} ${num(w.y)} l`);
        w.to(v[i]! + dx, w.y);
        break;
      case 'V':
        w.op(`${num(w.x)} ${num(v[i]! + dy)} l`);
        w.to(w.x, v[i]! + dy);
        break;
      case 'C': {
        const p = [v[i]! + dx, v[i + 1]! + dy, v[i + 2]! + dx, v[i + 3]! + dy];
        const [ex, ey] = [v[i + 4]! + dx, v[i + 5]! + dy];
        w.op(`${p.map(num).join(' ')} ${num(ex)} ${num(ey)} c`);
        if (p[0] !== w.x || p[1] !== w.y || p[2] !== w.x || p[3] !== w.y) w.touch();
        w.to(ex, ey);
        break;
      }
      case 'A': {
        const ex = v[i + 5]! + dx;
        const ey = v[i + 6]! + dy;
        const [rx, ry, angle, large, sweep] = [v[i]!, v[i + 1]!, v[i + 2]!, v[i + 3]!, v[i + 4]!];
        for (const curve of arcCurves(w.x, w.y, rx, ry, angle, large !== 0, sweep !== 0, ex, ey))
          w.op(`${curve.map(num).join(' ')} c`);
        w.to(ex, ey);
        break;
      }
    }
    i += n;
  }
  w.endSub();
  return w.out.join(' ');
}

/** Cubic Béziers (control, control, end) for an SVG elliptical arc from (x1, y1). */
export function arcCurves(
  x1: number,
  y1: number,
  rxIn: number,
  ryIn: number,
  angle: number,
  large: boolean,
  sweep: boolean,
  x2: number,
  y2: number,
): number[][] {
  if (x1 === x2 && y1 === y2) return [];
  let rx = Math.abs(rxIn);
  let ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0) return [[x1, y1, x2, y2, x2, y2]];
  const phi = (angle * Math.PI) / 180;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  const hx = (x1 - x2) / 2;
  const hy = (y1 - y2) / 2;
  const xp = cos * hx + sin * hy;
  const yp = -sin * hx + cos * hy;
  const lambda = (xp * xp) / (rx * rx) + (yp * yp) / (ry * ry);
  if (lambda > 1) {
    rx *= Math.sqrt(lambda);
    ry *= Math.sqrt(lambda);
  }
  const num2 = rx * rx * ry * ry - rx * rx * yp * yp - ry * ry * xp * xp;
  const den = rx * rx * yp * yp + ry * ry * xp * xp;
  const coef = (large === sweep ? -1 : 1) * Math.sqrt(Math.max(0, num2 / den));
  const cxp = (coef * rx * yp) / ry;
  const cyp = (-coef * ry * xp) / rx;
  const cx = cos * cxp - sin * cyp + (x1 + x2) / 2;
  const cy = sin * cxp + cos * cyp + (y1 + y2) / 2;
  const vecAngle = (ux: number, uy: number, vx: number, vy: number) =>
    Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  const theta1 = vecAngle(1, 0, (xp - cxp) / rx, (yp - cyp) / ry);
  let delta = vecAngle((xp - cxp) / rx, (yp - cyp) / ry, (-xp - cxp) / rx, (-yp - cyp) / ry);
  if (!sweep && delta > 0) delta -= 2 * Math.PI;
  if (sweep && delta < 0) delta += 2 * Math.PI;
  const segments = Math.max(1, Math.ceil(Math.abs(delta) / (Math.PI / 2) - 1e-9));
  const step = delta / segments;
  const k = (4 / 3) * Math.tan(step / 4);
  const point = (t: number) => {
    const ex = rx * Math.cos(t);
    const ey = ry * Math.sin(t);
    return [cx + cos * ex - sin * ey, cy + sin * ex + cos * ey];
  };
  const tangent = (t: number) => {
    const ex = -rx * Math.sin(t);
    const ey = ry * Math.cos(t);
    return [cos * ex - sin * ey, sin * ex + cos * ey];
  };
  const curves: number[][] = [];
  for (let s = 0; s < segments; s++) {
    const a = theta1 + s * step;
    const b = a + step;
    const [ax, ay] = point(a);
    const [bx, by] = point(b);
    const [tax, tay] = tangent(a);
    const [tbx, tby] = tangent(b);
    const end = s === segments - 1 ? [x2, y2] : [bx!, by!];
    curves.push([ax! + k * tax!, ay! + k * tay!, bx! - k * tbx!, by! - k * tby!, end[0]!, end[1]!]);
  }
  return curves;
}

/** A number as PDF content writes it: at most four decimals, never an exponent. */
export function num(n: number): string {
  return String(Math.round(n * 1e4) / 1e4 || 0);
}
