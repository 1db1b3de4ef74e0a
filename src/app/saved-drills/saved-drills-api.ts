import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import type { Drill, DrillBar } from '../../../shared/generator/index';
import { listParams, type ListQuery, type Page } from '../rule-cards/rule-cards-api';

/** A revocable public link to a saved drill. */
export interface SeedLink {
  readonly code: string;
  readonly url: string;
  readonly views: number;
  readonly createdAt: string;
  readonly revokedAt: string | null;
}

/** One row of the saved-drills table. */
export interface SavedDrillSummary {
  readonly id: number | string;
  readonly title: string;
  readonly notes?: string;
  readonly ruleCardId: number | string | null;
  readonly seed: string;
  readonly createdAt: string;
  readonly updatedAt?: string;
}

/** A saved drill: the card as it was, its seed and the drill itself (shown from the snapshot). */
export interface SavedDrill {
  readonly id: number | string;
  readonly title: string;
  readonly notes: string;
  readonly ruleCardId: number | null;
  readonly card: unknown;
  readonly seed: string;
  readonly engineVersion: string;
  readonly snapshot: Drill;
  readonly createdAt: string;
  readonly updatedAt: string;
  readonly shareLink: SeedLink | null;
}

export interface SaveDrillInput {
  readonly ruleCardId?: number;
  readonly presetId?: string;
  readonly title: string;
  readonly notes?: string;
  readonly card: unknown;
  readonly seed: string;
  readonly keep?: readonly DrillBar[];
}

/** HTTP calls for saved drills and their seed links. */
@Injectable({ providedIn: 'root' })
export class SavedDrillsApi {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<SavedDrillSummary>> {
    return this.http.get<Page<SavedDrillSummary>>('/api/drills', { params: listParams(query) });
  }

  get(id: number | string): Observable<SavedDrill> {
    return this.http
      .get<{ drill: SavedDrill }>(`/api/drills/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.drill));
  }

  save(input: SaveDrillInput): Observable<SavedDrill> {
    return this.http.post<{ drill: SavedDrill }>('/api/drills', input).pipe(map((b) => b.drill));
  }

  update(id: number | string, input: { title?: string; notes?: string }): Observable<SavedDrill> {
    return this.http
      .put<{ drill: SavedDrill }>(`/api/drills/${encodeURIComponent(id)}`, input)
      .pipe(map((body) => body.drill));
  }

  remove(id: number | string): Observable<void> {
    return this.http.delete<void>(`/api/drills/${encodeURIComponent(id)}`);
  }

  share(id: number | string): Observable<SeedLink> {
    return this.http
      .post<{ link: SeedLink }>(`/api/drills/${encodeURIComponent(id)}/share`, {})
      .pipe(map((body) => body.link));
  }

  revoke(id: number | string): Observable<void> {
    return this.http.delete<void>(`/api/drills/${encodeURIComponent(id)}/share`);
  }
}
