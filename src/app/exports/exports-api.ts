import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, catchError, from, map, switchMap, throwError } from 'rxjs';
import type { DrillSource } from '../../../shared/formats/drill-source';

/** The open formats a drill exports to. */
export type ExportFormat = 'midi' | 'musicxml';

/** A downloaded file: its name as the server gave it, and its bytes. */
export interface ExportedFile {
  readonly filename: string;
  readonly blob: Blob;
}

const FALLBACK_NAMES: Readonly<Record<ExportFormat, string>> = {
  midi: 'drill.mid',
  musicxml: 'drill.musicxml',
};

/** HTTP calls of the export menu (`POST /api/exports/:format`). */
@Injectable({ providedIn: 'root' })
export class ExportsApi {
  private readonly http = inject(HttpClient);

  download(format: ExportFormat, source: DrillSource): Observable<ExportedFile> {
    return this.http
      .post(`/api/exports/${format}`, { source }, { responseType: 'blob', observe: 'response' })
      .pipe(
        map((response) => ({
          filename:
            filenameOf(response.headers.get('Content-Disposition')) ?? FALLBACK_NAMES[format],
          blob: response.body ?? new Blob([]),
        })),
        catchError((error: unknown) => from(readableError(error)).pipe(switchMap(throwError))),
      );
  }
}

/** The file name of a `Content-Disposition: attachment; filename=…` header. */
export function filenameOf(header: string | null): string | null {
  const match = /filename="?([^";]+)"?/i.exec(header ?? '');
  return match?.[1]?.trim() || null;
}

/**
 * An error answered as a Blob (the request asked for one) carries the server's JSON message
 * inside; read it back so the message can be shown.
 */
async function readableError(error: unknown): Promise<unknown> {
  if (!(error instanceof HttpErrorResponse) || !(error.error instanceof Blob)) return error;
  let body: unknown = null;
  try {
    body = JSON.parse(await error.error.text()) as unknown;
  } catch {
    // Not JSON (a proxy's page): the status alone says what happened.
  }
  return new HttpErrorResponse({
    error: body,
    headers: error.headers,
    status: error.status,
    statusText: error.statusText,
    url: error.url ?? undefined,
  });
}
