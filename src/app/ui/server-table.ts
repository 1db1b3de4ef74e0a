import { computed, signal, type Signal, type WritableSignal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import { switchMap, type Observable } from 'rxjs';

import { toLoadState, type LoadState } from '../core/load-state';

/** One page of a list as the server answers it. */
export interface ServerPage<T> {
  readonly items: readonly T[];
  readonly total: number;
}

/** A list request's paging, sorting and filters; empty values are left out of the query. */
export type TableQuery = Readonly<Record<string, string | number | boolean | null | undefined>>;

export interface ServerTableOptions<T> {
  readonly sort: Sort;
  readonly pageSize: number;
  /** The table's filters (signals read here make a change reload the table). */
  readonly filters: () => TableQuery;
  readonly load: (query: TableQuery) => Observable<ServerPage<T>>;
}

/**
 * The state of a `mat-table` paged, sorted and filtered on the server: sort and page signals for
 * `matSort` and `mat-paginator`, and the loaded page as a LoadState. Create it in a field
 * initialiser (it needs an injection context).
 */
export class ServerTable<T> {
  readonly sort: WritableSignal<Sort>;
  readonly page: WritableSignal<{ index: number; size: number }>;
  readonly state: Signal<LoadState<ServerPage<T>>>;
  private readonly reloads = signal(0);

  constructor(options: ServerTableOptions<T>) {
    this.sort = signal(options.sort);
    this.page = signal({ index: 0, size: options.pageSize });
    const request = computed(() => ({
      query: {
        page: this.page().index,
        pageSize: this.page().size,
        sort: this.sort().direction ? this.sort().active : '',
        direction: this.sort().direction,
        ...options.filters(),
      },
      reload: this.reloads(),
    }));
    this.state = toSignal(
      toObservable(request).pipe(switchMap(({ query }) => toLoadState(options.load(query)))),
      { initialValue: { status: 'loading' } as LoadState<ServerPage<T>> },
    );
  }

  readonly rows = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value.items : [];
  });
  readonly total = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value.total : 0;
  });
  readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : '';
  });

  /** A new sort or filter starts again from the first page. */
  firstPage(): void {
    this.page.update((page) => ({ ...page, index: 0 }));
  }

  sorted(sort: Sort): void {
    this.sort.set(sort);
    this.firstPage();
  }

  paged(event: PageEvent): void {
    this.page.set({ index: event.pageIndex, size: event.pageSize });
  }

  reload(): void {
    this.reloads.update((n) => n + 1);
  }
}
