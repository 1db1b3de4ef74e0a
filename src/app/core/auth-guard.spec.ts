import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import {
  ActivatedRouteSnapshot,
  CanActivateFn,
  GuardResult,
  MaybeAsync,
  Router,
  RouterStateSnapshot,
  UrlTree,
  provideRouter,
} from '@angular/router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import {
  areaMessage,
  redirectSignedIn,
  redirectToHome,
  requireRole,
  requireSignedIn,
} from './auth-guard';
import { AUTH_ME_URL } from './auth-session';
import { Role, SessionUser } from './user';

const people: Record<Role, SessionUser> = {
  teacher: { id: 2, email: 'tomasz.reyes@larkspur.test', name: 'Tomasz Reyes', role: 'teacher' },
  student: { id: 4, email: 'juno.marsh@larkspur.test', name: 'Juno Marsh', role: 'student' },
  admin: { id: 1, email: 'imogen.vale@larkspur.test', name: 'Imogen Vale', role: 'admin' },
};

describe('auth guards', () => {
  let http: HttpTestingController;
  let router: Router;
  let snackOpen: ReturnType<typeof vi.spyOn>;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    snackOpen = vi.spyOn(TestBed.inject(MatSnackBar), 'open');
  });

  afterEach(() => http.verify());

  /** Runs a guard for `url` while the server answers /api/auth/me as given. */
  async function run(
    guard: CanActivateFn,
    url: string,
    me: SessionUser | null,
  ): Promise<GuardResult> {
    const result = TestBed.runInInjectionContext(() =>
      guard({} as ActivatedRouteSnapshot, { url } as RouterStateSnapshot),
    ) as MaybeAsync<GuardResult>;
    const request = http.expectOne(AUTH_ME_URL);
    if (me) request.flush({ user: me });
    else
      request.flush(
        { error: { code: 'unauthenticated', message: 'Sign in first.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    return await (result as Promise<GuardResult>);
  }

  function asUrl(result: GuardResult): string {
    expect(result).toBeInstanceOf(UrlTree);
    return router.serializeUrl(result as UrlTree);
  }

  it('sends a signed-out visitor to sign-in, remembering the page', async () => {
    const result = await run(requireSignedIn, '/drills/backbeat-basics?seed=brass-wren-12', null);
    expect(asUrl(result)).toBe(
      '/sign-in?returnUrl=%2Fdrills%2Fbackbeat-basics%3Fseed%3Dbrass-wren-12',
    );
  });

  it('lets a signed-in person through', async () => {
    expect(await run(requireSignedIn, '/assignments', people.student)).toBe(true);
  });

  it("lets a teacher into the teachers' area without a message", async () => {
    expect(await run(requireRole('teacher'), '/rule-cards', people.teacher)).toBe(true);
    expect(snackOpen).not.toHaveBeenCalled();
  });

  it('sends a student who opens a teacher page home, saying why', async () => {
    const result = await run(requireRole('teacher'), '/rule-cards', people.student);
    expect(asUrl(result)).toBe('/assignments');
    expect(snackOpen).toHaveBeenCalledWith('That page is for teachers.', 'OK', expect.anything());
  });

  it('sends a teacher who opens an admin page to the rule cards', async () => {
    const result = await run(requireRole('admin'), '/admin/users', people.teacher);
    expect(asUrl(result)).toBe('/rule-cards');
    expect(snackOpen).toHaveBeenCalledWith('That page is for admins.', 'OK', expect.anything());
  });

  it('sends a signed-out visitor of a role area to sign-in', async () => {
    const result = await run(requireRole('admin'), '/presets', null);
    expect(asUrl(result)).toBe('/sign-in?returnUrl=%2Fpresets');
  });

  it.each([
    ['teacher', '/rule-cards'],
    ['student', '/assignments'],
    ['admin', '/presets'],
  ] as const)('opens / as a %s on %s', async (role, home) => {
    expect(asUrl(await run(redirectToHome, '/', people[role]))).toBe(home);
  });

  it('opens / signed out on the sign-in page, without a returnUrl', async () => {
    expect(asUrl(await run(redirectToHome, '/', null))).toBe('/sign-in');
  });

  it('keeps signed-in people off the sign-in page', async () => {
    expect(asUrl(await run(redirectSignedIn, '/sign-in', people.admin))).toBe('/presets');
  });

  it('shows the sign-in page to signed-out visitors', async () => {
    expect(await run(redirectSignedIn, '/sign-in', null)).toBe(true);
  });

  it('asks the server only once per page load', async () => {
    await run(requireSignedIn, '/assignments', people.student);
    const again = await TestBed.runInInjectionContext(() =>
      requireSignedIn({} as ActivatedRouteSnapshot, { url: '/practice' } as RouterStateSnapshot),
    );
    http.expectNone(AUTH_ME_URL);
    expect(again).toBe(true);
  });

  it('names several owning roles in one sentence', () => {
    expect(areaMessage(['teacher', 'admin'])).toBe('That page is for teachers and admins.');
    expect(areaMessage(['student'])).toBe('That page is for students.');
  });
});
