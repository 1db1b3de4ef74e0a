/**
 * The look-ahead scheduler: walks the pure event list pass by pass and hands every event due
 * before a horizon to a sink, with its exact time on the audio clock. Framework-free, so the
 * live player and offline renders run the very same code ("A tale of two clocks", C. Wilson,
 * 2013: schedule against the audio clock, a timer only decides when to look ahead).
 */
import type { VoiceId } from '../../../../shared/generator/drill';
import {
  changeTempo,
  clickSound,
  countInEvents,
  cursorAt,
  isVoiceAudible,
  loopEvents,
  loopShape,
  loopStartBeat,
  rational,
  segmentForBeat,
  segmentForTime,
  beatAtTime,
  timeOfBeat,
  trainerLoopStartSeconds,
  trainerStepForLoop,
  clickVelocity,
  compareRational,
  type BarRange,
  type ClickSound,
  type CursorPosition,
  type LoopShape,
  type MetronomeOptions,
  type PlayableDrill,
  type PlaybackEvent,
  type TempoSegment,
  type TempoTrainer,
  type TrainerStep,
} from '../../../../shared/playback/index';

/** Where the scheduler sends what must sound. */
export interface PlaybackSink {
  hit(voice: VoiceId, time: number, velocity: number): void;
  click(sound: ClickSound, time: number, velocity: number): void;
}

/** Settings fixed for one run (changing them restarts playback). */
export interface RunSettings {
  readonly tempo: number;
  /** `null` loops the whole drill. */
  readonly range: BarRange | null;
  readonly countIn: boolean;
  /** Play the drill (or range) once instead of looping. */
  readonly playOnce: boolean;
  /** Drives the tempo loop by loop when set (then `tempo` is ignored). */
  readonly trainer: TempoTrainer | null;
  /**
   * Where the first pass starts (a beat picked on the score); later passes play the whole loop.
   * A beat outside the looped bars, or none, starts at the loop's first beat.
   */
  readonly startAt?: StartBeat | null;
}

/** A bar and beat as written, counted from 1. */
export interface StartBeat {
  readonly bar: number;
  readonly beat: number;
}

/** Beats from the start of a pass to `at`, or 0 when `at` is not among the looped bars. */
export function startOffset(shape: LoopShape, at: StartBeat | null | undefined): number {
  if (!at) return 0;
  const index = shape.bars.findIndex((bar) => bar.bar === at.bar);
  const bar = shape.bars[index];
  if (bar === undefined || at.beat < 1 || at.beat > bar.beats.length) return 0;
  return (shape.barOffsets[index] ?? 0) + at.beat - 1;
}

/** Settings read at the moment each event is handed over, so changes are heard at once. */
export interface LiveMix {
  readonly mute: ReadonlySet<VoiceId>;
  readonly solo: ReadonlySet<VoiceId>;
  readonly metronome: MetronomeOptions;
}

/** A scheduled event, for tests and renders that want to know what was sent. */
export interface DispatchedEvent {
  readonly event: PlaybackEvent;
  readonly time: number;
}

export class PlaybackScheduler {
  readonly shape: LoopShape;
  private readonly segmentList: TempoSegment[];
  private pending: PlaybackEvent[] = [];
  private nextLoop = 0;
  private horizon: number;
  private finished = false;
  /** Beats of the first pass skipped to start at the picked beat. */
  readonly skippedBeats: number;

  /**
   * @param startTime audio-clock time of the first beat (of the count-in, if any)
   */
  constructor(
    drill: PlayableDrill,
    private readonly settings: RunSettings,
    readonly startTime: number,
    private readonly sink: PlaybackSink,
    private readonly mix: () => LiveMix,
  ) {
    this.shape = loopShape(drill, settings.range, settings.countIn);
    const tempo = settings.trainer ? trainerStepForLoop(settings.trainer, 0).tempo : settings.tempo;
    this.skippedBeats = startOffset(this.shape, settings.startAt);
    this.segmentList = [{ originTime: startTime, originBeat: rational(0), tempo }];
    if (this.skippedBeats > 0) {
      // After the count-in the music jumps to the picked beat: one more segment, same tempo.
      const countIn = this.shape.countInBeats;
      this.segmentList.push({
        originTime: startTime + (countIn * 60) / tempo,
        originBeat: rational(countIn + this.skippedBeats),
        tempo,
      });
      if (countIn === 0) this.segmentList.shift();
    }
    this.pending = countInEvents(this.shape, tempo);
    this.horizon = startTime;
  }

  get segments(): readonly TempoSegment[] {
    return this.segmentList;
  }

