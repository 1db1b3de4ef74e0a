import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';

import { Role } from '../../core/user';

/** A studio account as the admin's table shows it. */
export interface StudioUser {
  readonly id: number | string;
  readonly name: string;
  readonly email: string;
  readonly role: Role;
  /** `invited`: no password chosen yet; `deactivated`: cannot sign in. */
  readonly status?: 'active' | 'invited' | 'deactivated';
}

/** HTTP calls for the admin's users area. */
@Injectable({ providedIn: 'root' })
export class UsersApi {
  private readonly http = inject(HttpClient);

  /** Every account in the studio (admin only on the server). */
  list(): Observable<readonly StudioUser[]> {
    return this.http
      .get<{ users?: readonly StudioUser[] }>('/api/users')
      .pipe(map((body) => body.users ?? []));
  }

  /** Creates a teacher's account and e-mails the invitation. */
  inviteTeacher(name: string, email: string): Observable<StudioUser> {
    return this.http
      .post<{ user: StudioUser }>('/api/users', { name, email })
      .pipe(map((body) => body.user));
  }

  update(id: number | string, changes: { role?: Role; active?: boolean }): Observable<StudioUser> {
    return this.http
      .patch<{ user: StudioUser }>(`/api/users/${id}`, changes)
      .pipe(map((body) => body.user));
  }

  sendReset(id: number | string): Observable<void> {
    return this.http.post<void>(`/api/users/${id}/password-reset`, {});
  }
}
