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
  runTicks,
  thresholdsOf,
  type Thresholds,
} from './sticking/limits';
import { arrayOf } from './arrays';

/**
 * The limbs' rates as the fill sees them, so it never places a stroke they cannot play next to
 * the card's own notes and its other fills in the bar: a foot stroke never too fast for a
 * double, never the third of a row faster than singles, and never the third of three grid
 * notes in a row of a run (one foot does not play three sixteenths running unless the card
 * asks: common practice), nor the third within less than a beat (a dotted quarter in compound
 * meters: 1-e-a on the kick is too busy for a groove); a hand stroke never the third of
 * three within one hand's single-stroke time (two hands, singles: some hand would need a
 * double). Fills of neighbouring bars are not seen (each bar is filled on its own); the
 * sticking stage removes the rare stroke that meets one round a bar line.
 */
export interface LimbWindows {
  readonly grid: Grid;
  /** Per drill instant: the card's hand strokes there, and its voices as bits. */
  readonly obHands: Uint8Array;
  readonly obVoices: Uint16Array;
  readonly foot: Thresholds;
  readonly hand: Thresholds;
  /** The longest gap (ticks) between two grid notes of a run. */
  readonly run: number;
  /** A beat (a dotted-quarter group in a compound meter), in ticks: a foot's busiest span. */
  readonly pulse: number;
  /**
   * Per bar-local instant: the instant offsets (ascending) whose strokes a foot stroke there
   * meets, with their signed distances in ticks (the same in every bar).
   */
  readonly footNear: readonly Near[];
  /** The same for hand strokes; empty when the card allows doubles (not modelled here). */
  readonly handNear: readonly Near[];
}

interface Near {
  readonly offsets: readonly number[];
  readonly ticks: readonly number[];
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
  const barTicks = pace.ticksPerBeat * grid.beatsPerBar;
  const grouping = card.meter.grouping;
  const pulse = pace.ticksPerBeat * (grouping?.length && grouping.every((g) => g === 3) ? 3 : 1);
  const near = (reach: number): Near[] =>
    arrayOf(grid.slotsPerBar, (i) => {
      const offsets: number[] = [];
      const gaps: number[] = [];
      for (let d = -grid.slotsPerBar; d <= grid.slotsPerBar; d++) {
        if (d === 0) continue;
        const j = i + d;
        const bars = Math.floor(j / grid.slotsPerBar);
        const gap = (ticks[j - bars * grid.slotsPerBar] ?? 0) + bars * barTicks - (ticks[i] ?? 0);
        if (Math.abs(gap) > reach) continue;
        offsets.push(d);
        gaps.push(gap);
      }
      return { offsets, ticks: gaps };
    });
  const obHands = new Uint8Array(grid.instants);
  const obVoices = new Uint16Array(grid.instants);
  ob.cells.forEach((cell, instant) => {
    for (const hit of cell) {
      if (isHandVoice(hit.voice)) obHands[instant] = (obHands[instant] ?? 0) + 1;
      obVoices[instant] = (obVoices[instant] ?? 0) | bitOf(hit.voice);
    }
  });
  const none: Near = { offsets: [], ticks: [] };
  return {
    grid,
    obHands,
    obVoices,
    foot,
    hand,
    run: runTicks(pace),
    pulse,
    footNear: near(Math.max(2 * foot.single, 2 * runTicks(pace), pulse)),
    handNear: card.sticking.doubles ? grid.beatOf.map(() => none) : near(hand.single),
  };
}

const bitOf = (voice: VoiceId): number => 1 << VOICE_IDS.indexOf(voice);

/** True when the limb that plays `voice` can add a stroke at bar-local instant `i` of `f`. */
export function limbsAllow(w: LimbWindows, f: BarStrokes, i: number, voice: VoiceId): boolean {
  const handed = isHandVoice(voice);
  const near = handed ? w.handNear[i] : w.footNear[i];
  if (!near || near.offsets.length === 0) return true;
  const { grid } = w;
  const n = grid.instants;
  const start = f.bar * grid.slotsPerBar;
  const bit = bitOf(voice);
  const times: number[] = [];
  // Per stroke in `times`: its bar-local instant offset from i (0 for the strokes here).
  const offsets: number[] = [];
  let mine = -1;
  // Strokes already at this instant (hands only: a foot plays one voice), then the new one.
  const putHere = (): void => {
    const already = handed ? (f.hands[i] ?? 0) : 0;
    for (let k = 0; k < already; k++) {
      times.push(0);
      offsets.push(0);
    }
    mine = times.length;
    times.push(0);
    offsets.push(0);
  };
  near.offsets.forEach((d, k) => {
    if (d > 0 && mine < 0) putHere();
    const local = i + d;
    const inBar = local >= 0 && local < grid.slotsPerBar;
    const j = (((start + local) % n) + n) % n;
    let count: number;
    if (handed) count = inBar ? (f.hands[local] ?? 0) : (w.obHands[j] ?? 0);
    else
      count =
        (inBar && ((f.mask[local] ?? 0) & bit) !== 0) || ((w.obVoices[j] ?? 0) & bit) !== 0 ? 1 : 0;
    const gap = near.ticks[k] ?? 0;
    for (let c = 0; c < count; c++) {
      times.push(gap);
      offsets.push(d);
    }
  });
  if (mine < 0) putHere();
  return handed
    ? handsCan(w.hand, times, mine)
    : footCan(w.foot, times, mine) &&
        !footRun(w.run, times, offsets, mine) &&
        !footBusy(w.pulse, times, mine);
}

/**
 * True when the new stroke makes three foot strokes within less than a beat (1-e-a on the kick,
 * a kick triplet under a 12/8 shuffle): too busy for a groove's kick (common practice).
 */
function footBusy(pulse: number, times: readonly number[], mine: number): boolean {
  for (let a = Math.max(0, mine - 2); a <= mine && a + 2 < times.length; a++)
    if ((times[a + 2] ?? 0) - (times[a] ?? 0) < pulse) return true;
  return false;
}

/** No three hand strokes in a row within one hand's single-stroke time. */
function handsCan(limits: Thresholds, times: readonly number[], mine: number): boolean {
  for (let a = Math.max(0, mine - 2); a <= mine && a + 2 < times.length; a++)
    if ((times[a + 2] ?? 0) - (times[a] ?? 0) <= limits.single) return false;
  return true;
}

/** True when the new stroke makes three grid notes in a row of a run on the foot. */
function footRun(
  run: number,
  times: readonly number[],
  offsets: readonly number[],
  mine: number,
): boolean {
  const step = (k: number): boolean =>
    (offsets[k + 1] ?? 0) - (offsets[k] ?? 0) === 1 && (times[k + 1] ?? 0) - (times[k] ?? 0) <= run;
  for (let a = Math.max(0, mine - 2); a <= mine && a + 2 < times.length; a++)
    if (step(a) && step(a + 1)) return true;
  return false;
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