  /** Audio-clock time at which playback ends (play-once runs), else `null`. */
  get endTime(): number | null {
    if (!this.settings.playOnce) return null;
    return this.timeOf(rational(loopStartBeat(this.shape, 1)));
  }

  /** The tempo now in force at the scheduling horizon. */
  get tempo(): number {
    return this.segmentList[this.segmentList.length - 1]?.tempo ?? this.settings.tempo;
  }

  /**
   * Hands over every event due before `horizon`. Events more than `lateLimit` seconds behind
   * `now` (after a stalled tab) are dropped rather than played in a burst.
   */
  pump(horizon: number, now = -Infinity, lateLimit = 0.05): DispatchedEvent[] {
    const sent: DispatchedEvent[] = [];
    for (;;) {
      if (this.pending.length === 0 && !this.queueNextLoop()) break;
      const event = this.pending[0];
      if (event === undefined) break;
      const time = this.timeOf(event.at);
      if (time >= horizon) break;
      this.pending.shift();
      if (time >= now - lateLimit && this.dispatch(event, time)) sent.push({ event, time });
    }
    this.horizon = Math.max(this.horizon, horizon);
    return sent;
  }

  /**
   * Changes the tempo at the scheduling horizon (everything handed over keeps its time) and keeps
   * the bar position. Ignored while the tempo trainer drives the tempo.
   */
  setTempo(tempo: number): void {
    if (this.settings.trainer !== null) return;
    const current = segmentForTime(this.segmentList, this.horizon);
    if (current === undefined || current.tempo === tempo) return;
    this.segmentList.push(changeTempo(current, this.horizon, tempo));
  }

  /** The cursor at audio-clock time `time`. */
  positionAt(time: number): CursorPosition | null {
    const segment = segmentForTime(this.segmentList, time);
    if (segment === undefined || time < this.startTime) return null;
    const end = this.endTime;
    if (end !== null && time >= end) return null;
    return cursorAt(this.shape, beatAtTime(segment, time));
  }

  /** The trainer's step during the loop playing at `time` (`null` without a trainer). */
  trainerStepAt(time: number): TrainerStep | null {
    if (this.settings.trainer === null) return null;
    const position = this.positionAt(time);
    const loop = position?.phase === 'drill' ? position.loop : 0;
    return trainerStepForLoop(this.settings.trainer, loop);
  }

  private timeOf(at: PlaybackEvent['at']): number {
    const segment = segmentForBeat(this.segmentList, at) ?? this.segmentList[0];
    if (segment === undefined) throw new Error('The scheduler has no tempo.');
    return timeOfBeat(segment, at);
  }

  private queueNextLoop(): boolean {
    if (this.finished) return false;
    const loop = this.nextLoop;
    if (this.settings.playOnce && loop > 0) {
      this.finished = true;
      return false;
    }
    const trainer = this.settings.trainer;
    if (trainer !== null) this.addTrainerSegment(trainer, loop);
    this.pending = loopEvents(this.shape, this.tempo, loop);
    if (loop === 0 && this.skippedBeats > 0) {
      const from = rational(this.shape.countInBeats + this.skippedBeats);
      this.pending = this.pending.filter((event) => compareRational(event.at, from) >= 0);
    }
    this.nextLoop += 1;
    return this.pending.length > 0;
  }

  /** A trainer tempo segment starts on the loop's first beat, its time summed exactly. */
  private addTrainerSegment(trainer: TempoTrainer, loop: number): void {
    const { tempo } = trainerStepForLoop(trainer, loop);
    if (tempo === this.tempo) return;
    const seconds = trainerLoopStartSeconds(
      trainer,
      this.shape.lengthBeats,
      this.shape.countInBeats,
      loop,
    );
    // The first pass was shortened by the beats skipped, all at the start tempo.
    const skipped = (this.skippedBeats * 60) / trainerStepForLoop(trainer, 0).tempo;
    this.segmentList.push({
      originTime: this.startTime + seconds - skipped,
      originBeat: rational(loopStartBeat(this.shape, loop)),
      tempo,
    });
  }

  private dispatch(event: PlaybackEvent, time: number): boolean {
    const mix = this.mix();
    if (event.kind === 'hit') {
      if (event.voice === null || !isVoiceAudible(event.voice, mix)) return false;
      this.sink.hit(event.voice, time, event.velocity);
      return true;
    }
    const sound = clickSound(event, mix.metronome);
    if (sound === null) return false;
    this.sink.click(sound, time, clickVelocity(sound));
    return true;
  }
}
