import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import {
  Observable,
  catchError,
  firstValueFrom,
  from,
  map,
  of,
  shareReplay,
  switchMap,
  tap,
  throwError,
} from 'rxjs';

import { takeEarlySession, type EarlySessionAnswer } from './early-session';
import { SessionUser, isRole } from './user';

/** Auth endpoints; the interceptor needs them to tell "not signed in yet" from "session expired". */
export const AUTH_ME_URL = '/api/auth/me';
export const AUTH_SIGN_IN_URL = '/api/auth/sign-in';
export const AUTH_SIGN_OUT_URL = '/api/auth/sign-out';

/**
 * The browser side of the cookie session: who is signed in, held in a signal.
 * The first guard to run calls `ensureLoaded()`, which asks the server once per page load.
 */
@Injectable({ providedIn: 'root' })
export class AuthSession {
  private readonly http = inject(HttpClient);
  private readonly userState = signal<SessionUser | null>(null);
  private loading: Observable<SessionUser | null> | null = null;

  /** The signed-in person, or null. */
  readonly user = this.userState.asReadonly();
  /** True once someone is signed in. */
  readonly signedIn = computed(() => this.userState() !== null);
  /** The current role, or null when signed out. */
  readonly role = computed(() => this.userState()?.role ?? null);

  /** Resolves the session from the server the first time, then from memory. */
  ensureLoaded(): Promise<SessionUser | null> {
    // A check started before the app booted (main.ts) answers first when it has a clear answer.
    if (!this.loading) {
      const early = takeEarlySession();
      const answer =
        early === null
          ? this.askServer()
          : from(early).pipe(
              switchMap((taken) => {
                const known = earlyUser(taken);
                return known === undefined ? this.askServer() : of(known);
              }),
            );
      this.loading = answer.pipe(
        tap((user) => this.userState.set(user)),
        catchError(() => of(null)),
        shareReplay(1),
      );
    }
    return firstValueFrom(this.loading);
  }

  /** Signs in with e-mail and password; errors propagate so the form can show the server's words. */
  signIn(email: string, password: string): Observable<SessionUser> {
    return this.http.post<unknown>(AUTH_SIGN_IN_URL, { email, password }).pipe(
      map((body) => {
        const user = toSessionUser(body);
        if (!user) throw new Error('The server answered sign-in without a user.');
        return user;
      }),
      tap((user) => this.setUser(user)),
    );
  }

  /** Ends the session on the server; the local session is cleared even if the server is unreachable. */
  signOut(): Observable<void> {
    return this.http.post<unknown>(AUTH_SIGN_OUT_URL, {}).pipe(
      map(() => undefined),
      catchError(() => of(undefined)),
      tap(() => this.clear()),
    );
  }

  /** Forgets the local session (used when the server says the session has expired). */
  clear(): void {
    this.setUser(null);
  }

  private askServer(): Observable<SessionUser | null> {
    return this.http.get<unknown>(AUTH_ME_URL).pipe(
      map(toSessionUser),
      catchError((error: unknown) =>
        error instanceof HttpErrorResponse && error.status === 401
          ? of(null)
          : throwError(() => error),
      ),
    );
  }

  private setUser(user: SessionUser | null): void {
    this.userState.set(user);
    this.loading = of(user);
  }
}

/**
 * The user an early session check found: null when it was answered 401 (signed out), undefined
 * when there is no clear answer (none, or another error), so the app asks again through
 * HttpClient and its interceptor reports the failure.
 */
function earlyUser(early: EarlySessionAnswer | null): SessionUser | null | undefined {
  if (early === null) return undefined;
  if (early.status === 401) return null;
  return early.status >= 200 && early.status < 300 ? toSessionUser(early.body) : undefined;
}

/** Accepts `{ user: {...} }` or a bare user object; anything without a known role is no user. */
function toSessionUser(body: unknown): SessionUser | null {
  const candidate =
    typeof body === 'object' && body !== null && 'user' in body
      ? (body as { user: unknown }).user
      : body;
  if (typeof candidate !== 'object' || candidate === null) return null;
  const { id, email, name, role } = candidate as Record<string, unknown>;
  if (!isRole(role) || typeof email !== 'string') return null;
  return {
    id: typeof id === 'number' || typeof id === 'string' ? id : email,
    email,
    name: typeof name === 'string' && name ? name : email,
    role,
  };
}
