import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import type { Page } from '../rule-cards/rule-cards-api';
import { debounced } from '../rule-cards/debounced';
import { inputText } from '../rule-cards/input-text';
import { EmptyState } from '../ui/empty-state';
import { SavedDrillsApi, type SavedDrillSummary } from './saved-drills-api';

/** The teacher's saved drills: a server-side table with search, sort and paging. */
@Component({
  selector: 'tensile-saved-drills-table',
  imports: [
    MatFormFieldModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
    EmptyState,
  ],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Search saved drills</mat-label>
      <input matInput [value]="q()" (input)="search($event)" />
    </mat-form-field>
    @switch (state().status) {
      @case ('loading') {
        <mat-progress-bar mode="indeterminate" aria-label="Loading saved drills" />
      }
      @case ('error') {
        <tensile-empty-state icon="cloud_off" heading="Saved drills could not load">
          {{ errorMessage() }}
        </tensile-empty-state>
      }
    }
    <div [hidden]="state().status !== 'ready' || total() === 0">
      <table
        mat-table
        [dataSource]="rows()"
        matSort
        [matSortActive]="sort().active"
        [matSortDirection]="sort().direction"
        (matSortChange)="sorted($event)"
        aria-label="Saved drills"
      >
        <ng-container matColumnDef="title">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Title</th>
          <td mat-cell *matCellDef="let drill">
            <a [routerLink]="['/saved-drills', drill.id]">{{ drill.title }}</a>
          </td>
        </ng-container>
        <ng-container matColumnDef="seed">
          <th mat-header-cell *matHeaderCellDef>Seed</th>
          <td mat-cell *matCellDef="let drill">{{ drill.seed }}</td>
        </ng-container>
        <ng-container matColumnDef="createdAt">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Saved</th>
          <td mat-cell *matCellDef="let drill">{{ drill.createdAt.slice(0, 10) }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
      <mat-paginator
        [length]="total()"
        [pageIndex]="page().index"
        [pageSize]="page().size"
        [pageSizeOptions]="[10, 20, 50]"
        (page)="paged($event)"
        aria-label="Pages of saved drills"
      />
    </div>
    @if (state().status === 'ready' && total() === 0) {
      <tensile-empty-state icon="bookmark_border" heading="No saved drills yet">
        @if (q()) {
          No saved drill matches "{{ q() }}".
        } @else {
          Save a drill from the rule-card editor to keep it here, exactly as it was.
        }
      </tensile-empty-state>
    }
  `,
  styles: `
    :host {
      display: grid;
      gap: 8px;
    }
    table {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SavedDrillsTable {
  private readonly api = inject(SavedDrillsApi);
  protected readonly columns = ['title', 'seed', 'createdAt'];
  protected readonly q = signal('');
  protected readonly sort = signal<Sort>({ active: 'createdAt', direction: 'desc' });
  protected readonly page = signal({ index: 0, size: 10 });
  private readonly typedQ = debounced(this.q, 200);
  protected readonly state = toSignal(
    toObservable(
      computed(() => ({
        page: this.page().index,
        pageSize: this.page().size,
        sort: this.sort().direction ? this.sort().active : '',
        direction: this.sort().direction,
        q: this.typedQ().trim(),
      })),
    ).pipe(switchMap((query) => toLoadState(this.api.list(query)))),
    { initialValue: { status: 'loading' } as LoadState<Page<SavedDrillSummary>> },
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
}
