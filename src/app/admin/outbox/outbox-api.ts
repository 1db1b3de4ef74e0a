import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

export interface OutboxSummary {
  readonly id: number;
  readonly to: string;
  readonly subject: string;
  readonly createdAt: string;
}

export interface OutboxMessage extends OutboxSummary {
  readonly text: string;
  readonly html: string;
}

/** The admin's view of mail the app stored instead of sending (no SMTP server configured). */
@Injectable({ providedIn: 'root' })
export class OutboxApi {
  private readonly http = inject(HttpClient);

  list(page = 0): Observable<{ items: readonly OutboxSummary[]; total: number }> {
    return this.http.get<{ items: readonly OutboxSummary[]; total: number }>(
      `/api/outbox?pageSize=50&page=${page}`,
    );
  }

  message(id: number): Observable<OutboxMessage> {
    return this.http
      .get<{ message: OutboxMessage }>(`/api/outbox/${id}`)
      .pipe(map((body) => body.message));
  }
}
