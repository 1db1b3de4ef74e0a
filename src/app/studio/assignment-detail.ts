import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import {
  PracticeApi,
  STATUS_LABEL,
  type AssignmentStatus,
  type Progress,
} from '../practice/practice-api';
import { ProgressChart } from '../practice/progress-chart';
import { StudioApi, type TeacherAssignment } from './studio-api';

/** `/studio/assignments/:id`: each student's status on one assignment, with the charts. */
@Component({
  selector: 'tensile-assignment-detail',
  imports: [MatProgressBarModule, MatTableModule, RouterLink, ProgressChart],
  templateUrl: './assignment-detail.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AssignmentDetail {
  readonly id = input.required<string>();
  private readonly studio = inject(StudioApi);
  private readonly practice = inject(PracticeApi);
  protected readonly statusLabel = STATUS_LABEL;

  protected statusText(status: AssignmentStatus): string {
    return STATUS_LABEL[status];
  }
  protected readonly columns = ['name', 'status', 'best', 'logs', 'minutes'];
  protected readonly assignment = toSignal(
    toObservable(this.id).pipe(switchMap((id) => toLoadState(this.studio.assignment(id)))),
    { initialValue: { status: 'loading' } as LoadState<TeacherAssignment> },
  );
  protected readonly progress = toSignal(
    toObservable(this.id).pipe(
      switchMap((id) => toLoadState(this.practice.progress({ assignmentId: Number(id) }))),
    ),
    { initialValue: { status: 'loading' } as LoadState<Progress> },
  );
  protected readonly names = computed<Record<number, string>>(() => {
    const state = this.assignment();
    return state.status === 'ready'
      ? Object.fromEntries(state.value.students.map((s) => [s.id, s.name]))
      : {};
  });
}
