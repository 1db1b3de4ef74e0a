/**
 * Offline renders for timing checks: the live scheduler drives an OfflineAudioContext in which
 * every hit and click is the metronome click (it sounds on its first sample; synth voices have
 * attack ramps that would blur the measurement), then onsets are found in the rendered buffer.
 * Plain TypeScript with raw Web Audio, bundled into a page by the browser tests and the bench.
 */
import type { ClickSound, PlayableDrill } from '../../../../shared/playback/index';
import { createClickBuffers, playClick } from './click-voice';
import { PlaybackScheduler, type LiveMix, type RunSettings } from './playback-scheduler';

export interface OfflineRenderRequest {
  readonly drill: PlayableDrill;
  readonly settings: RunSettings;
  readonly mix: {
    readonly mute: readonly string[];
    readonly solo: readonly string[];
    readonly metronome: LiveMix['metronome'];
  };
  readonly seconds: number;
  readonly sampleRate: number;
  /** Audio-clock time of the first beat. */
  readonly startTime: number;
  /** Optional tempo change while playing: scheduled up to `atTime`, then the new tempo. */
  readonly tempoChange?: { readonly atTime: number; readonly tempo: number };
}

export interface OfflineRenderResult {
  readonly sampleRate: number;
  /** Detected onsets, in samples. */
  readonly onsets: number[];
  /** Times handed to the audio clock, one per event (several may share an instant). */
  readonly scheduledTimes: number[];
  readonly segments: { originTime: number; beatNum: number; beatDen: number; tempo: number }[];
}

/** Renders a drill with the click voice and returns the onsets found in the result. */
export async function renderDrillOffline(
  request: OfflineRenderRequest,
): Promise<OfflineRenderResult> {
  const { sampleRate } = request;
  const context = new OfflineAudioContext(1, Math.ceil(request.seconds * sampleRate), sampleRate);
  const clicks = createClickBuffers(context);
  const scheduledTimes: number[] = [];
  const sound = (kind: ClickSound, time: number, velocity: number) => {
    scheduledTimes.push(time);
    playClick(context, clicks[kind], context.destination, time, velocity);
  };
  const mix: LiveMix = {
    mute: new Set(request.mix.mute) as LiveMix['mute'],
    solo: new Set(request.mix.solo) as LiveMix['solo'],
    metronome: request.mix.metronome,
  };
  const scheduler = new PlaybackScheduler(
    request.drill,
    request.settings,
    request.startTime,
    { hit: (_voice, time, velocity) => sound('beat', time, velocity), click: sound },
    () => mix,
  );
  // Leave room for the last click to ring before the end of the buffer.
  const end = request.seconds - 0.05;
  if (request.tempoChange !== undefined) {
    scheduler.pump(request.tempoChange.atTime);
    scheduler.setTempo(request.tempoChange.tempo);
  }
  scheduler.pump(end);
  const buffer = await context.startRendering();
  return {
    sampleRate,
    onsets: detectOnsets(buffer.getChannelData(0), sampleRate),
    scheduledTimes,
    segments: scheduler.segments.map((s) => ({
      originTime: s.originTime,
      beatNum: s.originBeat.num,
      beatDen: s.originBeat.den,
      tempo: s.tempo,
    })),
  };
}

/**
 * Onsets by a peak envelope against a decaying peak-hold threshold: a sample starts an onset
 * when it is above an absolute floor and at least twice the held peak of what came before.
 * (A plain RMS window smears onsets by its length and fires falsely on low, slow waves.)
 */
export function detectOnsets(
  samples: Float32Array,
  sampleRate: number,
  options: { floor?: number; holdSeconds?: number; refractorySeconds?: number } = {},
): number[] {
  const floor = options.floor ?? 0.02;
  const decay = Math.exp(-1 / ((options.holdSeconds ?? 0.002) * sampleRate));
  const refractory = (options.refractorySeconds ?? 0.004) * sampleRate;
  const onsets: number[] = [];
  let held = 0;
  let last = -Infinity;
  for (let i = 0; i < samples.length; i += 1) {
    const level = Math.abs(samples[i] ?? 0);
    if (level > floor && level > 2 * held && i - last > refractory) {
      onsets.push(i);
      last = i;
    }
    held = Math.max(held * decay, level);
  }
  return onsets;
}
