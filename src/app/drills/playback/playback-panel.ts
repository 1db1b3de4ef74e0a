import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  output,
  signal,
  untracked,
  type WritableSignal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSliderModule } from '@angular/material/slider';
import { MatTooltipModule } from '@angular/material/tooltip';
import { VOICE_IDS, type VoiceId } from '../../../../shared/generator/drill';
import type { Drill } from '../../../../shared/generator/index';
import {
  clampTempo,
  MAX_TEMPO,
  MIN_TEMPO,
  trainerSteps,
  type TempoTrainer,
} from '../../../../shared/playback/index';
import { PlaybackEngine } from './playback-engine';
import { playbackKeyAction } from './playback-keys';
import type { RunSettings } from './playback-scheduler';

export type LoopMode = 'once' | 'drill' | 'bars';

/** Voice names as a drummer says them. */
export const VOICE_LABELS: Readonly<Record<VoiceId, string>> = {
  kick: 'Kick',
  snare: 'Snare',
  rim: 'Side stick',
  hihat: 'Hi-hat',
  hihatOpen: 'Open hi-hat',
  hihatFoot: 'Hi-hat foot',
  ride: 'Ride',
  rideBell: 'Ride bell',
  crash: 'Crash',
  tomHigh: 'High tom',
  tomMid: 'Mid tom',
  tomFloor: 'Floor tom',
};

/** Which way each arrow key moves the tempo slider (up and right are faster). */
const SLIDER_ARROWS: Readonly<Record<string, 1 | -1>> = {
  ArrowUp: 1,
  ArrowRight: 1,
  ArrowDown: -1,
  ArrowLeft: -1,
};

/** One whole-number setting of the tempo trainer, as its number field offers it. */
interface TrainerField {
  readonly label: string;
  readonly value: WritableSignal<number>;
  readonly min: number;
  readonly max: number;
}

/** Above this master volume the hearing caution is shown prominently. */
export const LOUD_VOLUME = 80;

/**
 * Playback controls for one drill: play/stop, tempo, loop, count-in, metronome, mute/solo,
 * volume and the tempo trainer. Emits the bar and beat being heard for the score's cursor.
 */
@Component({
  selector: 'tensile-playback-panel',
  imports: [
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatSlideToggleModule,
    MatSliderModule,
    MatTooltipModule,
  ],
  templateUrl: './playback-panel.html',
  styleUrl: './playback-panel.scss',
  providers: [PlaybackEngine],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '(document:keydown)': 'handleKey($event)',
    '(pointerenter)': 'preloadAudio()',
    '(focusin)': 'preloadAudio()',
  },
})
export class PlaybackPanel {
  readonly drill = input.required<Drill>();
  /** The bar and beat being heard, or `null` when stopped or counting in. */
  readonly position = output<{ bar: number; beat: number } | null>();

  protected readonly engine = inject(PlaybackEngine);
  protected readonly minTempo = MIN_TEMPO;
  protected readonly maxTempo = MAX_TEMPO;
  protected readonly labels = VOICE_LABELS;

  protected readonly tempo = linkedSignal(() => this.drill().card.tempo);
  protected readonly loopMode = signal<LoopMode>('drill');
  protected readonly barCount = computed(() => this.drill().bars.length);
  protected readonly rangeFrom = linkedSignal({ source: this.barCount, computation: () => 1 });
  protected readonly rangeTo = linkedSignal({
    source: this.barCount,
    computation: (count) => count,
  });
  protected readonly countIn = signal(true);
  protected readonly metronome = signal(true);
  protected readonly accentFirstBeat = signal(true);
  protected readonly subdivisions = signal(false);
  protected readonly mute = signal<ReadonlySet<VoiceId>>(new Set());
  protected readonly solo = signal<ReadonlySet<VoiceId>>(new Set());
  protected readonly volume = signal(60);
  protected readonly loud = computed(() => this.volume() > LOUD_VOLUME);

  protected readonly trainerOn = signal(false);
  protected readonly trainerStart = linkedSignal(() => clampTempo(this.drill().card.tempo - 20));
  protected readonly trainerStep = signal(4);
  protected readonly trainerEvery = signal(2);
  protected readonly trainerTarget = linkedSignal(() => this.drill().card.tempo);
  /** The trainer's settings in the order a teacher sets them, each kept to its whole range. */
  protected readonly trainerFields: readonly TrainerField[] = [
    { label: 'Start BPM', value: this.trainerStart, min: MIN_TEMPO, max: MAX_TEMPO },
    { label: 'Step BPM', value: this.trainerStep, min: 1, max: 100 },
    { label: 'Every (loops)', value: this.trainerEvery, min: 1, max: 64 },
    { label: 'Target BPM', value: this.trainerTarget, min: MIN_TEMPO, max: MAX_TEMPO },
  ];

  protected readonly voices = computed<readonly VoiceId[]>(() => {
    const used = new Set<VoiceId>(this.drill().card.voices);
    for (const bar of this.drill().bars) for (const hit of bar.hits) used.add(hit.voice);
    return VOICE_IDS.filter((voice) => used.has(voice));
  });

