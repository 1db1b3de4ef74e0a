import {
  HttpClient,
  HttpErrorResponse,
  HttpEventType,
  type HttpEvent,
  type HttpResponse,
} from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, catchError, filter, from, map, switchMap, throwError } from 'rxjs';

/** Where a PDF download stands. */
export type PdfProgress =
  | { readonly state: 'preparing' }
  | { readonly state: 'receiving'; readonly loaded: number; readonly total: number | null }
  | { readonly state: 'done'; readonly file: Blob; readonly filename: string };

/** The file name a `Content-Disposition: attachment; filename=…` header gives, if any. */
export function attachmentName(header: string | null, fallback: string): string {
  const match = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(header ?? '');
  if (!match) return fallback;
  try {
    return decodeURIComponent(match[1]!);
  } catch {
    return match[1]!;
  }
}

/** Where the progress of one HTTP event leaves the download (null: nothing to report). */
export function progressOf(event: HttpEvent<Blob>, fallbackName: string): PdfProgress | null {
  switch (event.type) {
    case HttpEventType.Sent:
      return { state: 'preparing' };
    case HttpEventType.DownloadProgress:
      return { state: 'receiving', loaded: event.loaded, total: event.total ?? null };
    case HttpEventType.Response: {
      const response = event as HttpResponse<Blob>;
      const filename = attachmentName(response.headers.get('Content-Disposition'), fallbackName);
      return { state: 'done', file: response.body ?? new Blob([]), filename };
    }
    default:
      return null;
  }
}

/**
 * PDF downloads with progress: the server lays the pages out (preparing), then streams the file
 * (receiving). Unsubscribing cancels the request, and the server stops rendering.
 */
@Injectable({ providedIn: 'root' })
export class PdfDownload {
  private readonly http = inject(HttpClient);

  /** GET `url`, or POST `body` to it when a body is given. */
  fetch(url: string, body?: unknown, fallbackName = 'tensile.pdf'): Observable<PdfProgress> {
    const options = {
      observe: 'events' as const,
      reportProgress: true,
      responseType: 'blob' as const,
    };
    const request =
      body === undefined ? this.http.get(url, options) : this.http.post(url, body, options);
    return request.pipe(
      map((event) => progressOf(event, fallbackName)),
      filter((progress): progress is PdfProgress => progress !== null),
      catchError((error: unknown) =>
        from(readBlobError(error)).pipe(switchMap((e) => throwError(() => e))),
      ),
    );
  }
}

/**
 * A failed blob request carries the server's JSON error as a Blob; read it back into the error so
 * the usual message helper finds `{ error: { message } }`.
 */
async function readBlobError(error: unknown): Promise<unknown> {
  if (!(error instanceof HttpErrorResponse) || !(error.error instanceof Blob)) return error;
  try {
    const body: unknown = JSON.parse(await error.error.text());
    return new HttpErrorResponse({
      error: body,
      headers: error.headers,
      status: error.status,
      statusText: error.statusText,
      url: error.url ?? undefined,
    });
  } catch {
    return error;
  }
}
