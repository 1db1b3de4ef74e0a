import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

/** A built-in rule card as listed by `GET /api/presets`. */
export interface BuiltInCard {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly meter: unknown;
  readonly subdivision: unknown;
}

interface PresetsResponse {
  readonly presets?: readonly (Partial<BuiltInCard> & {
    card?: { meter?: unknown; subdivision?: unknown };
  })[];
}

/** HTTP calls for the rule-cards feature. */
@Injectable({ providedIn: 'root' })
export class RuleCardsApi {
  private readonly http = inject(HttpClient);

  /** The built-in rule cards every teacher (and, read-only, every student) can drill. */
  builtInCards(): Observable<readonly BuiltInCard[]> {
    return this.http.get<PresetsResponse>('/api/presets').pipe(
      map((body) =>
        (body.presets ?? []).flatMap((preset) =>
          typeof preset.id === 'string'
            ? [
                {
                  id: preset.id,
                  title: preset.title ?? preset.id,
                  summary: preset.summary ?? '',
                  meter: preset.meter ?? preset.card?.meter,
                  subdivision: preset.subdivision ?? preset.card?.subdivision,
                },
              ]
            : [],
        ),
      ),
    );
  }
}

export type CardLevel = 'beginner' | 'intermediate' | 'advanced';

/** One row of the teacher's rule-card table (`GET /api/rule-cards`). */
export interface RuleCardSummary {
  readonly id: number | string;
  readonly title: string;
  readonly tags: readonly string[];
  readonly level: CardLevel | null;
  readonly meter: string;
  readonly subdivision: string;
  readonly bars: number;
  readonly tempo: number;
  readonly archived: boolean;
  readonly drillCount: number;
  readonly updatedAt: string;
}

/** A rule card with its card object (`GET /api/rule-cards/:id`). */
export interface RuleCardDetail extends RuleCardSummary {
  readonly card: unknown;
  readonly fromPreset: { readonly id: string; readonly title: string } | null;
}

/** A page of a server-side list. */
export interface Page<T> {
  readonly items: readonly T[];
  readonly total: number;
  readonly page: number;
  readonly pageSize: number;
}

/** Paging, sorting and filters of a list request; empty values are left out of the query. */
export type ListQuery = Readonly<Record<string, string | number | boolean | null | undefined>>;

/** Fields a teacher writes on a card. */
export interface RuleCardInput {
  readonly title?: string;
  readonly card?: unknown;
  readonly tags?: readonly string[];
  readonly level?: CardLevel | null;
}

/** Tensile's own export envelope. */
export interface RuleCardEnvelope {
  readonly format: 'tensile.rule-card';
  readonly version: 1;
  readonly title: string;
  readonly tags: readonly string[];
  readonly level: CardLevel | null;
  readonly card: unknown;
}

/** Query parameters without the empty ones. */
export function listParams(query: ListQuery): Record<string, string> {
  const params: Record<string, string> = {};
  for (const [key, value] of Object.entries(query)) {
    if (value !== null && value !== undefined && value !== '') params[key] = String(value);
  }
  return params;
}

/** HTTP calls for the teacher's own rule cards. */
@Injectable({ providedIn: 'root' })
export class TeacherCardsApi {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<RuleCardSummary>> {
    return this.http.get<Page<RuleCardSummary>>('/api/rule-cards', { params: listParams(query) });
  }

  get(id: string | number): Observable<RuleCardDetail> {
    return this.http
      .get<{ ruleCard: RuleCardDetail }>(`/api/rule-cards/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.ruleCard));
  }

  create(input: RuleCardInput & { fromPreset?: string }): Observable<RuleCardDetail> {
    return this.http
      .post<{ ruleCard: RuleCardDetail }>('/api/rule-cards', input)
      .pipe(map((body) => body.ruleCard));
  }

  update(id: string | number, input: RuleCardInput): Observable<RuleCardDetail> {
    return this.http
      .put<{ ruleCard: RuleCardDetail }>(`/api/rule-cards/${encodeURIComponent(id)}`, input)
      .pipe(map((body) => body.ruleCard));
  }

  duplicate(id: string | number): Observable<RuleCardDetail> {
    return this.http
      .post<{ ruleCard: RuleCardDetail }>(`/api/rule-cards/${encodeURIComponent(id)}/duplicate`, {})
      .pipe(map((body) => body.ruleCard));
  }

  /** True when the card was archived (saved drills use it) rather than destroyed. */
  remove(id: string | number): Observable<boolean> {
    return this.http
      .delete<{ archived?: boolean } | null>(`/api/rule-cards/${encodeURIComponent(id)}`)
      .pipe(map((body) => body?.archived === true));
  }

  export(id: string | number): Observable<RuleCardEnvelope> {
    return this.http.get<RuleCardEnvelope>(`/api/rule-cards/${encodeURIComponent(id)}/export`);
  }

  import(envelope: unknown): Observable<RuleCardDetail> {
    return this.http
      .post<{ ruleCard: RuleCardDetail }>('/api/rule-cards/import', envelope)
      .pipe(map((body) => body.ruleCard));
  }
}
