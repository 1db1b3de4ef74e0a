import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSnackBar } from '@angular/material/snack-bar';
import { apiErrorMessage } from '../core/api-error-message';
import { PracticeApi, type PracticeLog } from './practice-api';

/**
 * "Log practice": minutes, the highest tempo played cleanly, a 1–5 self-rating and a note. The
 * tempo starts from what the playback reached (e.g. the tempo trainer) until the student edits it.
 */
@Component({
  selector: 'tensile-log-practice',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  templateUrl: './log-practice.html',
  styleUrl: './log-practice.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LogPractice {
  readonly assignmentId = input<number | null>(null);
  /** For a worksheet assignment, the drill of it being practised. */
  readonly assignmentDrillId = input<number | null>(null);
  /** The tempo heard in playback; pre-fills the clean tempo while the field is untouched. */
  readonly suggestedTempo = input<number | null>(null);
  readonly logged = output<PracticeLog>();

  private readonly api = inject(PracticeApi);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly ratings = [1, 2, 3, 4, 5] as const;
  protected readonly form = inject(FormBuilder).group({
    minutes: [20 as number | null, [Validators.required, Validators.min(1), Validators.max(600)]],
    tempo: [null as number | null, [Validators.required, Validators.min(20), Validators.max(300)]],
    rating: [3, Validators.required],
    note: ['', Validators.maxLength(2000)],
  });
  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly saved = signal<string | null>(null);

  constructor() {
    effect(() => {
      const tempo = this.suggestedTempo();
      untracked(() => {
        const control = this.form.controls.tempo;
        if (tempo !== null && !control.dirty) control.setValue(tempo);
      });
    });
  }

  protected save(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.pending.set(true);
    this.failure.set(null);
    this.saved.set(null);
    this.api
      .log({
        assignmentId: this.assignmentId(),
        assignmentDrillId: this.assignmentDrillId(),
        minutes: Number(value.minutes),
        tempo: Number(value.tempo),
        rating: Number(value.rating),
        note: value.note ?? '',
      })
      .subscribe({
        next: (log) => {
          this.pending.set(false);
          const message = `Logged ${log.minutes} minutes at ${log.tempo} BPM.`;
          this.saved.set(message);
          this.snackBar.open(`${message} Well played!`, 'OK', { duration: 5000 });
          this.form.controls.note.reset('');
          this.logged.emit(log);
        },
        error: (error: unknown) => {
          this.pending.set(false);
          this.failure.set(apiErrorMessage(error, 'The practice could not be logged.'));
        },
      });
  }
}
