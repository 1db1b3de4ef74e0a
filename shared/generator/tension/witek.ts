import type { DrillBar, VoiceId } from '../drill';
import { type BarGrid, type MetricalGrid, metricalGrid } from './metrical-grid';

/**
 * Polyphonic syncopation index of M. A. G. Witek, E. F. Clarke, M. Wallentin, M. L. Kringelbach,
 * P. Vuust, "Syncopation, body-movement and pleasure in groove music", PLoS ONE 9(4): e94446, 2014,
 * Methods (the syncopation index of the drum-break stimuli), on the metrical tree of any bar grid.
 *
 * The paper (as quoted word for word by the open implementations rhythmtoolbox, D. Gómez-Marín et
 * al., `poly_sync`, and beatsearch, `PolyphonicSyncopationVectorWitek`) defines two kinds of pair:
 *  - monophonic: a note N that precedes a rest R whose metric weight is greater than or equal to
 *    N's;
 *  - polyphonic: a note N on one instrument that precedes a note Ndi on a different instrument whose
 *    metric weight is greater than or equal to N's.
 * A pair scores S = w(Ndi) − w(N) + I (the paper prints N − Ndi + I; beatsearch notes that the
 * paper's own examples use Ndi − N, the only reading that makes S grow with the syncopation), where
 * the instrument weight I is (confirmed in rhythmtoolbox `poly_sync`, in GrooveToolbox
 * `getPolyphonicSyncopation` by F. Bruford, and in magenta-js `polylhlsyncopation` by T. Kaplan,
 * secondary: the paper's table itself could not be read here):
 *  - kick on N, snare and hi-hat on Ndi: I = 2;
 *  - snare on N, kick and hi-hat on Ndi: I = 1;
 *  - kick or snare on N, hi-hat alone on Ndi: I = 5.
 * The paper's three instruments are bass drum, snare and hi-hat; here they are three classes of
 * voice (low, mid, high: see `WITEK_CLASS_OF_VOICE`).
 *
 * The reading followed here (the implementations differ; see docs/tension.md):
 *  - Positions, not voices, make the pairs. For each struck pulse p (its set A of sounding classes)
 *    let q be the next struck pulse of the bar (set B) and m the greatest weight among the silent
 *    pulses strictly between them (or up to the bar's end when nothing follows).
 *  - The classes syncopated at p are S = A \ B: those that sound at p and not at q. A class that
 *    sounds again at q (the hi-hat keeping time) is not syncopated. This is the per-instrument
 *    reading of the rules, as in rhythmtoolbox (kick + hi-hat then hi-hat alone is kick against the
 *    hi-hat: I = 5), not the exact-set reading of magenta-js (where only "kick alone then hi-hat
 *    alone" gets 5, and every onset preceded by a weaker one scores, so a plain rock beat with the
 *    hi-hat in eighths scores 7 there and 0 here).
 *  - Polyphonic pair (N at p, Ndi at q): when S is not empty, w(q) ≥ w(p) and w(q) ≥ m (no silent
 *    pulse before q is stronger than q: otherwise N is already heard against that rest). Value
 *    w(q) − w(p) + I(S, B). I applies once per pair of positions, whichever of the kick and snare
 *    are syncopated, and is 0 for pairs the paper gives no weight (a hi-hat against a kick, a kick
 *    against a snare alone …): the pair still scores its metric difference, as the definition says.
 *  - Otherwise, monophonic pair (N at p, R the strongest silent pulse before q): when m ≥ w(p),
 *    value m − w(p), with no instrument weight (the paper gives none for rests).
 *  - Each onset enters one pair at most: when both exist, the polyphonic one (its value is then
 *    never less). The index is the sum over the bar's onsets.
 *  - The bar is measured alone, like the Longuet-Higgins & Lee measure (`lhlSyncopation`): no
 *    previous bar, no wrap to the next downbeat (the open implementations loop the pattern).
 *  - Metric weights are the grid's: `-level` of the metrical tree (`metricalGrid`), so tuplet and
 *    mixed grids need nothing special. The implementations read the paper's 4/4 profile as
 *    0, −3, −2, −3, −1, … (beats 2, 3 and 4 equal), where the tree makes beat 3 stronger than 2 and
 *    4 (0, −4, −3, −4, −2, …); `witekOnWeights` takes any per-pulse weights for comparison.
 *
 * Unlike the tension measure, which leaves the ostinato out, this index must hear the time-keeping
 * layer: the paper's strongest rule (I = 5) is a kick or snare against the hi-hat alone, and the
 * hi-hat of a groove is exactly the time keeper. So `witekStreams` takes every hit of the bar and
 * leaves the choice to the caller.
 *
 * Known limits: L. Hoesl, O. Senn, "Modelling perceived syncopation in popular music drum patterns:
 * a preliminary study", Music & Science 1, 2018, found that this model over-weights syncopes on weak
 * metric positions (the large instrument weights dwarf the metric differences of 1 or 2 at the
 * sixteenth level), which inflates its values in the upper range of syncopation.
 */

/** The paper's three instruments as classes of voice. */
export type WitekClass = 'low' | 'mid' | 'high';

/** One onset stream per class, read by pulse (missing = silent). */
export interface WitekStreams {
  readonly low: readonly boolean[];
  readonly mid: readonly boolean[];
  readonly high: readonly boolean[];
}

