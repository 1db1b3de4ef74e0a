/**
 * Shared by the playback timing journey and its bench: renders a scenario in a page that holds
 * the offline-render bundle, and computes the ideal onsets independently, with exact fractions
 * of BigInts, straight from the drill's positions (not through the scheduler's code).
 */
import type { Page } from 'playwright-core';
import type { DrillBar } from '../../shared/generator/drill';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import type {
  OfflineRenderRequest,
  OfflineRenderResult,
} from '../../src/app/drills/playback/offline-render';

export const SAMPLE_RATE = 44_100;
/** Audio-clock time of the first beat in every render: 2205 samples. */
export const START_TIME = 0.05;

export type TimingScenario = Omit<OfflineRenderRequest, 'sampleRate' | 'startTime'> & {
  readonly name: string;
  readonly drill: { readonly bars: readonly DrillBar[] };
};

/** What the offline-render bundle puts on `window.__bundle`. */
interface RenderBundle {
  renderDrillOffline(request: OfflineRenderRequest): Promise<OfflineRenderResult>;
}

export function renderScenario(page: Page, s: TimingScenario): Promise<OfflineRenderResult> {
  const { name: _name, ...request } = s;
  return page.evaluate(
    (r) => (window as unknown as { __bundle: RenderBundle }).__bundle.renderDrillOffline(r),
    { ...request, sampleRate: SAMPLE_RATE, startTime: START_TIME } as OfflineRenderRequest,
  );
}

interface Fraction {
  readonly n: bigint;
  readonly d: bigint;
}

const gcd = (a: bigint, b: bigint): bigint => (b === 0n ? (a < 0n ? -a : a) : gcd(b, a % b));
function frac(n: bigint | number, d: bigint | number = 1n): Fraction {
  const nn = BigInt(n);
  const dd = BigInt(d);
  const g = gcd(nn, dd) || 1n;
  return { n: nn / g, d: dd / g };
}
const add = (a: Fraction, b: Fraction) => frac(a.n * b.d + b.n * a.d, a.d * b.d);
const sub = (a: Fraction, b: Fraction) => frac(a.n * b.d - b.n * a.d, a.d * b.d);
const mul = (a: Fraction, n: number, d: number) => frac(a.n * BigInt(n), a.d * BigInt(d));
const less = (a: Fraction, b: Fraction) => a.n * b.d < b.n * a.d;
const toNumber = (a: Fraction) => Number(a.n) / Number(a.d);

/** Ideal onset positions in samples, one per distinct sounding instant, sorted. */
export function idealOnsets(s: TimingScenario, result: OfflineRenderResult): number[] {
  const bars = s.settings.range
    ? s.drill.bars.slice(s.settings.range.from - 1, s.settings.range.to)
    : s.drill.bars;
  const loopBeats = bars.reduce((sum, bar) => sum + bar.beats.length, 0);
  const countIn = s.settings.countIn ? (bars[0]?.beats.length ?? 0) : 0;
  const end = s.seconds - 0.05;
  const start = frac(START_TIME * 20, 20); // 1/20 s exactly
  const seconds = secondsOf(s, result, start, loopBeats, countIn);
  const instants = new Map<string, number>();
  const sound = (beats: Fraction, loop: number) => {
    const t = seconds(beats, loop);
    if (toNumber(t) < end) instants.set(`${beats.n}/${beats.d}`, toNumber(t) * SAMPLE_RATE);
  };
  for (let beat = 0; beat < countIn; beat += 1) sound(frac(beat), -1);
  const { mute, solo, metronome } = s.mix;
  const audible = (voice: string) =>
    !mute.includes(voice) && (solo.length === 0 || solo.includes(voice));
  let loopStart = frac(countIn);
  for (let loop = 0; toNumber(seconds(loopStart, loop)) < end; loop += 1) {
    let barStart = loopStart;
    for (const bar of bars) {
      bar.beats.forEach((slots, b) => {
        for (let slot = 0; slot < slots; slot += 1) {
          const at = add(barStart, frac(b * slots + slot, slots));
          const click = metronome.enabled && (slot === 0 || metronome.subdivisions);
          const hit = bar.hits.some((h) => h.beat === b + 1 && h.slot === slot && audible(h.voice));
          if (click || hit) sound(at, loop);
        }
      });
      barStart = add(barStart, frac(bar.beats.length));
    }
    loopStart = barStart;
    if (s.settings.playOnce) break;
  }
  return [...instants.values()].sort((a, b) => a - b);
}

