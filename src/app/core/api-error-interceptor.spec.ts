import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { apiErrorInterceptor } from './api-error-interceptor';
import { AUTH_ME_URL, AUTH_SIGN_IN_URL, AuthSession } from './auth-session';

@Component({ template: '' })
class Blank {}

const expired = { error: { code: 'unauthenticated', message: 'Your session has ended.' } };
const unauthorized = { status: 401, statusText: 'Unauthorized' };

describe('apiErrorInterceptor', () => {
  let http: HttpClient;
  let backend: HttpTestingController;
  let router: Router;
  let session: AuthSession;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(withInterceptors([apiErrorInterceptor])),
        provideHttpClientTesting(),
        provideRouter([
          { path: 'sign-in', component: Blank },
          { path: 'rule-cards', component: Blank },
        ]),
      ],
    });
    http = TestBed.inject(HttpClient);
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    session = TestBed.inject(AuthSession);
    await router.navigateByUrl('/rule-cards');
    // Sign in for real through the session so there is something to clear.
    const signedIn = firstValueFrom(session.signIn('tomasz.reyes@larkspur.test', 'x'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({
      user: { id: 2, email: 'tomasz.reyes@larkspur.test', name: 'Tomasz Reyes', role: 'teacher' },
    });
    await signedIn;
  });

  afterEach(() => backend.verify());

  /** Makes a GET, answers it, and returns the HTTP status the caller saw. */
  async function answer(url: string, body: object, init: { status: number; statusText: string }) {
    const done = firstValueFrom(http.get(url)).then(
      () => 200,
      (error: { status: number }) => error.status,
    );
    backend.expectOne(url).flush(body, init);
    const status = await done;
    await new Promise((resolve) => setTimeout(resolve)); // let a triggered navigation finish
    return status;
  }

  it('on 401 from an API call, clears the session and goes to sign-in with the page as returnUrl', async () => {
    expect(session.signedIn()).toBe(true);
    const status = await answer('/api/presets', expired, unauthorized);
    expect(status).toBe(401); // the caller still hears about it
    expect(session.user()).toBeNull();
    expect(router.url).toBe('/sign-in?returnUrl=%2Frule-cards');
  });

  it('leaves a 401 from /api/auth/me alone: that is just "not signed in"', async () => {
    await answer(AUTH_ME_URL, expired, unauthorized);
    expect(session.signedIn()).toBe(true);
    expect(router.url).toBe('/rule-cards');
  });

  it('leaves a 401 from sign-in alone: that is a wrong password for the form to show', async () => {
    const done = firstValueFrom(http.post(AUTH_SIGN_IN_URL, {})).catch(
      (error: { status: number }) => error.status,
    );
    backend
      .expectOne(AUTH_SIGN_IN_URL)
      .flush({ error: { message: 'Wrong e-mail or password.' } }, unauthorized);
    expect(await done).toBe(401);
    expect(router.url).toBe('/rule-cards');
    expect(session.signedIn()).toBe(true);
  });

  it('does not sign anyone out for other errors', async () => {
    const status = await answer(
      '/api/presets',
      { error: { message: 'Database busy.' } },
      {
        status: 503,
        statusText: 'Service Unavailable',
      },
    );
    expect(status).toBe(503);
    expect(session.signedIn()).toBe(true);
    expect(router.url).toBe('/rule-cards');
  });
});
