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
}
