import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';

import { AUTH_ME_URL, AUTH_SIGN_IN_URL, AuthSession } from './auth-session';
import { signInTree } from './auth-guard';

/** Requests whose 401 is an answer, not an expired session: "who am I?" and a wrong password. */
const EXPECTED_401 = [AUTH_ME_URL, AUTH_SIGN_IN_URL];

/**
 * When the server says a session has expired (401 on any other API call), forget the session and
 * send the person to sign-in, keeping the page they were on as returnUrl. The error still reaches
 * the caller so its own loading state can end.
 */
export const apiErrorInterceptor: HttpInterceptorFn = (request, next) => {
  const session = inject(AuthSession);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (
        error instanceof HttpErrorResponse &&
        error.status === 401 &&
        !isExpected401(request.url)
      ) {
        session.clear();
        void router.navigateByUrl(signInTree(router, router.url));
      }
      return throwError(() => error);
    }),
  );
};

function isExpected401(url: string): boolean {
  const path = url.replace(/^https?:\/\/[^/]+/, '').split('?')[0] ?? '';
  return EXPECTED_401.includes(path);
}
