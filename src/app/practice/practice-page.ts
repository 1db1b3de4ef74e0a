import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import { EmptyState } from '../ui/empty-state';
import { LogPractice } from './log-practice';
import { PracticeApi, type LogPage, type Progress } from './practice-api';
import { PracticeLogTable } from './practice-log-table';
import { ProgressChart } from './progress-chart';
import { toObservable } from '@angular/core/rxjs-interop';

/** `/practice`: the student's history table and progress charts, and free practice logging. */
@Component({
  selector: 'tensile-practice-page',
  imports: [MatProgressBarModule, EmptyState, LogPractice, PracticeLogTable, ProgressChart],
  templateUrl: './practice-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PracticePage {
  private readonly api = inject(PracticeApi);
  /** Bumped after each new log, so the table and charts reload. */
  private readonly version = signal(0);
  protected readonly logs = toSignal(
    toObservable(this.version).pipe(switchMap(() => toLoadState(this.api.logs({ pageSize: 50 })))),
    { initialValue: { status: 'loading' } as LoadState<LogPage> },
  );
  protected readonly progress = toSignal(
    toObservable(this.version).pipe(switchMap(() => toLoadState(this.api.progress({})))),
    { initialValue: { status: 'loading' } as LoadState<Progress> },
  );

  protected reload(): void {
    this.version.update((v) => v + 1);
  }
}
