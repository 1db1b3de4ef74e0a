import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import {
  listParams,
  type ListQuery,
  type Page,
  type RuleCardDetail,
  type RuleCardSummary,
} from '../rule-cards/rule-cards-api';

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

export type PresetLevel = 'beginner' | 'intermediate' | 'advanced';

/** A curated preset as the server sends it (`GET /api/presets`). */
export interface PresetView {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly card: unknown;
  readonly meter: string;
  readonly subdivision: string;
  readonly level: PresetLevel | null;
  readonly tags: readonly string[];
  readonly position: number;
  readonly published: boolean;
  readonly credit: string | null;
}

/** A teacher's rule card the admin may promote. */
export interface PromotionCandidate extends RuleCardSummary {
  readonly ownerName: string;
}

export interface PresetFilter {
  readonly tag?: string;
  readonly level?: PresetLevel | '';
  readonly meter?: string;
  readonly subdivision?: number | '';
  /** Admin only: withdrawn presets too. */
  readonly all?: boolean;
}

export interface PresetEdit {
  readonly title?: string;
  readonly summary?: string;
  readonly level?: PresetLevel | null;
  readonly tags?: readonly string[];
  readonly position?: number;
  readonly published?: boolean;
}

/** HTTP calls for the curated presets: the gallery, the admin's curation, "start from this". */
@Injectable({ providedIn: 'root' })
export class CuratedPresetsApi {
  private readonly http = inject(HttpClient);

  list(filter: PresetFilter): Observable<readonly PresetView[]> {
    return this.http
      .get<{ presets: readonly PresetView[] }>('/api/presets', {
        params: listParams({ ...filter, all: filter.all ? true : '' }),
      })
      .pipe(map((body) => body.presets));
  }

  update(id: string, edit: PresetEdit): Observable<PresetView> {
    return this.http
      .put<{ preset: PresetView }>(`/api/presets/${encodeURIComponent(id)}`, edit)
      .pipe(map((body) => body.preset));
  }

  /** Teachers' cards, paged and filtered on the server (admin). */
  candidates(query: ListQuery): Observable<Page<PromotionCandidate>> {
    return this.http.get<Page<PromotionCandidate>>('/api/presets/candidates', {
      params: listParams(query),
    });
  }

  promote(ruleCardId: number): Observable<PresetView> {
    return this.http
      .post<{ preset: PresetView }>('/api/presets/promote', { ruleCardId })
      .pipe(map((body) => body.preset));
  }

  /** Copy the preset into the teacher's own rule cards; answers the new card. */
  start(id: string): Observable<RuleCardDetail> {
    return this.http
      .post<{ ruleCard: RuleCardDetail }>(`/api/presets/${encodeURIComponent(id)}/start`, {})
      .pipe(map((body) => body.ruleCard));
  }

  thumbnailUrl(id: string): string {
    return `/api/presets/${encodeURIComponent(id)}/thumbnail.svg`;
  }
}
