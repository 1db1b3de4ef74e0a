import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import type * as ToneModule from 'tone';
import type { CursorPosition, PlayableDrill, TrainerStep } from '../../../../shared/playback/index';
import type { DrumKit } from './drum-kit';
import type { LiveMix, PlaybackScheduler, RunSettings } from './playback-scheduler';

type Tone = typeof ToneModule;
type AudioRuntime = typeof import('./audio-runtime');

export type PlaybackStatus = 'idle' | 'loading' | 'playing' | 'blocked' | 'error';

/** How far ahead events are handed to the audio clock, and how often we look. */
const LOOK_AHEAD_SECONDS = 0.12;
const TICK_SECONDS = 0.025;
/** Time between pressing Play and the first beat, so the first events are not late. */
const START_DELAY_SECONDS = 0.15;
/** How long to wait for the browser to let audio start before telling the user. */
const RESUME_TIMEOUT_MS = 1500;

const SILENT_MIX: LiveMix = {
  mute: new Set(),
  solo: new Set(),
  metronome: { enabled: false, accentFirstBeat: false, subdivisions: false },
};

/**
 * Plays drills on the audio clock. Tone.js is loaded on first use (never in the initial bundle),
 * audio starts only from a user gesture, and the cursor follows the audio clock, not a timer.
 * Provide it per panel: it owns its kit and stops when the panel goes away.
 */
@Injectable()
export class PlaybackEngine {
  readonly status = signal<PlaybackStatus>('idle');
  readonly position = signal<CursorPosition | null>(null);
  readonly trainerStep = signal<TrainerStep | null>(null);
  /** The tempo in force now (follows the tempo trainer). */
  readonly tempo = signal<number | null>(null);

