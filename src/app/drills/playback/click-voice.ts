/**
 * The metronome click: a short decaying tone burst that starts at full amplitude on its first
 * sample, so it sounds exactly when scheduled (no attack ramp) and its onset can be measured to
 * the sample. Plain Web Audio, shared by the live player and offline renders.
 */
import type { ClickSound } from '../../../../shared/playback/index';

/** Burst pitch per click sound: the accent highest, subdivisions lowest. */
const CLICK_PITCH: Readonly<Record<ClickSound, number>> = {
  accent: 2400,
  beat: 1700,
  subdivision: 1150,
};

const CLICK_SECONDS = 0.03;
/** Decay time constant: short enough that a click has died away before a 32nd at 320 BPM. */
const CLICK_DECAY = 0.0035;

/** The samples of one click at `sampleRate`. */
export function clickSamples(sampleRate: number, sound: ClickSound): Float32Array<ArrayBuffer> {
  const length = Math.round(CLICK_SECONDS * sampleRate);
  const data = new Float32Array(length);
  const omega = (2 * Math.PI * CLICK_PITCH[sound]) / sampleRate;
  for (let i = 0; i < length; i += 1) {
    // Cosine, so sample 0 is the peak: the onset is the very first sample.
    data[i] = Math.cos(omega * i) * Math.exp(-i / (CLICK_DECAY * sampleRate));
  }
  return data;
}

/** A mono click buffer for one sound at the context's sample rate. */
export function createClickBuffer(context: BaseAudioContext, sound: ClickSound): AudioBuffer {
  const data = clickSamples(context.sampleRate, sound);
  const buffer = context.createBuffer(1, data.length, context.sampleRate);
  buffer.copyToChannel(data, 0);
  return buffer;
}

/** All click buffers for a context. */
export function createClickBuffers(context: BaseAudioContext): Record<ClickSound, AudioBuffer> {
  return {
    accent: createClickBuffer(context, 'accent'),
    beat: createClickBuffer(context, 'beat'),
    subdivision: createClickBuffer(context, 'subdivision'),
  };
}

/** Starts one click at `time` on the context's clock, at `velocity` (0..1). */
export function playClick(
  context: BaseAudioContext,
  buffer: AudioBuffer,
  destination: AudioNode,
  time: number,
  velocity: number,
): void {
  const source = context.createBufferSource();
  source.buffer = buffer;
  const gain = context.createGain();
  gain.gain.value = velocity;
  source.connect(gain).connect(destination);
  source.onended = () => gain.disconnect();
  source.start(time);
}
