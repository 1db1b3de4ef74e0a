import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { filter, switchMap, type Observer } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import { apiErrorWithDetails } from '../rule-cards/api-details';
import { debounced } from '../rule-cards/debounced';
import { inputText } from '../rule-cards/input-text';
import type { Page } from '../rule-cards/rule-cards-api';
import { confirmAction } from '../ui/confirm-dialog';
import { EmptyState } from '../ui/empty-state';
import { WorksheetsApi, type WorksheetSummary } from './worksheets-api';

/** The teacher's worksheets: a server-side table with search, sort, paging, duplicate and delete. */
@Component({
  selector: 'tensile-worksheets',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
    EmptyState,
  ],
  templateUrl: './worksheets.html',
  styles: `
    .toolbar {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 12px;
      align-items: center;
      margin-bottom: 12px;
    }
    .table-wrap {
      overflow-x: auto;
    }
    table {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Worksheets {
  private readonly api = inject(WorksheetsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['title', 'itemCount', 'paper', 'updatedAt', 'actions'];
  protected readonly q = signal('');
  protected readonly sort = signal<Sort>({ active: 'updatedAt', direction: 'desc' });
  protected readonly page = signal({ index: 0, size: 20 });
  private readonly reload = signal(0);
  private readonly typedQ = debounced(this.q, 250);

  protected readonly state = toSignal(
    toObservable(
      computed(() => ({
        page: this.page().index,
        pageSize: this.page().size,
        sort: this.sort().direction ? this.sort().active : '',
        direction: this.sort().direction,
        q: this.typedQ().trim(),
        reload: this.reload(),
      })),
    ).pipe(switchMap(({ reload: _reload, ...query }) => toLoadState(this.api.list(query)))),
    { initialValue: { status: 'loading' } as LoadState<Page<WorksheetSummary>> },
  );
  protected readonly rows = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value.items : [];
  });
  protected readonly total = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value.total : 0;
  });
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : '';
  });

  protected search(event: Event): void {
    this.q.set(inputText(event));
    this.page.update((page) => ({ ...page, index: 0 }));
  }

  protected sorted(sort: Sort): void {
    this.sort.set(sort);
    this.page.update((page) => ({ ...page, index: 0 }));
  }

  protected paged(event: PageEvent): void {
    this.page.set({ index: event.pageIndex, size: event.pageSize });
  }

  protected duplicate(sheet: WorksheetSummary): void {
    this.api.duplicate(sheet.id).subscribe(this.done((copy) => `Made "${copy.title}".`));
  }

  protected remove(sheet: WorksheetSummary): void {
    confirmAction(this.dialog, {
      title: `Delete "${sheet.title}"?`,
      message:
        'The worksheet is destroyed. Its drills stay among your saved drills. This cannot be undone.',
      confirm: 'Delete',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.api.remove(sheet.id)),
      )
      .subscribe(this.done(() => `Deleted "${sheet.title}".`));
  }

  private done<T>(message: (value: T) => string): Partial<Observer<T>> {
    return {
      next: (value) => {
        this.snackBar.open(message(value), undefined, { duration: 4000 });
        this.reload.update((n) => n + 1);
      },
      error: (error: unknown) => this.snackBar.open(apiErrorWithDetails(error), 'Dismiss'),
    };
  }
}
