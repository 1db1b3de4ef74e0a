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
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import type { ErrorStateMatcher } from '@angular/material/core';
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
  loopShape,
  MAX_TEMPO,
  MIN_TEMPO,
  trainerSteps,
  type TempoTrainer,
} from '../../../../shared/playback/index';
import { PlaybackEngine } from './playback-engine';
import {
  allClear,
  errorWhen,
  loopBarProblems,
  rangeText,
  TRAINER_EVERY_RANGE,
  TRAINER_STEP_RANGE,
  trainerProblems,
  wholeNumberProblem,
  type TrainerDirection,
} from './playback-fields';
import { playbackKeyAction } from './playback-keys';
import type { RunSettings, StartBeat } from './playback-scheduler';

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

type TrainerKey = 'start' | 'step' | 'every' | 'target';

/** One whole-number setting of the tempo trainer, as its number field offers it. */
interface TrainerField {
  readonly key: TrainerKey;
  readonly label: string;
  /** The value typed (null when empty or not a number). */
  readonly draft: WritableSignal<number | null>;
  readonly hint: string;
}

const TEMPO_RANGE = { min: MIN_TEMPO, max: MAX_TEMPO };

/** Above this master volume the hearing caution is shown prominently. */
export const LOUD_VOLUME = 80;

/**
 * Playback controls for one drill: play/stop, tempo, loop, count-in, metronome, mute/solo,
 * volume and the tempo trainer. Emits the bar and beat being heard for the score's cursor.
 */
