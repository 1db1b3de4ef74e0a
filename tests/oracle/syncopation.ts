/**
 * The oracle's own syncopation measure, written from docs/tension.md and the papers it names; it
 * shares no code with the engine (an explicit tree of nodes, a list of terminal nodes, a plain
 * backward scan).
 *
 * Measure: H. C. Longuet-Higgins and C. S. Lee, "The rhythmic interpretation of monophonic
 * music", Music Perception 1(4), 1984, pp. 424–441. The bar is parsed down its metrical tree: a
 * silent node is a rest, a node with an onset on its first pulse and silence after it is a note,
 * any other node is divided. A node weighs minus its depth; a first child keeps its parent's
 * weight. Each rest pairs with the nearest earlier note whose weight is not above its own and adds
 * the difference. The pairing as the reference implementation reads it: C. Song, M. Pearce and
 * C. Harte, "SynPy: a Python toolkit for syncopation modelling", SMC 2015 (LHL.py), on one bar
 * with nothing carried in from a previous bar.
 *
 * Tree (docs/tension.md): bar → groups of the meter's grouping (when it has more than one) →
 * beats → slots; every division by a composite number is split into prime steps, smallest
 * first; a division into one part adds no level.
 */

export interface TreeNode {
  readonly start: number;
  readonly length: number;
  readonly depth: number;
  /** Minus the depth of the shallowest node starting where this one starts. */
  readonly weight: number;
  readonly children: readonly TreeNode[];
}

function smallestPrime(n: number): number {
  for (let p = 2; p * p <= n; p++) if (n % p === 0) return p;
  return n;
}

/** A unit of the tree's construction: builds its node at a depth, given its weight. */
type Unit = {
  readonly length: number;
  build(start: number, depth: number, weight: number): TreeNode;
};

/** `units` side by side as one node, divided by the smallest prime of their count, and so on. */
function join(units: readonly Unit[], start: number, depth: number, weight: number): TreeNode {
  if (units.length === 1) return units[0]!.build(start, depth, weight);
  const p = smallestPrime(units.length);
  const per = units.length / p;
  const children: TreeNode[] = [];
  let at = start;
  for (let k = 0; k < p; k++) {
    const part = units.slice(k * per, (k + 1) * per);
    children.push(join(part, at, depth + 1, k === 0 ? weight : -(depth + 1)));
    at += part.reduce((s, u) => s + u.length, 0);
  }
  return { start, length: at - start, depth, weight, children };
}

const slotUnit: Unit = {
  length: 1,
  build: (start, depth, weight) => ({ start, length: 1, depth, weight, children: [] }),
};

const beatUnit = (slots: number): Unit => ({
  length: slots,
  build: (start, depth, weight) =>
    join(
      Array.from({ length: slots }, () => slotUnit),
      start,
      depth,
      weight,
    ),
});

/** The metrical tree of a bar of `subs` (slots per beat), grouped by `grouping` when given. */
export function barTree(subs: readonly number[], grouping: readonly number[] | null): TreeNode {
  const beats = subs.map(beatUnit);
  if (!grouping || grouping.length <= 1) return join(beats, 0, 0, 0);
  const groups: Unit[] = [];
  let b = 0;
  for (const size of grouping) {
    const mine = beats.slice(b, b + size);
    b += size;
    groups.push({
      length: mine.reduce((s, u) => s + u.length, 0),
      build: (start, depth, weight) => join(mine, start, depth, weight),
    });
  }
  return join(groups, 0, 0, 0);
}

interface Terminal {
  readonly kind: 'N' | 'R';
  readonly weight: number;
}

function parse(node: TreeNode, onsets: readonly boolean[], out: Terminal[]): void {
  let count = 0;
  for (let i = node.start; i < node.start + node.length; i++) if (onsets[i]) count++;
  if (count === 0) out.push({ kind: 'R', weight: node.weight });
  else if (count === 1 && onsets[node.start]) out.push({ kind: 'N', weight: node.weight });
  else for (const child of node.children) parse(child, onsets, out);
}

/** The Longuet-Higgins & Lee syncopation of one bar's onsets (by slot of the bar). */
export function lhl(tree: TreeNode, onsets: readonly boolean[]): number {
  const terminals: Terminal[] = [];
  parse(tree, onsets, terminals);
  let total = 0;
  for (let i = 1; i < terminals.length; i++) {
    const rest = terminals[i]!;
    if (rest.kind !== 'R') continue;
    for (let j = i - 1; j >= 0; j--) {
      const note = terminals[j]!;
      if (note.kind === 'N' && note.weight <= rest.weight) {
        total += rest.weight - note.weight;
        break;
      }
    }
  }
  return total;
}

