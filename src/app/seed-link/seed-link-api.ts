import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import type { Drill } from '../../../shared/generator/index';

/** What a seed link shows: the drill and the teacher's chosen display name, nothing else. */
export interface SharedDrill {
  readonly title: string;
  readonly snapshot: Drill;
  readonly card: unknown;
  readonly teacherName: string;
}

/** The public, signed-out call behind `/s/:code`. */
@Injectable({ providedIn: 'root' })
export class SeedLinkApi {
  private readonly http = inject(HttpClient);

  open(code: string): Observable<SharedDrill> {
    return this.http
      .get<{ drill: SharedDrill }>(`/api/seed-links/${encodeURIComponent(code)}`)
      .pipe(map((body) => body.drill));
  }
}