/**
 * Which of the paper's instruments each voice stands for.
 *  - low: the kick (the paper's bass drum), alone. The floor tom is not low: Witek's weights encode
 *    the roles of the kit's voices in a groove (kick on the strong beats, snare on the backbeat,
 *    hi-hat keeping time), not their pitch band, and the floor tom is a hand voice played with the
 *    snare and rack toms in fills; were it low, a snare-to-floor-tom fill would score the kick-snare
 *    weights meant for the kick under the backbeat. This follows GrooveToolbox (toms with the
 *    snare); rhythmtoolbox sorts by pitch band and puts the low toms with the kick.
 *  - mid: snare, rim (a snare stroke) and the three toms.
 *  - high: the hi-hat in all its forms (closed, open, foot) and the other cymbals (ride, ride bell,
 *    crash): the metallic time-keeping layer the paper's hi-hat stands for (`common practice`: a
 *    ride or foot hi-hat takes over the hi-hat's time keeping).
 */
export const WITEK_CLASS_OF_VOICE: Readonly<Record<VoiceId, WitekClass>> = {
  kick: 'low',
  snare: 'mid',
  rim: 'mid',
  hihat: 'high',
  hihatOpen: 'high',
  hihatFoot: 'high',
  ride: 'high',
  rideBell: 'high',
  crash: 'high',
  tomHigh: 'mid',
  tomMid: 'mid',
  tomFloor: 'mid',
};

/** Class bits of a set of sounding classes (0 = silent, 1..7 = struck). */
export const LOW = 1;
export const MID = 2;
export const HIGH = 4;

/**
 * The paper's instrument weight I for the classes syncopated at N (`syncopated`, not sounding at
 * Ndi) against the classes sounding at Ndi (`closing`), as class bits; 0 where the paper gives none.
 */
export function instrumentWeight(syncopated: number, closing: number): number {
  if (closing === HIGH && (syncopated & (LOW | MID)) !== 0) return 5;
  if (syncopated === LOW && closing === (MID | HIGH)) return 2;
  if (syncopated === MID && closing === (LOW | HIGH)) return 1;
  return 0;
}

/**
 * The value of one onset: struck at `p` with class bits `here`, followed by the next onset at `q`
 * with class bits `next` (q = -1 when nothing follows in the bar), `gapMost` the greatest weight
 * of the silent pulses between them (-Infinity when there are none). Shared with the maximum.
 */
export function onsetValue(
  weights: readonly number[],
  p: number,
  here: number,
  q: number,
  next: number,
  gapMost: number,
): number {
  const wp = weights[p] ?? 0;
  if (q >= 0) {
    const syncopated = here & ~next;
    const wq = weights[q] ?? 0;
    if (syncopated !== 0 && wq >= wp && wq >= gapMost) {
      return wq - wp + instrumentWeight(syncopated, next);
    }
  }
  return gapMost >= wp ? gapMost - wp : 0;
}

/** Class bits per pulse: 0 silent, else LOW | MID | HIGH of the classes struck there. */
export function classBits(streams: WitekStreams, pulses: number): Uint8Array {
  const bits = new Uint8Array(pulses);
  for (let p = 0; p < pulses; p++) {
    bits[p] =
      (streams.low[p] === true ? LOW : 0) |
      (streams.mid[p] === true ? MID : 0) |
      (streams.high[p] === true ? HIGH : 0);
  }
  return bits;
}

/**
 * The raw index on per-pulse metric weights (`weights.length` pulses; greater = stronger). One
 * pass over the bar.
 */
export function witekOnWeights(weights: readonly number[], streams: WitekStreams): number {
  const pulses = weights.length;
  const bits = classBits(streams, pulses);
  let total = 0;
  let p = -1; // the last onset seen
  let gapMost = -Infinity;
  for (let i = 0; i < pulses; i++) {
    const here = bits[i] ?? 0;
    if (here === 0) {
      if (p >= 0) gapMost = Math.max(gapMost, weights[i] ?? 0);
      continue;
    }
    if (p >= 0) total += onsetValue(weights, p, bits[p] ?? 0, i, here, gapMost);
    p = i;
    gapMost = -Infinity;
  }
  if (p >= 0) total += onsetValue(weights, p, bits[p] ?? 0, -1, 0, gapMost);
  return total;
}

/** The metric weight of every pulse of a grid: minus its level in the metrical tree. */
export function gridWeights(grid: MetricalGrid): number[] {
  return grid.level.map((level) => -level);
}

/** Witek's raw index of one bar on a grid already built (weights = -level). */
export function witekOnGrid(grid: MetricalGrid, streams: WitekStreams): number {
  return witekOnWeights(gridWeights(grid), streams);
}

/** Witek's raw index of one bar (builds the grid; use `witekMeter` for many bars). */
export function witekSyncopation(beats: BarGrid, streams: WitekStreams): number {
  return witekOnGrid(metricalGrid(beats), streams);
}

/**
 * The bar's three class streams: every hit counts, whatever its voice, dynamic or source (the
 * ostinato included: the paper's hi-hat is the time keeper; a caller that wants it out filters the
 * bar first). Throws a RangeError for a hit outside the grid.
 */
export function witekStreams(bar: DrillBar, grid: MetricalGrid): WitekStreams {
  const streams = {
    low: new Array<boolean>(grid.pulses).fill(false),
    mid: new Array<boolean>(grid.pulses).fill(false),
    high: new Array<boolean>(grid.pulses).fill(false),
  };
  for (const hit of bar.hits) {
    const slots = grid.beats[hit.beat - 1];
    const start = grid.beatStarts[hit.beat - 1];
    if (slots === undefined || start === undefined || !(hit.slot >= 0 && hit.slot < slots)) {
      throw new RangeError(
        `Bar ${bar.bar} has a hit at beat ${hit.beat}, slot ${hit.slot}, outside its grid.`,
      );
    }
    streams[WITEK_CLASS_OF_VOICE[hit.voice]][start + hit.slot] = true;
  }
  return streams;
}
