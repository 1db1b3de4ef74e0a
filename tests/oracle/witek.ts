/**
 * The oracle's own polyphonic syncopation measure: M. A. G. Witek, E. F. Clarke, M. Wallentin,
 * M. L. Kringelbach, P. Vuust, "Syncopation, body-movement and pleasure in groove music", PLoS ONE
 * 9(4): e94446, 2014, Methods ("syncopation index"). It shares no code with the engine.
 *
 * The paper's definition (as three open implementations that cite it quote and read it; the
 * Methods themselves were not reachable here): if a note N precedes a rest R and R weighs at
 * least as much as N, (N, R) is a monophonic syncopation; if N on one instrument precedes a note
 * on a different instrument (Ndi) weighing at least as much, (N, Ndi) is a polyphonic
 * syncopation. Its degree is S = R − N (weights of the positions), plus an instrument weight I
 * for the polyphonic kinds: the kick syncopated against snare and hi-hat, I = 2; the snare
 * against kick and hi-hat, I = 1; the kick or the snare against the hi-hat alone, I = 5. The
 * index is the sum over the pattern.
 *
 * What the definition leaves open, read as docs/tension.md states it (each a choice, named so a
 * disagreement with the engine can be traced to one):
 * - "precedes": an onset pairs with the next onset of the bar. The instruments syncopated at the
 *   first are those that do not sound again at the next (a hi-hat that keeps time is not). If one
 *   is, the next onset weighs at least as much as the first and no silent slot between weighs
 *   more than the next onset, the pair is polyphonic; otherwise, if the heaviest silent slot
 *   before the next onset (or the bar's end) weighs at least as much as the first, the pair is
 *   monophonic with that rest. One pair per onset at most.
 *   The other reading found in open implementations, `next-slot` (only the very next slot of the
 *   grid counts, as a rest or as Ndi), is kept here to show how far the two readings differ.
 * - the weights are those of the bar's metrical tree (syncopation.ts: minus the depth of the
 *   shallowest node starting at the slot), which on a 4/4 sixteenth grid are the paper's
 *   0, −4, −3, −4, −2, −4, −3, −4, −1, …; nothing after the bar line is heard.
 * - instruments are three classes: low (kick), mid (snare, rim, toms), high (hi-hats, ride,
 *   crash); every hit counts, the ostinato's too.
 * - a pair the paper gives no instrument weight for (kick against snare alone, anything against
 *   the kick alone, the hi-hat against anything) is a polyphonic syncopation with I = 0.
 */

import type { TreeNode } from './syncopation';

export type Stream = 'low' | 'mid' | 'high';

/** The class of each voice of the drill contract (docs/tension.md's table). */
export const STREAM_OF_VOICE: Readonly<Record<string, Stream>> = {
  kick: 'low',
  snare: 'mid',
  rim: 'mid',
  tomHigh: 'mid',
  tomMid: 'mid',
  tomFloor: 'mid',
  hihat: 'high',
  hihatOpen: 'high',
  hihatFoot: 'high',
  ride: 'high',
  rideBell: 'high',
  crash: 'high',
};

/** The weight of every slot of a bar: minus the depth of the shallowest node starting there. */
export function weightsOf(tree: TreeNode): number[] {
  const w = Array<number>(tree.length).fill(-Infinity);
  const walk = (node: TreeNode): void => {
    if (w[node.start]! < node.weight) w[node.start] = node.weight;
    node.children.forEach(walk);
  };
  walk(tree);
  return w;
}

/** What sounds at one slot: the set of streams with an onset there. */
export type Cell = ReadonlySet<Stream>;

export interface Syncopation {
  readonly from: number;
  readonly to: number;
  readonly kind: 'rest' | 'kick-vs-snare' | 'snare-vs-kick' | 'vs-hi-hat' | 'other';
  /** The weight difference (to − from). */
  readonly difference: number;
  /** The instrument weight added to it. */
  readonly instrument: number;
}

/** The instrument weight of a polyphonic pair: what stopped against what sounds next. */
function instrumentOf(stopped: Cell, next: Cell): { kind: Syncopation['kind']; weight: number } {
  const onlyHigh = next.size === 1 && next.has('high');
  if (onlyHigh && (stopped.has('low') || stopped.has('mid')))
    return { kind: 'vs-hi-hat', weight: 5 };
  if (stopped.has('low') && next.has('mid') && next.has('high'))
    return { kind: 'kick-vs-snare', weight: 2 };
  if (stopped.has('mid') && next.has('low') && next.has('high'))
    return { kind: 'snare-vs-kick', weight: 1 };
  return { kind: 'other', weight: 0 };
}

export type Pairing = 'next-onset' | 'next-slot';

