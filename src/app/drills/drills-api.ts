import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

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

/** HTTP calls of the drill pages. */
@Injectable({ providedIn: 'root' })
export class DrillsApi {
  private readonly http = inject(HttpClient);

  /** One preset rule card by id. */
  preset(id: string): Observable<PresetDetail> {
    return this.http
      .get<{ preset: PresetDetail }>(`/api/presets/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.preset));
  }
}
