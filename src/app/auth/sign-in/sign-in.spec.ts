import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { AUTH_SIGN_IN_URL } from '../../core/auth-session';
import { SignIn } from './sign-in';

@Component({ template: '' })
class Blank {}

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let page: HTMLElement;
  let backend: HttpTestingController;
  let router: Router;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([
          { path: 'sign-in', component: Blank },
          { path: 'assignments', component: Blank },
          { path: 'drills/:cardId', component: Blank },
        ]),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    fixture = TestBed.createComponent(SignIn);
    page = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
  });

  afterEach(() => backend.verify());

  function field(label: string): HTMLInputElement {
    const input = [...page.querySelectorAll('mat-form-field')]
      .find((formField) => formField.querySelector('mat-label')?.textContent?.trim() === label)
      ?.querySelector('input');
    if (!input) throw new Error(`No field labelled ${label}`);
    return input;
  }

  async function type(label: string, value: string): Promise<void> {
    const input = field(label);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
  }

  async function submit(): Promise<void> {
    page.querySelector('form')!.dispatchEvent(new Event('submit'));
    await fixture.whenStable();
  }

  /** Signs the demo student in from a page that asked to go on to `returnUrl` afterwards. */
  async function signInAsStudentReturningTo(returnUrl: string): Promise<void> {
    fixture.componentRef.setInput('returnUrl', returnUrl);
    await type('E-mail', 'juno.marsh@larkspur.test');
    await type('Password', 'larkspur-student');
    await submit();
    backend.expectOne(AUTH_SIGN_IN_URL).flush({
      user: { id: 4, email: 'juno.marsh@larkspur.test', name: 'Juno Marsh', role: 'student' },
    });
    await fixture.whenStable();
  }

  const errors = () => [...page.querySelectorAll('mat-error')].map((e) => e.textContent?.trim());

  it('labels both controls', () => {
    expect(field('E-mail').getAttribute('type')).toBe('email');
    expect(field('Password').getAttribute('type')).toBe('password');
    expect(field('E-mail').id).toBeTruthy();
    expect(page.querySelector(`label[for="${field('E-mail').id}"]`)).not.toBeNull();
  });

  it('asks for both fields when submitted empty, and sends nothing', async () => {
    await submit();
    expect(errors()).toEqual(['Enter your e-mail address.', 'Enter your password.']);
    backend.expectNone(AUTH_SIGN_IN_URL);
  });

  it('explains a malformed e-mail address', async () => {
    await type('E-mail', 'juno.marsh');
    expect(errors()).toEqual(['Enter an e-mail address like name@school.test.']);
    await type('E-mail', 'juno.marsh@larkspur.test');
    expect(errors()).toEqual([]);
  });

  it('explains a 5,000-character e-mail or password by its length, and sends nothing', async () => {
    await type('E-mail', `${'e'.repeat(5_000)}@larkspur.test`);
    await type('Password', 'p'.repeat(5_000));
    await submit();
    expect(errors()).toEqual([
      'An e-mail address has at most 254 characters.',
      'A password has at most 200 characters.',
    ]);
    backend.expectNone(AUTH_SIGN_IN_URL);
  });

  it("shows the server's own message when sign-in is refused", async () => {
    await type('E-mail', 'juno.marsh@larkspur.test');
    await type('Password', 'not-the-password');
    await submit();
    const request = backend.expectOne(AUTH_SIGN_IN_URL);
    expect(request.request.body).toEqual({
      email: 'juno.marsh@larkspur.test',
      password: 'not-the-password',
    });
    request.flush(
      { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match.' } },
      { status: 401, statusText: 'Unauthorized' },
    );
    await fixture.whenStable();
    expect(page.querySelector('[role="alert"]')?.textContent?.trim()).toBe(
      'That e-mail and password do not match.',
    );
    expect(router.url).toBe('/');
  });

  it('goes on to the returnUrl after signing in', async () => {
    await signInAsStudentReturningTo('/drills/backbeat-basics?seed=tidal-echo-31');
    expect(router.url).toBe('/drills/backbeat-basics?seed=tidal-echo-31');
  });

  it('ignores a returnUrl that points off the site and goes home instead', async () => {
    await signInAsStudentReturningTo('//elsewhere.example/phish');
    expect(router.url).toBe('/assignments');
  });
});
