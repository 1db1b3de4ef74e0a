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
