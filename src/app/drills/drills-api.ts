import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, from, map, of, switchMap } from 'rxjs';
import { hasEarlyPreset, takeEarlyPreset } from './drill-prefetch';

/** A preset rule card as the server sends it (`GET /api/presets/:id`). */
export interface PresetDetail {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  /** The raw rule card; the engine validates it in the browser. */
  readonly card: unknown;
  /** Meter and grid in words, e.g. "4/4" and "sixteenths". */
  readonly meter: string;
  readonly subdivision: string;
}

type PresetBody = { preset: PresetDetail };

/** HTTP calls of the drill pages. */
@Injectable({ providedIn: 'root' })
export class DrillsApi {
  private readonly http = inject(HttpClient);

  /**
   * One preset rule card by id: the answer to the request started before the app booted when
   * there is one (see drill-prefetch.ts), else (or when that one failed) a request of its own.
   */
  preset(id: string): Observable<PresetDetail> {
    const request = this.http
      .get<PresetBody>(`/api/presets/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.preset));
    if (!hasEarlyPreset(id)) return request;
    return from(takeEarlyPreset(id)).pipe(
      switchMap((body) => (isPresetBody(body, id) ? of(body.preset) : request)),
    );
  }
}

function isPresetBody(body: unknown, id: string): body is PresetBody {
  if (typeof body !== 'object' || body === null || !('preset' in body)) return false;
  const preset = (body as { preset: unknown }).preset;
  return typeof preset === 'object' && preset !== null && (preset as { id?: unknown }).id === id;
}