/** Seconds of a beat position under the scenario's tempo plan, exactly. */
function secondsOf(
  s: TimingScenario,
  result: OfflineRenderResult,
  start: Fraction,
  loopBeats: number,
  countIn: number,
): (beats: Fraction, loop: number) => Fraction {
  const trainer = s.settings.trainer;
  if (trainer !== null) {
    // Ascending ladder: loop k plays at min(start + k·step, target); loops begin after the
    // count-in (at the start tempo) and every earlier loop at its own tempo.
    const tempoOf = (loop: number) =>
      Math.min(trainer.startTempo + Math.max(0, loop) * trainer.stepBpm, trainer.targetTempo);
    return (beats, loop) => {
      let t = add(start, mul(frac(countIn), 60, trainer.startTempo));
      for (let k = 0; k < loop; k += 1) t = add(t, mul(frac(loopBeats), 60, tempoOf(k)));
      const loopStart = frac(countIn + Math.max(0, loop) * loopBeats);
      if (loop < 0) return add(start, mul(beats, 60, trainer.startTempo));
      return add(t, mul(sub(beats, loopStart), 60, tempoOf(loop)));
    };
  }
  const change = s.tempoChange === undefined ? undefined : result.segments[1];
  return (beats) => {
    if (change !== undefined) {
      const origin = frac(change.beatNum, change.beatDen);
      if (!less(beats, origin)) {
        // The change's origin time is the page's float; everything after it is exact.
        const originTime = frac(Math.round(change.originTime * 2 ** 40), 2n ** 40n);
        return add(originTime, mul(sub(beats, origin), 60, change.tempo));
      }
    }
    return add(start, mul(beats, 60, s.settings.tempo));
  };
}

/** The largest distance, in samples, between detected onsets and ideal ones, paired in order. */
export function worstError(onsets: readonly number[], ideal: readonly number[]): number {
  if (onsets.length !== ideal.length) return Infinity;
  return onsets.reduce(
    (worst, onset, i) => Math.max(worst, Math.abs(onset - (ideal[i] ?? Infinity))),
    0,
  );
}

const quintupletCard = parseRuleCard({
  meter: { beats: 4, unit: 4 },
  bars: 2,
  subdivision: 5,
  // Written at 90 (7.5 notes a second, within one hand's single strokes); played at the
  // scenarios' own tempi below.
  tempo: 90,
  voices: ['kick', 'snare', 'hihat'],
  ostinato: { voice: 'hihat', slots: [0, 2, 4] },
  density: 0.4,
  rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: 0 }],
});
const septupletCard = parseRuleCard({
  meter: { beats: 3, unit: 4 },
  bars: 2,
  subdivision: 7,
  tempo: 97,
  voices: ['kick', 'snare', 'ride'],
  ostinato: { voice: 'ride', slots: [0, 3, 5] },
  density: 0.35,
  rules: [],
});
const quintuplets = generateDrill(quintupletCard, 'timing-5');
const septuplets = generateDrill(septupletCard, 'timing-7');

const metronome = { enabled: true, accentFirstBeat: true, subdivisions: false };

function scenario(
  name: string,
  bars: readonly DrillBar[],
  tempo: number,
  extra: Partial<TimingScenario> = {},
): TimingScenario {
  return {
    name,
    drill: { bars },
    settings: { tempo, range: null, countIn: true, playOnce: false, trainer: null },
    mix: { mute: [], solo: [], metronome },
    seconds: Math.min(14, 0.15 + ((4 + 2 * 8) * 60) / tempo),
    ...extra,
  };
}

/** Quintuplets and septuplets at 40, 97 and 300 BPM, a tempo-trainer run and a live change. */
export const TIMING_SCENARIOS: TimingScenario[] = [
  ...[40, 97, 300].map((tempo) => scenario(`quintuplets at ${tempo} BPM`, quintuplets.bars, tempo)),
  ...[40, 97, 300].map((tempo) =>
    scenario(`septuplets at ${tempo} BPM with subdivision clicks`, septuplets.bars, tempo, {
      mix: { mute: ['kick'], solo: [], metronome: { ...metronome, subdivisions: true } },
    }),
  ),
  scenario('septuplets, tempo trainer 97 → 300 BPM', septuplets.bars, 97, {
    settings: {
      tempo: 97,
      range: { from: 2, to: 2 },
      countIn: true,
      playOnce: false,
      trainer: { startTempo: 97, stepBpm: 61, everyLoops: 1, targetTempo: 300 },
    },
    seconds: 9,
  }),
  scenario('quintuplets, 97 → 151 BPM while playing', quintuplets.bars, 97, {
    tempoChange: { atTime: 3.3, tempo: 151 },
    seconds: 8,
  }),
];
