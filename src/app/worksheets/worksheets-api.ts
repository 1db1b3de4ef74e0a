import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import { listParams, type ListQuery, type Page } from '../rule-cards/rule-cards-api';

export type Paper = 'a4' | 'letter';

/** Where an item's drill comes from (the same shapes as the export routes' drill source). */
export type ItemSource =
  | { readonly kind: 'saved'; readonly drillId: number }
  | { readonly kind: 'preset'; readonly presetId: string; readonly seed: string };

export interface Ladder {
  readonly start: number;
  readonly target: number;
  readonly step: number;
}

export interface Aids {
  readonly sticking: boolean;
  readonly counts: boolean;
  readonly tension: boolean;
}

/** An item as written to the server. */
export interface ItemInput {
  readonly source: ItemSource;
  readonly ladder: Ladder;
  readonly aids: Aids;
}

/** An item as the server answers it. */
export interface WorksheetItem extends ItemInput {
  readonly title: string;
  readonly tempo: number | null;
  readonly problem: string | null;
}

export interface WorksheetSummary {
  readonly id: number;
  readonly title: string;
  readonly notes: string;
  readonly paper: Paper;
  readonly itemCount: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export interface Worksheet extends WorksheetSummary {
  readonly items: readonly WorksheetItem[];
}

export interface WorksheetInput {
  readonly title: string;
  readonly notes: string;
  readonly paper: Paper;
  readonly items: readonly ItemInput[];
}

/** HTTP calls for the teacher's worksheets. */
@Injectable({ providedIn: 'root' })
export class WorksheetsApi {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<WorksheetSummary>> {
    return this.http.get<Page<WorksheetSummary>>('/api/worksheets', {
      params: listParams(query),
    });
  }

  get(id: number | string): Observable<Worksheet> {
    return this.http
      .get<{ worksheet: Worksheet }>(`/api/worksheets/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.worksheet));
  }

  create(input: WorksheetInput): Observable<Worksheet> {
    return this.http
      .post<{ worksheet: Worksheet }>('/api/worksheets', input)
      .pipe(map((body) => body.worksheet));
  }

  update(id: number | string, input: Partial<WorksheetInput>): Observable<Worksheet> {
    return this.http
      .put<{ worksheet: Worksheet }>(`/api/worksheets/${encodeURIComponent(id)}`, input)
      .pipe(map((body) => body.worksheet));
  }

  duplicate(id: number | string): Observable<Worksheet> {
    return this.http
      .post<{ worksheet: Worksheet }>(`/api/worksheets/${encodeURIComponent(id)}/duplicate`, {})
      .pipe(map((body) => body.worksheet));
  }

  remove(id: number | string): Observable<void> {
    return this.http.delete<void>(`/api/worksheets/${encodeURIComponent(id)}`);
  }

  /** The printed worksheet's route (fetched with progress by the PDF download service). */
  pdfUrl(id: number | string, paper: Paper): string {
    return `/api/worksheets/${encodeURIComponent(id)}/pdf?paper=${paper}`;
  }
}
