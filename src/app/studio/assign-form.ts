import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { apiErrorMessage } from '../core/api-error-message';
import { loadStateSignal } from '../core/load-state';
import { StudioApi, type RosterStudent, type TeacherAssignment } from './studio-api';

/** A week from today, as the date field's default. */
function inAWeek(): string {
  return new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10);
}

/** Assign one of the teacher's saved drills or worksheets to some of their students. */
@Component({
  selector: 'tensile-assign-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './assign-form.html',
  styles: `
    form {
      display: grid;
      gap: 4px;
      max-width: 720px;
      margin-top: 16px;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
    }
    .failure {
      color: var(--mat-sys-error);
    }
    button {
      justify-self: start;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AssignForm {
  readonly students = input.required<readonly RosterStudent[]>();
  readonly assigned = output<TeacherAssignment>();

  private readonly api = inject(StudioApi);
  protected readonly drills = loadStateSignal(this.api.drills());
  protected readonly worksheets = loadStateSignal(this.api.worksheets());
  protected readonly form = inject(FormBuilder).group({
    kind: ['drill' as 'drill' | 'worksheet'],
    drillId: [null as number | null, Validators.required],
    worksheetId: [{ value: null as number | null, disabled: true }, Validators.required],
    studentIds: [[] as number[], Validators.required],
    dueDate: [inAWeek(), Validators.required],
    startTempo: [60, [Validators.required, Validators.min(20), Validators.max(300)]],
    targetTempo: [90, [Validators.required, Validators.min(20), Validators.max(300)]],
    note: ['', Validators.maxLength(2000)],
  });
  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly done = signal<string | null>(null);

  constructor() {
    // Only the chosen kind's picker is enabled, so only it is required.
    this.form.controls.kind.valueChanges.pipe(takeUntilDestroyed()).subscribe((kind) => {
      const [on, off] =
        kind === 'worksheet'
          ? [this.form.controls.worksheetId, this.form.controls.drillId]
          : [this.form.controls.drillId, this.form.controls.worksheetId];
      on.enable();
      off.disable();
    });
  }

  protected assign(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.pending.set(true);
    this.failure.set(null);
    this.api
      .assign({
        ...(value.kind === 'worksheet'
          ? { worksheetId: Number(value.worksheetId) }
          : { drillId: Number(value.drillId) }),
        studentIds: value.studentIds ?? [],
        dueDate: value.dueDate ?? '',
        startTempo: Number(value.startTempo),
        targetTempo: Number(value.targetTempo),
        note: value.note ?? '',
      })
      .subscribe({
        next: (assignment) => {
          this.pending.set(false);
          this.done.set(
            `Assigned "${assignment.title}" to ${assignment.students.length} student(s).`,
          );
          this.form.controls.studentIds.reset([]);
          this.assigned.emit(assignment);
        },
        error: (error: unknown) => {
          this.pending.set(false);
          this.failure.set(apiErrorMessage(error, 'It could not be assigned.'));
        },
      });
  }
}