  private tone: Tone | null = null;
  private loading: Promise<AudioRuntime> | null = null;
  private kit: DrumKit | null = null;
  private bus: ToneModule.Gain | null = null;
  private master: ToneModule.Gain | null = null;
  private scheduler: PlaybackScheduler | null = null;
  private ticker: number | null = null;
  private frame: number | null = null;
  private mix: LiveMix = SILENT_MIX;
  private volume = 0.6;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.dispose());
  }

  /** Fetches the audio code (Tone.js, kit, scheduler) ahead of the first Play, silently. */
  preload(): Promise<AudioRuntime> {
    this.loading ??= import('./audio-runtime').then((runtime) => {
      this.tone = runtime.Tone;
      return runtime;
    });
    return this.loading;
  }

  /**
   * Starts (or restarts) playback. Call it from the Play click or key press: browsers only let
   * audio start from a user gesture.
   */
  async play(drill: PlayableDrill, settings: RunSettings): Promise<void> {
    this.stopScheduling();
    if (this.status() !== 'playing') this.status.set('loading');
    let runtime: AudioRuntime;
    try {
      runtime = await this.preload();
      await Promise.race([runtime.Tone.start(), delay(RESUME_TIMEOUT_MS)]);
    } catch {
      this.status.set('error');
      return;
    }
    const context = runtime.Tone.getContext();
    if (context.state !== 'running') {
      this.status.set('blocked');
      return;
    }
    const kit = this.ensureKit(runtime);
    const start = context.currentTime + START_DELAY_SECONDS;
    this.openBus(start);
    this.scheduler = new runtime.PlaybackScheduler(
      drill,
      settings,
      start,
      {
        hit: (voice, time, velocity) => kit.play(voice, time, velocity),
        click: (sound, time, velocity) => kit.click(sound, time, velocity),
      },
      () => this.mix,
    );
    this.status.set('playing');
    this.tick();
    this.ticker = context.setInterval(() => this.tick(), TICK_SECONDS);
    this.followCursor();
  }

  /** Stops at once: scheduled sounds are faded out and the cursor cleared. */
  stop(): void {
    this.stopScheduling();
    const tone = this.tone;
    if (tone !== null && this.bus !== null) {
      const now = tone.getContext().currentTime;
      this.bus.gain.cancelScheduledValues(now);
      this.bus.gain.setValueAtTime(this.bus.gain.getValueAtTime(now), now);
      this.bus.gain.linearRampToValueAtTime(0, now + 0.03);
    }
    if (this.status() !== 'blocked') this.status.set('idle');
  }

  /** Changes the tempo while playing, keeping the bar position (ignored under the trainer). */
  setTempo(tempo: number): void {
    this.scheduler?.setTempo(tempo);
  }

  /** Mute, solo and metronome settings; heard from the next event on. */
  setMix(mix: LiveMix): void {
    this.mix = mix;
  }

  /** Master volume, 0..1 (an audio taper: gain = v²). */
  setVolume(volume: number): void {
    this.volume = Math.min(1, Math.max(0, volume));
    if (this.tone !== null && this.master !== null) {
      this.master.gain.rampTo(this.volume ** 2, 0.05);
    }
  }

  private tick(): void {
    const tone = this.tone;
    const scheduler = this.scheduler;
    if (tone === null || scheduler === null) return;
    const now = tone.getContext().currentTime;
    scheduler.pump(now + LOOK_AHEAD_SECONDS, now);
    const end = scheduler.endTime;
    if (end !== null && now > end + 0.3) this.stop();
  }

  /** Reads the audio clock every frame, minus the output latency, so the cursor shows what is heard. */
  private followCursor(): void {
    const step = () => {
      const tone = this.tone;
      const scheduler = this.scheduler;
      if (tone === null || scheduler === null) return;
      const raw = tone.getContext().rawContext as AudioContext;
      const heard = raw.currentTime - (raw.outputLatency || raw.baseLatency || 0);
      const position = scheduler.positionAt(heard);
      if (!samePosition(position, this.position())) this.position.set(position);
      const trainer = scheduler.trainerStepAt(heard);
      if (!sameStep(trainer, this.trainerStep())) this.trainerStep.set(trainer);
      this.tempo.set(trainer?.tempo ?? scheduler.tempo);
      this.frame = requestAnimationFrame(step);
    };
    this.frame = requestAnimationFrame(step);
  }

  private ensureKit(runtime: AudioRuntime): DrumKit {
    if (this.kit !== null) return this.kit;
    const tone = runtime.Tone;
    const master = new tone.Gain(this.volume ** 2);
    // A limiter keeps loud unisons (kick + crash + accents) from clipping.
    master.chain(new tone.Limiter(-1), tone.getDestination());
    this.master = master;
    this.bus = new tone.Gain(0).connect(master);
    this.kit = new runtime.DrumKit(tone, this.bus);
    return this.kit;
  }

  private openBus(start: number): void {
    const gain = this.bus?.gain;
    if (gain === undefined) return;
    gain.cancelScheduledValues(start - 0.02);
    gain.setValueAtTime(1, start - 0.01);
  }

  private stopScheduling(): void {
    if (this.ticker !== null) this.tone?.getContext().clearInterval(this.ticker);
    if (this.frame !== null) cancelAnimationFrame(this.frame);
    this.ticker = null;
    this.frame = null;
    this.scheduler = null;
    this.position.set(null);
    this.trainerStep.set(null);
    this.tempo.set(null);
  }

  private dispose(): void {
    this.stop();
    this.kit?.dispose();
    this.bus?.dispose();
    this.master?.dispose();
    this.kit = null;
  }
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

function samePosition(a: CursorPosition | null, b: CursorPosition | null): boolean {
  if (a === null || b === null) return a === b;
  if (a.phase !== b.phase || a.beat !== b.beat) return false;
  return a.phase === 'countIn' || (b.phase === 'drill' && a.bar === b.bar && a.loop === b.loop);
}

function sameStep(a: TrainerStep | null, b: TrainerStep | null): boolean {
  return a === b || (a !== null && b !== null && a.step === b.step && a.tempo === b.tempo);
}