/** The pair an onset at `i` makes with the next onset `j` (or the bar's end, j = length). */
function pairOf(
  weights: readonly number[],
  cells: readonly Cell[],
  i: number,
  j: number,
): Syncopation | null {
  const here = cells[i]!;
  let silent = -Infinity;
  let at = -1;
  for (let k = i + 1; k < j; k++)
    if (weights[k]! > silent) {
      silent = weights[k]!;
      at = k;
    }
  if (j < cells.length) {
    const next = cells[j]!;
    const stopped = new Set([...here].filter((s) => !next.has(s)));
    if (stopped.size > 0 && weights[j]! >= weights[i]! && silent <= weights[j]!) {
      const { kind, weight } = instrumentOf(stopped, next);
      return { from: i, to: j, kind, difference: weights[j]! - weights[i]!, instrument: weight };
    }
  }
  if (at >= 0 && silent >= weights[i]!)
    return { from: i, to: at, kind: 'rest', difference: silent - weights[i]!, instrument: 0 };
  return null;
}

/** Every syncopation of one bar: `weights` per slot, `cells` what sounds at each slot. */
export function witekSyncopations(
  weights: readonly number[],
  cells: readonly Cell[],
  pairing: Pairing = 'next-onset',
): Syncopation[] {
  const out: Syncopation[] = [];
  const n = cells.length;
  for (let i = 0; i < n; i++) {
    if (cells[i]!.size === 0) continue;
    let j = i + 1;
    if (pairing === 'next-onset') while (j < n && cells[j]!.size === 0) j++;
    else if (j === n) continue;
    else if (cells[j]!.size === 0) {
      // next-slot: the silent slot right after is the rest; nothing further is read.
      const difference = weights[j]! - weights[i]!;
      if (difference >= 0) out.push({ from: i, to: j, kind: 'rest', difference, instrument: 0 });
      continue;
    }
    const pair = pairOf(weights, cells, i, j);
    if (pair) out.push(pair);
  }
  return out;
}

/** The Witek index of one bar: the sum of S = difference + instrument weight. */
export function witek(
  weights: readonly number[],
  cells: readonly Cell[],
  pairing: Pairing = 'next-onset',
): number {
  return witekSyncopations(weights, cells, pairing).reduce(
    (s, x) => s + x.difference + x.instrument,
    0,
  );
}

const STREAMS: readonly Stream[] = ['low', 'mid', 'high'];

/**
 * The greatest index over every pattern of the three streams on a grid, by trying them all
 * (8^slots: small grids only). The exact value for larger grids is `greatest`.
 */
export function bruteForceGreatest(weights: readonly number[]): number {
  const n = weights.length;
  let most = 0;
  const cells: Cell[] = Array.from({ length: n }, () => new Set<Stream>());
  for (let m = 0; m < 8 ** n; m++) {
    let x = m;
    for (let i = 0; i < n; i++) {
      const bits = x % 8;
      x = Math.floor(x / 8);
      cells[i] = new Set(STREAMS.filter((_, b) => (bits >> b) % 2 === 1));
    }
    most = Math.max(most, witek(weights, cells));
  }
  return most;
}

/**
 * The greatest index (next-onset pairing) over every pattern whose cell at each slot is one of
 * `choices[slot]` (an empty cell is silence), exact: a pair reads only its two onsets and the
 * silence between, so a programme over "the last onset so far and what sounds there" finds it.
 */
export function greatest(
  weights: readonly number[],
  choices: readonly (readonly Cell[])[],
): number {
  const n = weights.length;
  const sounding = choices.map((c) => c.filter((cell) => cell.size > 0));
  const silentOk = choices.map((c) => c.some((cell) => cell.size === 0));
  const cells: Cell[] = weights.map(() => new Set<Stream>());
  const score = (i: number, a: Cell, j: number, b: Cell | null): number => {
    cells[i] = a;
    for (let k = i + 1; k < j; k++) cells[k] = new Set();
    if (b) cells[j] = b;
    const pair = pairOf(weights, cells, i, b ? j : n);
    return pair ? pair.difference + pair.instrument : 0;
  };
  // best[j][c]: the most the slots before j can score when j sounds sounding[j][c] and is the
  // latest onset so far.
  const best: number[][] = [];
  let most = silentOk.every(Boolean) ? 0 : -Infinity;
  for (let j = 0; j < n; j++) {
    const before = silentOk.slice(0, j).every(Boolean);
    best.push(
      sounding[j]!.map((b) => {
        let v = before ? 0 : -Infinity;
        for (let i = j - 1; i >= 0; i--) {
          sounding[i]!.forEach((a, k) => {
            v = Math.max(v, best[i]![k]! + score(i, a, j, b));
          });
          if (!silentOk[i]) break;
        }
        return v;
      }),
    );
    const after = silentOk.slice(j + 1).every(Boolean);
    if (after)
      sounding[j]!.forEach((a, k) => {
        most = Math.max(most, best[j]![k]! + score(j, a, n, null));
      });
  }
  return most;
}

/** Every subset of the streams `from`, as cells. */
export function subsetsOf(from: readonly Stream[]): Cell[] {
  const unique = [...new Set(from)];
  const out: Cell[] = [];
  for (let m = 0; m < 1 << unique.length; m++)
    out.push(new Set(unique.filter((_, b) => (m >> b) % 2 === 1)));
  return out;
}
