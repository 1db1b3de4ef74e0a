import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Title } from '@angular/platform-browser';
import { Router, TitleStrategy, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { routes } from './app.routes';
import { apiErrorInterceptor } from './core/api-error-interceptor';
import { AUTH_ME_URL } from './core/auth-session';
import { TensileTitleStrategy } from './core/title-strategy';
import { SessionUser } from './core/user';

const student: SessionUser = {
  id: 6,
  email: 'noor.castellan@larkspur.test',
  name: 'Noor Castellan',
  role: 'student',
};
const teacher: SessionUser = {
  id: 2,
  email: 'tomasz.reyes@larkspur.test',
  name: 'Tomasz Reyes',
  role: 'teacher',
};

describe('app routes', () => {
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(withInterceptors([apiErrorInterceptor])),
        provideHttpClientTesting(),
        provideRouter(routes, withComponentInputBinding()),
        { provide: TitleStrategy, useClass: TensileTitleStrategy },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // The rule cards page asks for the teacher's own cards; card-table.spec covers that request.
    backend.match((request) => request.url === '/api/rule-cards');
    backend.verify({ ignoreCancelled: true });
  });

  /** Waits (lazy chunks load before guards run) for the app to make a request to `url`. */
  async function nextRequest(url: string) {
    for (let attempt = 0; attempt < 100; attempt++) {
      const [request] = backend.match((pending) => pending.url === url);
      if (request) return request;
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    throw new Error(`No request to ${url}`);
  }

  /** Navigates while answering the session check; returns the harness once the router settles. */
  async function open(url: string, me: SessionUser | null) {
    const harness = await RouterTestingHarness.create();
    const navigation = harness.navigateByUrl(url);
    const check = await nextRequest(AUTH_ME_URL);
    if (me) check.flush({ user: me });
    else
      check.flush(
        { error: { message: 'Sign in first.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await navigation;
    await harness.fixture.whenStable();
    return harness;
  }

  it('sends a signed-out visitor from / to sign-in, titled "Tensile · Sign in"', async () => {
    const harness = await open('/', null);
    expect(harness.routeNativeElement?.querySelector('h1')?.textContent).toContain(
      'Sign in to Tensile',
    );
    expect(TestBed.inject(Title).getTitle()).toBe('Tensile · Sign in');
  });

  it('sends a signed-out visitor of a drill link to sign-in, keeping the link', async () => {
    await open('/drills/backbeat-basics?seed=amber-tide-40', null);
    expect(TestBed.inject(Router).url).toBe(
      '/sign-in?returnUrl=%2Fdrills%2Fbackbeat-basics%3Fseed%3Damber-tide-40',
    );
  });

  it('opens / for a teacher on the rule cards, titled "Tensile · Rule cards"', async () => {
    const harness = await open('/', teacher);
    (await nextRequest('/api/presets')).flush({ presets: [] });
    (await nextRequest('/api/rule-cards')).flush({ items: [], total: 0, page: 0, pageSize: 20 });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Title).getTitle()).toBe('Tensile · Rule cards');
    expect(harness.routeNativeElement?.textContent).toContain('No rule cards yet');
  }, 20_000);

  it('turns a student away from the rule cards to their assignments', async () => {
    const harness = await open('/rule-cards', student);
    (await nextRequest('/api/presets')).flush({ presets: [] });
    (await nextRequest('/api/assignments/mine')).flush({ assignments: [] });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Title).getTitle()).toBe('Tensile · Assignments');
    expect(document.body.textContent).toContain('That page is for teachers.');
  });

  it('answers an unknown address with the not-found page, signed out too', async () => {
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/no-such-page');
    await harness.fixture.whenStable();
    backend.expectNone(AUTH_ME_URL);
    expect(TestBed.inject(Title).getTitle()).toBe('Tensile · Page not found');
  });

  it('opens the teacher’s worksheets, listed by the server', async () => {
    const harness = await open('/worksheets', teacher);
    expect(TestBed.inject(Title).getTitle()).toBe('Tensile · Worksheets');
    (await nextRequest('/api/worksheets')).flush({ items: [], total: 0, page: 0, pageSize: 20 });
    await harness.fixture.whenStable();
    const text = harness.routeNativeElement?.textContent ?? '';
    expect(text).toContain('No worksheets yet');
    expect(text).toContain('tempo ladder');
  });
});
