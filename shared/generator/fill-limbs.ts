import { isHandVoice, VOICE_IDS, type VoiceId } from './drill';
import type { Grid } from './grid';
import type { Obligations } from './obligations';
import type { RuleCard } from './schema';
import {
  FOOT_LIMITS,
  Gap,
  gapOf,
  HAND_LIMITS,
  instantTicks,
  paceOf,
  thresholdsOf,
  type Thresholds,
} from './sticking/limits';

/**
 * The limbs' rates as the fill sees them, so it never places a stroke they cannot play next to
 * the card's own notes and its other fills in the bar: a foot stroke never too fast for a
 * double and never the third of a row faster than singles; a hand stroke never the third of
 * three within one hand's single-stroke time (two hands, singles: some hand would need a
 * double). Fills of neighbouring bars are not seen (each bar is filled on its own); the
 * sticking stage removes the rare stroke that meets one round a bar line.
 */
export interface LimbWindows {
  readonly grid: Grid;
  readonly ob: Obligations;
  readonly ticks: Float64Array;
  readonly loop: number;
  readonly foot: Thresholds;
  readonly hand: Thresholds;
  /** Per bar-local instant: instant offsets (ascending) whose strokes a foot stroke there meets. */
  readonly footNear: readonly (readonly number[])[];
  /** The same for hand strokes; empty lists when the card allows doubles (not modelled here). */
  readonly handNear: readonly (readonly number[])[];
}

/** What a fill's bar holds so far: per bar-local instant, fill voices (bits) and hand strokes. */
export interface BarStrokes {
  readonly bar: number;
  readonly mask: readonly number[];
  readonly hands: readonly number[];
}

export function limbWindows(card: RuleCard, grid: Grid, ob: Obligations): LimbWindows {
  const pace = paceOf(grid, card.tempo);
  const foot = thresholdsOf(pace, FOOT_LIMITS);
  const hand = thresholdsOf(pace, HAND_LIMITS);
  const ticks = instantTicks(grid);
  const near = (reach: number): number[][] =>
    Array.from({ length: grid.slotsPerBar }, (_, i) => {
      const out: number[] = [];
      for (let d = -grid.slotsPerBar; d <= grid.slotsPerBar; d++) {
        if (d === 0) continue;
        const j = i + d;
        const bars = Math.floor(j / grid.slotsPerBar);
        const at =
          (ticks[j - bars * grid.slotsPerBar] ?? 0) + bars * pace.ticksPerBeat * grid.beatsPerBar;
        if (Math.abs(at - (ticks[i] ?? 0)) <= reach) out.push(d);
      }
      return out;
    });
  return {
    grid,
    ob,
    ticks,
    loop: pace.loop,
    foot,
    hand,
    footNear: near(2 * foot.single),
    handNear: card.sticking.doubles ? grid.beatOf.map(() => []) : near(hand.single),
  };
}

const bitOf = (voice: VoiceId): number => 1 << VOICE_IDS.indexOf(voice);

/** True when the limb that plays `voice` can add a stroke at bar-local instant `i` of `f`. */
export function limbsAllow(w: LimbWindows, f: BarStrokes, i: number, voice: VoiceId): boolean {
  const near = isHandVoice(voice) ? w.handNear[i] : w.footNear[i];
  if (!near || near.length === 0) return true;
  const { grid } = w;
  const start = f.bar * grid.slotsPerBar;
  const here = start + i;
  const times: number[] = [];
  let mine = -1;
  const bit = bitOf(voice);
  // Strokes already at this instant (hands only: a foot plays one voice), then the new one.
  const already = isHandVoice(voice) ? (f.hands[i] ?? 0) : 0;
  let pastHere = false;
  const putHere = (): void => {
    for (let k = 0; k < already; k++) times.push(0);
    mine = times.length;
    times.push(0);
    pastHere = true;
  };
  for (const d of near) {
    if (d > 0 && !pastHere) putHere();
    const j = here + d;
    const inBar = j >= start && j < start + grid.slotsPerBar;
    const cell = w.ob.cells[((j % grid.instants) + grid.instants) % grid.instants] ?? [];
    const gap = tickDistance(w, here, j) * Math.sign(d);
    let count = 0;
    if (isHandVoice(voice)) {
      count = inBar ? (f.hands[j - start] ?? 0) : cell.filter((h) => isHandVoice(h.voice)).length;
    } else {
      const filled = inBar && ((f.mask[j - start] ?? 0) & bit) !== 0;
      count = filled || cell.some((h) => h.voice === voice) ? 1 : 0;
    }
    for (let k = 0; k < count; k++) times.push(gap);
  }
  if (!pastHere) putHere();
  return isHandVoice(voice) ? handsCan(w.hand, times, mine) : footCan(w.foot, times, mine);
}

/** Ticks from instant `a` to `b` (either way round the loop, the nearer). */
function tickDistance(w: LimbWindows, a: number, b: number): number {
  const n = w.grid.instants;
  const ta = w.ticks[((a % n) + n) % n] ?? 0;
  const tb = w.ticks[((b % n) + n) % n] ?? 0;
  const d = Math.abs(tb - ta);
  return Math.min(d, w.loop - d);
}

/** No three hand strokes in a row within one hand's single-stroke time. */
function handsCan(limits: Thresholds, times: readonly number[], mine: number): boolean {
  for (let a = Math.max(0, mine - 2); a <= mine && a + 2 < times.length; a++)
    if ((times[a + 2] ?? 0) - (times[a] ?? 0) <= limits.single) return false;
  return true;
}

/** No gap too fast for a double next to the new stroke, and no triple faster than singles. */
function footCan(limits: Thresholds, times: readonly number[], mine: number): boolean {
  const kind = (k: number): Gap => gapOf(limits, (times[k + 1] ?? 0) - (times[k] ?? 0));
  if (mine > 0 && kind(mine - 1) === Gap.TooFast) return false;
  if (mine + 1 < times.length && kind(mine) === Gap.TooFast) return false;
  for (let a = Math.max(0, mine - 2); a <= mine && a + 2 < times.length; a++)
    if (kind(a) !== Gap.Single && kind(a + 1) !== Gap.Single) return false;
  return true;
}
