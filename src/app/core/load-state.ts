import { Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { Observable, catchError, map, of, startWith } from 'rxjs';

import { apiErrorMessage } from './api-error-message';

/** A request's visible state: loading, its value, or a message saying what went wrong. */
export type LoadState<T> =
  | { readonly status: 'loading' }
  | { readonly status: 'ready'; readonly value: T }
  | { readonly status: 'error'; readonly message: string };

/** Pipes a request into LoadState so a template can show progress, data or the error in words. */
export function toLoadState<T>(request: Observable<T>): Observable<LoadState<T>> {
  return request.pipe(
    map((value): LoadState<T> => ({ status: 'ready', value })),
    startWith<LoadState<T>>({ status: 'loading' }),
    catchError((error: unknown) =>
      of<LoadState<T>>({ status: 'error', message: apiErrorMessage(error) }),
    ),
  );
}

/** `toLoadState` as a signal; call in an injection context (a field initialiser). */
export function loadStateSignal<T>(request: Observable<T>): Signal<LoadState<T>> {
  return toSignal(toLoadState(request), { requireSync: true });
}