@Component({
  selector: 'tensile-playback-panel',
  imports: [
    FormsModule,
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
  /** A beat picked on the score: Play starts there (the first pass; later ones loop whole). */
  readonly startFrom = input<StartBeat | null>(null);
  /** The tempo heard now, or that Play would start at (the trainer's start when it is on). */
  readonly tempoInUse = output<number>();

  protected readonly engine = inject(PlaybackEngine);
  protected readonly minTempo = MIN_TEMPO;
  protected readonly maxTempo = MAX_TEMPO;
  protected readonly labels = VOICE_LABELS;

  protected readonly tempo = linkedSignal(() => this.drill().card.tempo);
  protected readonly tempoRange = rangeText(TEMPO_RANGE);
  /** What the tempo field holds; it becomes the tempo only when it is valid. */
  protected readonly tempoDraft = linkedSignal<number | null>(() => this.tempo());
  protected readonly tempoProblem = computed(() =>
    wholeNumberProblem(this.tempoDraft(), TEMPO_RANGE, 'Tempo', ' BPM'),
  );
  protected readonly tempoErrors = errorWhen(this.tempoProblem);
  protected readonly loopMode = signal<LoopMode>('drill');
  protected readonly barCount = computed(() => this.drill().bars.length);
  protected readonly rangeFrom = linkedSignal({ source: this.barCount, computation: () => 1 });
  protected readonly rangeTo = linkedSignal({
    source: this.barCount,
    computation: (count) => count,
  });
  protected readonly fromDraft = linkedSignal<number | null>(() => this.rangeFrom());
  protected readonly toDraft = linkedSignal<number | null>(() => this.rangeTo());
  protected readonly barProblems = computed(() =>
    loopBarProblems(this.fromDraft(), this.toDraft(), this.barCount()),
  );
  protected readonly fromErrors = errorWhen(() => this.barProblems().from);
  protected readonly toErrors = errorWhen(() => this.barProblems().to);
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
  /** Speed up to the target, or (on purpose) come down to it from a faster tempo. */
  protected readonly trainerDirection = linkedSignal<TrainerDirection>(() =>
    this.trainerStart() > this.trainerTarget() ? 'down' : 'up',
  );
  protected readonly directionDraft = linkedSignal(() => this.trainerDirection());
  /** The trainer's settings in the order a teacher sets them; applied only when all are valid. */
  protected readonly trainerFields: readonly TrainerField[] = [
    {
      key: 'start',
      label: 'Start BPM',
      draft: linkedSignal<number | null>(() => this.trainerStart()),
      hint: rangeText(TEMPO_RANGE),
    },
    {
      key: 'step',
      label: 'Step BPM',
      draft: linkedSignal<number | null>(() => this.trainerStep()),
      hint: rangeText(TRAINER_STEP_RANGE),
    },
    {
      key: 'every',
      label: 'Every (loops)',
      draft: linkedSignal<number | null>(() => this.trainerEvery()),
      hint: rangeText(TRAINER_EVERY_RANGE),
    },
    {
      key: 'target',
      label: 'Target BPM',
      draft: linkedSignal<number | null>(() => this.trainerTarget()),
      hint: rangeText(TEMPO_RANGE),
    },
  ];
  protected readonly trainerProblems = computed(() =>
    trainerProblems(
      {
        start: this.trainerDraft('start'),
        step: this.trainerDraft('step'),
        every: this.trainerDraft('every'),
        target: this.trainerDraft('target'),
        direction: this.directionDraft(),
      },
      TEMPO_RANGE,
    ),
  );
  protected readonly trainerOk = computed(() => allClear(this.trainerProblems()));
  protected readonly trainerErrors: Readonly<Record<TrainerKey, ErrorStateMatcher>> = {
    start: errorWhen(() => this.trainerProblems().start),
    step: errorWhen(() => this.trainerProblems().step),
    every: errorWhen(() => this.trainerProblems().every),
    target: errorWhen(() => this.trainerProblems().target),
  };
  /** Where Play starts, in words, when a beat is picked on the score. */
  protected readonly startText = computed(() => {
    const at = this.startFrom();
    if (at === null) return null;
    const shape = loopShape(this.drill(), this.runShape().range, false);
    if (shape.bars.some((bar) => bar.bar === at.bar)) {
      return `Play starts at bar ${at.bar}, beat ${at.beat} (picked on the score).`;
    }
    return `Bar ${at.bar}, beat ${at.beat} is outside the looped bars: Play starts at bar ${shape.bars[0]?.bar ?? 1}.`;
  });

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
    return trainer === null
      ? null
      : {
          steps: trainerSteps(trainer),
          down: trainer.startTempo > trainer.targetTempo,
          ...trainer,
        };
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
      const playing = this.playing() ? this.engine.tempo() : null;
      this.tempoInUse.emit(playing ?? this.trainer()?.startTempo ?? this.tempo());
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
    const startAt = this.startFrom();
    void this.engine.play(this.drill(), { ...this.settings(this.runShape()), startAt });
  }

  /** Tempo from the slider or a key: always inside the range. */
  protected setTempo(value: number): void {
    if (Number.isFinite(value)) this.tempo.set(clampTempo(value));
  }

  /** A typed tempo is used once it is committed (Enter, leaving the field, the spin arrows). */
  protected commitTempo(): void {
    const value = this.tempoDraft();
    if (this.tempoProblem() === null && value !== null) this.tempo.set(value);
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

  /** The typed loop bars are used together, once both are valid and in order. */
  protected commitBars(): void {
    const from = this.fromDraft();
    const to = this.toDraft();
    if (!allClear(this.barProblems()) || from === null || to === null) return;
    this.rangeFrom.set(from);
    this.rangeTo.set(to);
  }

  protected trainerDraft(key: TrainerKey): number | null {
    return this.trainerFields.find((field) => field.key === key)?.draft() ?? null;
  }

  /** The trainer's typed settings are used together, once all of them are valid. */
  protected commitTrainer(): void {
    const [start, step, every, target] = (['start', 'step', 'every', 'target'] as const).map(
      (key) => this.trainerDraft(key),
    );
    if (!this.trainerOk() || start == null || step == null || every == null || target == null) {
      return;
    }
    this.trainerStart.set(start);
    this.trainerStep.set(step);
    this.trainerEvery.set(every);
    this.trainerTarget.set(target);
  }

  protected chooseDirection(direction: TrainerDirection): void {
    this.directionDraft.set(direction);
    this.commitTrainer();
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
