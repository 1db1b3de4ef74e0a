import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import { PracticeApi, type LogPage, type Progress } from '../practice/practice-api';
import { PracticeLogTable } from '../practice/practice-log-table';
import { ProgressChart } from '../practice/progress-chart';
import { StudioApi, type RosterStudent } from './studio-api';

/** `/studio/students/:id`: one student's practice history and progress charts. */
@Component({
  selector: 'tensile-student-progress',
  imports: [MatProgressBarModule, RouterLink, PracticeLogTable, ProgressChart],
  templateUrl: './student-progress.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudentProgress {
  readonly id = input.required<string>();
  private readonly practice = inject(PracticeApi);
  private readonly studio = inject(StudioApi);
  private readonly studentId = computed(() => Number(this.id()));

  protected readonly roster = toSignal(this.studio.roster(), {
    initialValue: [] as readonly RosterStudent[],
  });
  protected readonly student = computed(() => this.roster().find((s) => s.id === this.studentId()));
  protected readonly names = computed<Record<number, string>>(() => ({
    [this.studentId()]: this.student()?.name ?? 'Clean tempo',
  }));
  protected readonly logs = toSignal(
    toObservable(this.studentId).pipe(
      switchMap((studentId) => toLoadState(this.practice.logs({ studentId, pageSize: 100 }))),
    ),
    { initialValue: { status: 'loading' } as LoadState<LogPage> },
  );
  protected readonly progress = toSignal(
    toObservable(this.studentId).pipe(
      switchMap((studentId) => toLoadState(this.practice.progress({ studentId }))),
    ),
    { initialValue: { status: 'loading' } as LoadState<Progress> },
  );
}
