import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { AUTH_ME_URL, AuthSession } from './auth-session';
import { startEarlySession } from './early-session';

const USER = { id: 3, email: 'ada@larkspur.test', name: 'Ada', role: 'teacher' };

describe('AuthSession with a session check started before the app booted', () => {
  let session: AuthSession;
  let http: HttpTestingController;
  const fetchMock = vi.fn<typeof fetch>();

  beforeEach(() => {
    vi.stubGlobal('fetch', fetchMock);
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    session = TestBed.inject(AuthSession);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    fetchMock.mockReset();
    vi.unstubAllGlobals();
  });

  it('takes the signed-in user from the early answer without asking again', async () => {
    fetchMock.mockResolvedValue(Response.json({ user: USER }));
    startEarlySession(AUTH_ME_URL);
    await expect(session.ensureLoaded()).resolves.toMatchObject({ email: USER.email });
    expect(session.role()).toBe('teacher');
    http.expectNone(AUTH_ME_URL);
  });

  it('reads an early 401 as signed out', async () => {
    fetchMock.mockResolvedValue(Response.json({ error: { code: 'x' } }, { status: 401 }));
    startEarlySession(AUTH_ME_URL);
    await expect(session.ensureLoaded()).resolves.toBeNull();
    http.expectNone(AUTH_ME_URL);
  });

  it('asks through HttpClient when the early answer is another error', async () => {
    fetchMock.mockResolvedValue(Response.json({ error: { code: 'x' } }, { status: 503 }));
    startEarlySession(AUTH_ME_URL);
    const loaded = session.ensureLoaded();
    const request = await vi.waitFor(() => http.expectOne(AUTH_ME_URL));
    request.flush({ user: USER });
    await expect(loaded).resolves.toMatchObject({ role: 'teacher' });
  });

  it('asks through HttpClient when nothing was started early', async () => {
    const loaded = session.ensureLoaded();
    const request = await vi.waitFor(() => http.expectOne(AUTH_ME_URL));
    request.flush({ user: USER });
    await expect(loaded).resolves.toMatchObject({ role: 'teacher' });
  });
});
