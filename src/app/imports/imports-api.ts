import { HttpClient, HttpEventType, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, filter, map } from 'rxjs';
import type { MidiImport } from '../../../shared/formats/midi-import/index';
import type { SavedDrill } from '../saved-drills/saved-drills-api';

/** Where an upload is: sending (a share of the bytes when known), being read, or answered. */
export type UploadState<T> =
  | { readonly phase: 'sending'; readonly share: number | null }
  | { readonly phase: 'reading' }
  | { readonly phase: 'done'; readonly value: T };

/** HTTP calls for MIDI groove import. */
@Injectable({ providedIn: 'root' })
export class ImportsApi {
  private readonly http = inject(HttpClient);

  /** Uploads a file and answers the preview (nothing is stored), with upload progress. */
  preview(file: File, track: number | null): Observable<UploadState<MidiImport>> {
    return this.http
      .post<{ groove: MidiImport }>('/api/imports/midi', form(file, { track }), {
        reportProgress: true,
        observe: 'events',
      })
      .pipe(uploadStates((body) => body.groove));
  }

  /** Uploads the file again and keeps the groove as one of the teacher's saved drills. */
  save(file: File, track: number | null, title: string): Observable<SavedDrill> {
    return this.http
      .post<{ drill: SavedDrill }>('/api/imports/midi/save', form(file, { track, title }))
      .pipe(map((body) => body.drill));
  }
}

function form(file: File, fields: Record<string, string | number | null>): FormData {
  const data = new FormData();
  for (const [name, value] of Object.entries(fields)) {
    if (value !== null) data.append(name, String(value));
  }
  data.append('file', file, file.name);
  return data;
}

function uploadStates<B, T>(pick: (body: B) => T) {
  return (events: Observable<HttpEvent<B>>): Observable<UploadState<T>> =>
    events.pipe(
      map((event): UploadState<T> | null => {
        switch (event.type) {
          case HttpEventType.Sent:
            return { phase: 'sending', share: null };
          case HttpEventType.UploadProgress: {
            const total = event.total ?? 0;
            // Every byte sent: the server is reading the groove now.
            if (total > 0 && event.loaded >= total) return { phase: 'reading' };
            return { phase: 'sending', share: total > 0 ? event.loaded / total : null };
          }
          case HttpEventType.Response:
            return { phase: 'done', value: pick(event.body as B) };
          default:
            return null;
        }
      }),
      filter((state): state is UploadState<T> => state !== null),
    );
}
