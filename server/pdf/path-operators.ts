/**
 * SVG path data as PDF path operators (m, l, c, h), in the same coordinates. Arcs become cubic
 * Béziers of at most a quarter turn each (SVG 1.1, appendix F.6.5, centre parametrisation).
 * A sub-path that goes nowhere is left out, as svg-to-pdfkit leaves it out.
 */

const COMMAND = /([MmLlHhVvCcZzAa])|([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)/g;
const ARITY: Record<string, number> = { M: 2, L: 2, H: 1, V: 1, C: 6, A: 7, Z: 0 };

export function pathOperators(d: string): string {
  const tokens: (string | number)[] = [];
  for (const match of d.matchAll(COMMAND))
    tokens.push(match[1] !== undefined ? match[1] : Number(match[2]));
  if (d.replace(COMMAND, '').replace(/[\s,]/g, '') !== '')
    throw new Error(`path-operators: path data not supported: ${d.slice(0, 60)}`);

  const out: string[] = [];
  let sub: string[] = [];
  let moved = false;
  let x = 0;
  let y = 0;
  let startX = 0;
  let startY = 0;
  const endSub = () => {
    if (moved) out.push(...sub);
    sub = [];
    moved = false;
  };
  const to = (nx: number, ny: number) => {
    if (nx !== x || ny !== y) moved = true;
    x = nx;
    y = ny;
  };

  let i = 0;
  let command = '';
  while (i < tokens.length) {
    const token = tokens[i]!;
    if (typeof token === 'string') {
      command = token;
      i++;
      if (command === 'Z' || command === 'z') {
        sub.push('h');
        if (x !== startX || y !== startY) moved = true;
        x = startX;
        y = startY;
        continue;
      }
    } else if (command === '' || command === 'Z' || command === 'z') {
      throw new Error(`path-operators: number without a command in ${d.slice(0, 60)}`);
    }
    const upper = command.toUpperCase();
    const relative = command !== upper;
    const n = ARITY[upper]!;
    const args = tokens.slice(i, i + n);
    if (args.length !== n || args.some((a) => typeof a !== 'number'))
      throw new Error(`path-operators: ${command} needs ${n} numbers in ${d.slice(0, 60)}`);
    i += n;
    const v = args as number[];
    const dx = relative ? x : 0;
    const dy = relative ? y : 0;
    switch (upper) {
      case 'M':
        endSub();
        x = v[0]! + dx;
        y = v[1]! + dy;
        startX = x;
        startY = y;
        sub.push(`${num(x)} ${num(y)} m`);
        // Further pairs after a moveto are linetos.
        command = relative ? 'l' : 'L';
        break;
      case 'L':
        sub.push(`${num(v[0]! + dx)} ${num(v[1]! + dy)} l`);
        to(v[0]! + dx, v[1]! + dy);
        break;
      case 'H':
        sub.push(`${num(v[0]! + dx)} ${num(y)} l`);
        to(v[0]! + dx, y);
        break;
      case 'V':
        sub.push(`${num(x)} ${num(v[0]! + dy)} l`);
        to(x, v[0]! + dy);
        break;
      case 'C': {
        const p = [v[0]! + dx, v[1]! + dy, v[2]! + dx, v[3]! + dy, v[4]! + dx, v[5]! + dy];
        sub.push(`${p.map(num).join(' ')} c`);
        if (p.some((c, k) => c !== (k % 2 ? y : x))) moved = true;
        to(p[4]!, p[5]!);
        break;
      }
      case 'A': {
        const ex = v[5]! + dx;
        const ey = v[6]! + dy;
        for (const curve of arcCurves(x, y, v[0]!, v[1]!, v[2]!, v[3]! !== 0, v[4]! !== 0, ex, ey))
          sub.push(`${curve.map(num).join(' ')} c`);
        to(ex, ey);
        break;
      }
    }
  }
  endSub();
  return out.join(' ');
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
