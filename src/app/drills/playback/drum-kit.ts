/**
 * A synthesised drum kit on Tone.js: every voice is built from oscillators, noise and metal
 * synthesis, so nothing is downloaded. Velocity (from the hit's dynamic) scales each stroke.
 * Tone is passed in, so this module never pulls it into the initial bundle.
 */
import type * as ToneModule from 'tone';
import type { VoiceId } from '../../../../shared/generator/drill';
import type { ClickSound } from '../../../../shared/playback/index';
import { clickSamples } from './click-voice';

type Tone = typeof ToneModule;
type Strike = (time: number, velocity: number) => void;

interface Disposable {
  dispose(): unknown;
}

export class DrumKit {
  private readonly strikes: Record<VoiceId, Strike>;
  private readonly parts: Disposable[] = [];
  private readonly clicks: Record<ClickSound, ToneModule.ToneAudioBuffer>;

  constructor(
    private readonly tone: Tone,
    private readonly output: ToneModule.ToneAudioNode,
  ) {
    const rate = tone.getContext().sampleRate;
    const buffer = (sound: ClickSound) =>
      this.keep(new tone.ToneAudioBuffer().fromArray(clickSamples(rate, sound)));
    this.clicks = {
      accent: buffer('accent'),
      beat: buffer('beat'),
      subdivision: buffer('subdivision'),
    };
    const openHat = this.metal({ decay: 0.5, release: 0.08, resonance: 5200, volume: -17 });
    const chokeOpen: Strike = (time) => openHat.triggerRelease(time);
    this.strikes = {
      kick: this.membrane(52, { pitchDecay: 0.045, octaves: 5, decay: 0.42, volume: 0 }),
      snare: this.snare(),
      rim: this.rim(),
      hihat: this.chain(chokeOpen, this.hat({ decay: 0.05, resonance: 6000, volume: -16 }, 330)),
      hihatOpen: (time, velocity) => openHat.triggerAttack(330, time, velocity),
      hihatFoot: this.chain(
        chokeOpen,
        this.hat({ decay: 0.035, resonance: 3400, volume: -20 }, 260),
      ),
      ride: this.hat(
        { decay: 1.3, resonance: 7600, harmonicity: 3.1, modulationIndex: 14, volume: -24 },
        420,
      ),
      rideBell: this.hat(
        { decay: 0.9, resonance: 4200, harmonicity: 2.2, modulationIndex: 5, volume: -21 },
        720,
      ),
      crash: this.crash(),
      tomHigh: this.membrane(196, { pitchDecay: 0.03, octaves: 2, decay: 0.4, volume: -4 }),
      tomMid: this.membrane(147, { pitchDecay: 0.03, octaves: 2, decay: 0.48, volume: -4 }),
      tomFloor: this.membrane(98, { pitchDecay: 0.035, octaves: 2, decay: 0.6, volume: -3 }),
    };
  }

  /** Strikes one voice at `time` (audio-clock seconds). */
  play(voice: VoiceId, time: number, velocity: number): void {
    this.strikes[voice](time, velocity);
  }

  /** One metronome click; it starts on its first sample, exactly at `time`. */
  click(sound: ClickSound, time: number, velocity: number): void {
    const source = new this.tone.ToneBufferSource(this.clicks[sound]).connect(this.output);
    source.onended = () => source.dispose();
    source.start(time, 0, undefined, velocity);
  }

  dispose(): void {
    for (const part of this.parts.splice(0)) part.dispose();
  }

  private keep<T extends Disposable>(part: T): T {
    this.parts.push(part);
    return part;
  }

  private chain(...strikes: Strike[]): Strike {
    return (time, velocity) => strikes.forEach((strike) => strike(time, velocity));
  }

  private membrane(
    frequency: number,
    o: { pitchDecay: number; octaves: number; decay: number; volume: number },
  ): Strike {
    const synth = this.keep(
      new this.tone.MembraneSynth({
        pitchDecay: o.pitchDecay,
        octaves: o.octaves,
        volume: o.volume,
        envelope: { attack: 0.001, decay: o.decay, sustain: 0, release: 0.05 },
      }).connect(this.output),
    );
    return (time, velocity) => synth.triggerAttackRelease(frequency, o.decay, time, velocity);
  }

  private metal(o: {
    decay: number;
    release?: number;
    resonance: number;
    harmonicity?: number;
    modulationIndex?: number;
    volume: number;
  }): ToneModule.MetalSynth {
    return this.keep(
      new this.tone.MetalSynth({
        harmonicity: o.harmonicity ?? 5.1,
        modulationIndex: o.modulationIndex ?? 32,
        resonance: o.resonance,
        octaves: 1.5,
        volume: o.volume,
        envelope: { attack: 0.001, decay: o.decay, sustain: 0, release: o.release ?? 0.02 },
      }).connect(this.output),
    );
  }

  private hat(o: Parameters<DrumKit['metal']>[0], frequency: number): Strike {
    const synth = this.metal(o);
    return (time, velocity) => synth.triggerAttackRelease(frequency, o.decay, time, velocity);
  }

  private noise(decay: number, filter: ToneModule.Filter, volume: number): ToneModule.NoiseSynth {
    return this.keep(
      new this.tone.NoiseSynth({
        noise: { type: 'white' },
        volume,
        envelope: { attack: 0.001, decay, sustain: 0, release: 0.02 },
      }).connect(filter),
    );
  }

  private filter(frequency: number, type: BiquadFilterType): ToneModule.Filter {
    return this.keep(new this.tone.Filter(frequency, type).connect(this.output));
  }

  /** Snare: bright filtered noise (the wires) over a short pitched body. */
  private snare(): Strike {
    const wires = this.noise(0.17, this.filter(1800, 'highpass'), -8);
    const body = this.membrane(190, { pitchDecay: 0.02, octaves: 1.5, decay: 0.11, volume: -6 });
    return (time, velocity) => {
      wires.triggerAttackRelease(0.17, time, velocity);
      body(time, velocity);
    };
  }

  /** Side stick: a short woody knock plus a click of band-passed noise. */
  private rim(): Strike {
    const knock = this.membrane(620, { pitchDecay: 0.006, octaves: 1, decay: 0.045, volume: -8 });
    const tick = this.noise(0.02, this.filter(3200, 'bandpass'), -12);
    return (time, velocity) => {
      knock(time, velocity);
      tick.triggerAttackRelease(0.02, time, velocity);
    };
  }

  /** Crash: a long metallic wash plus high noise. */
  private crash(): Strike {
    const metal = this.hat(
      { decay: 1.6, resonance: 4800, harmonicity: 8.5, modulationIndex: 40, volume: -22 },
      300,
    );
    const air = this.noise(1.4, this.filter(3500, 'highpass'), -20);
    return (time, velocity) => {
      metal(time, velocity);
      air.triggerAttackRelease(1.4, time, velocity);
    };
  }
}
