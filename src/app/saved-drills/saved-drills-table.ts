import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { debounced } from '../rule-cards/debounced';
import { inputText } from '../rule-cards/input-text';
import { EmptyState } from '../ui/empty-state';
import { ServerTable } from '../ui/server-table';
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
    @switch (table.state().status) {
      @case ('loading') {
        <mat-progress-bar mode="indeterminate" aria-label="Loading saved drills" />
      }
      @case ('error') {
        <tensile-empty-state icon="cloud_off" heading="Saved drills could not load">
          {{ table.errorMessage() }}
        </tensile-empty-state>
      }
    }
    <div [hidden]="table.state().status !== 'ready' || table.total() === 0">
      <table
        mat-table
        [dataSource]="table.rows()"
        matSort
        [matSortActive]="table.sort().active"
        [matSortDirection]="table.sort().direction"
        (matSortChange)="table.sorted($event)"
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
        [length]="table.total()"
        [pageIndex]="table.page().index"
        [pageSize]="table.page().size"
        [pageSizeOptions]="[10, 20, 50]"
        (page)="table.paged($event)"
        aria-label="Pages of saved drills"
      />
    </div>
    @if (table.state().status === 'ready' && table.total() === 0) {
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
  private readonly typedQ = debounced(this.q, 200);
  protected readonly table = new ServerTable<SavedDrillSummary>({
    sort: { active: 'createdAt', direction: 'desc' },
    pageSize: 10,
    filters: () => ({ q: this.typedQ().trim() }),
    load: (query) => this.api.list(query),
  });

  protected search(event: Event): void {
    this.q.set(inputText(event));
    this.table.firstPage();
  }
}
