import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

/** A preset as the admin sees it in the list. */
export interface PresetSummary {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly meter: unknown;
  readonly subdivision: unknown;
}

/** HTTP calls for the admin's presets area. */
@Injectable({ providedIn: 'root' })
export class PresetsApi {
  private readonly http = inject(HttpClient);

  /** Every preset offered to teachers (today: the built-in rule cards). */
  list(): Observable<readonly PresetSummary[]> {
    return this.http
      .get<{ presets?: readonly PresetSummary[] }>('/api/presets')
      .pipe(map((body) => body.presets ?? []));
  }
}
