import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import type { SessionUser } from '../core/user';

/** Invitations and password resets: the links e-mailed to people. */
@Injectable({ providedIn: 'root' })
export class AccountLinksApi {
  private readonly http = inject(HttpClient);

  invitation(token: string): Observable<{ name: string; email: string; role: string }> {
    return this.http
      .get<{
        invitation: { name: string; email: string; role: string };
      }>(`/api/invitations/${encodeURIComponent(token)}`)
      .pipe(map((body) => body.invitation));
  }

  acceptInvitation(token: string, password: string): Observable<SessionUser> {
    return this.http
      .post<{ user: SessionUser }>(`/api/invitations/${encodeURIComponent(token)}`, { password })
      .pipe(map((body) => body.user));
  }

  reset(token: string): Observable<{ email: string }> {
    return this.http
      .get<{ reset: { email: string } }>(`/api/password-resets/${encodeURIComponent(token)}`)
      .pipe(map((body) => body.reset));
  }

  resetPassword(token: string, password: string): Observable<void> {
    return this.http.post<void>(`/api/password-resets/${encodeURIComponent(token)}`, {
      password,
    });
  }

  requestReset(email: string): Observable<string> {
    return this.http
      .post<{ message: string }>('/api/password-resets', { email })
      .pipe(map((body) => body.message));
  }
}