  protected readonly trainer = computed<TempoTrainer | null>(() =>
    this.trainerOn() && this.loopMode() !== 'once'
      ? {
          startTempo: this.trainerStart(),
          stepBpm: this.trainerStep(),
          everyLoops: this.trainerEvery(),
          targetTempo: this.trainerTarget(),
        }
      : null,
  );
  protected readonly trainerPlan = computed(() => {
    const trainer = this.trainer();
    return trainer === null ? null : { steps: trainerSteps(trainer), ...trainer };
  });
  protected readonly playing = computed(() => this.engine.status() === 'playing');

  /** What is heard now, in words, for the status line (and screen readers). */
  protected readonly positionText = computed(() => {
    const position = this.engine.position();
    if (position === null) return this.playing() ? 'Starting…' : 'Stopped';
    if (position.phase === 'countIn') return `Count-in · ${position.beat}`;
    return `Bar ${position.bar} · beat ${position.beat}`;
  });

  /** Settings that restart playback when they change (tempo and mix apply live). */
  private readonly runShape = computed(() => ({
    range:
      this.loopMode() === 'bars'
        ? {
            from: Math.min(this.rangeFrom(), this.rangeTo()),
            to: Math.max(this.rangeFrom(), this.rangeTo()),
          }
        : null,
    countIn: this.countIn(),
    playOnce: this.loopMode() === 'once',
    trainer: this.trainer(),
  }));

  constructor() {
    effect(() => {
      this.engine.setMix({
        mute: this.mute(),
        solo: this.solo(),
        metronome: {
          enabled: this.metronome(),
          accentFirstBeat: this.accentFirstBeat(),
          subdivisions: this.subdivisions(),
        },
      });
    });
    effect(() => this.engine.setVolume(this.volume() / 100));
    effect(() => this.engine.setTempo(this.tempo()));
    effect(() => {
      const drill = this.drill();
      const shape = this.runShape();
      if (untracked(this.playing)) void this.engine.play(drill, this.settings(shape));
    });
    effect(() => {
      const position = this.engine.position();
      this.position.emit(
        position?.phase === 'drill' ? { bar: position.bar, beat: position.beat } : null,
      );
    });
  }

  protected preloadAudio(): void {
    void this.engine.preload().catch(() => undefined);
  }

  /** Play or stop; runs inside the click or key press, so the browser lets audio start. */
  protected togglePlay(): void {
    if (this.playing() || this.engine.status() === 'loading') {
      this.engine.stop();
      return;
    }
    void this.engine.play(this.drill(), this.settings(this.runShape()));
  }

  protected setTempo(value: number): void {
    if (Number.isFinite(value)) this.tempo.set(clampTempo(value));
  }

  protected nudgeTempo(event: KeyboardEvent): void {
    if (event.key !== 'ArrowUp' && event.key !== 'ArrowDown') return;
    event.preventDefault();
    event.stopPropagation();
    const by = (event.shiftKey ? 5 : 1) * (event.key === 'ArrowUp' ? 1 : -1);
    this.setTempo(this.tempo() + by);
  }

  /**
   * Arrow keys on the slider thumb: 1 BPM a press, 5 with Shift, as in the tempo field (a native
   * range input ignores Shift and always moves one step). Page keys, Home and End stay native.
   */
  protected stepTempoSlider(event: KeyboardEvent): void {
    const direction = SLIDER_ARROWS[event.key];
    if (direction === undefined || event.ctrlKey || event.altKey || event.metaKey) return;
    event.preventDefault();
    event.stopPropagation();
    this.setTempo(this.tempo() + direction * (event.shiftKey ? 5 : 1));
  }

  protected setBar(which: 'from' | 'to', value: number): void {
    if (!Number.isFinite(value)) return;
    const bar = Math.min(this.barCount(), Math.max(1, Math.round(value)));
    (which === 'from' ? this.rangeFrom : this.rangeTo).set(bar);
  }

  protected setWhole(field: TrainerField, value: number): void {
    if (Number.isFinite(value)) {
      field.value.set(Math.min(field.max, Math.max(field.min, Math.round(value))));
    }
  }

  protected toggleVoice(kind: 'mute' | 'solo', voice: VoiceId): void {
    const set = kind === 'mute' ? this.mute : this.solo;
    set.update((current) => {
      const next = new Set(current);
      if (!next.delete(voice)) next.add(voice);
      return next;
    });
  }

  protected shortcutHint(index: number): string {
    return index < 9 ? `Mute: key ${index + 1} · Solo: Shift+${index + 1}` : 'No shortcut';
  }

  protected handleKey(event: KeyboardEvent): void {
    const action = playbackKeyAction(event);
    if (action === null) return;
    if (action.kind === 'togglePlay') {
      event.preventDefault();
      this.togglePlay();
    } else if (action.kind === 'tempo') {
      if (this.trainer() !== null) return;
      event.preventDefault();
      this.setTempo(this.tempo() + action.by);
    } else {
      const voice = this.voices()[action.voiceIndex];
      if (voice !== undefined) this.toggleVoice(action.kind, voice);
    }
  }

  private settings(shape: Omit<RunSettings, 'tempo'>): RunSettings {
    return { ...shape, tempo: untracked(this.tempo) };
  }
}