/** Greatest LHL over every onset pattern, by trying them all (small grids only: 2^slots). */
export function bruteForceRange(
  tree: TreeNode,
  forced: readonly boolean[],
  allowed: readonly boolean[],
): { least: number; most: number } {
  const free = allowed.flatMap((a, i) => (a && !forced[i] ? [i] : []));
  const onsets = forced.slice();
  let least = Infinity;
  let most = -Infinity;
  for (let m = 0; m < 1 << free.length; m++) {
    free.forEach((slot, k) => (onsets[slot] = (m >> k) % 2 === 1));
    const v = lhl(tree, onsets);
    least = Math.min(least, v);
    most = Math.max(most, v);
  }
  return { least, most };
}

/**
 * Least and greatest LHL over every onset pattern that sounds every `forced` slot, only
 * `allowed` slots besides, and at most `budget` of the slots marked `costly` (an onset there
 * would add an overlap to the bar; the linear rule's budget), exact.
 *
 * Dynamic programme over the tree, in time order. What a later rest needs from the past is the
 * list of notes it could still pair with: a newer note hides every older note weighing as much or
 * more (the nearest note not heavier than any rest that could pair with those is the newer one),
 * so the list is strictly lighter going back. Each node is parsed as a rest, a note, or (when it
 * is neither) its children; the children's joint shape (silent, note-shaped, other) rules out the
 * splits that would really parse as a rest or a note.
 */
export function exactRange(
  tree: TreeNode,
  forced: readonly boolean[],
  allowed: readonly boolean[],
  costly: readonly boolean[] = [],
  budget = Infinity,
): { least: number; most: number } {
  type Shape = 'silent' | 'note' | 'other';
  interface Outcome {
    readonly visible: readonly number[];
    readonly shape: Shape;
    readonly used: number;
    least: number;
    most: number;
  }
  const cap = Number.isFinite(budget) ? budget : Infinity;
  const keyOf = (o: Pick<Outcome, 'visible' | 'shape' | 'used'>): string =>
    `${o.visible.join(',')}|${o.shape}|${o.used}`;
  const gain = (visible: readonly number[], rest: number): number => {
    for (const w of visible) if (w <= rest) return rest - w;
    return 0;
  };
  const push = (visible: readonly number[], note: number): number[] => [
    note,
    ...visible.filter((w) => w < note),
  ];
  const add = (into: Map<string, Outcome>, o: Outcome): void => {
    const k = keyOf(o);
    const had = into.get(k);
    if (!had) into.set(k, { ...o });
    else {
      had.least = Math.min(had.least, o.least);
      had.most = Math.max(had.most, o.most);
    }
  };
  const anyForced = (from: number, to: number): boolean => {
    for (let i = from; i < to; i++) if (forced[i]) return true;
    return false;
  };
  const memo = new Map<string, Outcome[]>();

  const walk = (node: TreeNode, visible: readonly number[], used: number): Outcome[] => {
    const k = `${node.start}:${node.depth}:${visible.join(',')}:${used}`;
    const known = memo.get(k);
    if (known) return known;
    const out = new Map<string, Outcome>();
    const end = node.start + node.length;
    if (!anyForced(node.start, end)) {
      const g = gain(visible, node.weight);
      add(out, { visible, shape: 'silent', used, least: g, most: g });
    }
    const first = node.start;
    if ((forced[first] || allowed[first]) && !anyForced(first + 1, end)) {
      const cost = !forced[first] && costly[first] ? 1 : 0;
      if (used + cost <= cap)
        add(out, {
          visible: push(visible, node.weight),
          shape: 'note',
          used: used + cost,
          least: 0,
          most: 0,
        });
    }
    if (node.children.length > 0) {
      let partial: Outcome[] = [{ visible, shape: 'silent', used, least: 0, most: 0 }];
      node.children.forEach((child, c) => {
        const next = new Map<string, Outcome>();
        for (const p of partial)
          for (const o of walk(child, p.visible, p.used)) {
            // The joint shape: silent while all are silent; note-shaped when the first child is
            // a note and every later one silent; otherwise other.
            const shape: Shape =
              p.shape === 'silent' && o.shape === 'silent'
                ? 'silent'
                : c === 0 && o.shape === 'note'
                  ? 'note'
                  : p.shape === 'note' && o.shape === 'silent'
                    ? 'note'
                    : 'other';
            add(next, {
              visible: o.visible,
              shape,
              used: o.used,
              least: p.least + o.least,
              most: p.most + o.most,
            });
          }
        partial = [...next.values()];
      });
      for (const p of partial) if (p.shape === 'other') add(out, p);
    }
    const result = [...out.values()];
    memo.set(k, result);
    return result;
  };

  const all = walk(tree, [], 0);
  if (all.length === 0) return { least: NaN, most: NaN };
  return {
    least: Math.min(...all.map((o) => o.least)),
    most: Math.max(...all.map((o) => o.most)),
  };
}

/** A raw value on the 0..1 scale of a grid whose greatest value is `most`, to 4 decimals. */
export function scaled(raw: number, most: number): number {
  return most === 0 ? 0 : Math.round((raw / most) * 10_000) / 10_000;
}
