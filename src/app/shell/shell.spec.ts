import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { AUTH_SIGN_IN_URL, AUTH_SIGN_OUT_URL, AuthSession } from '../core/auth-session';
import { SessionUser } from '../core/user';
import { Shell } from './shell';

@Component({ template: '<p>page</p>' })
class Blank {}

const people: Record<SessionUser['role'], SessionUser> = {
  teacher: {
    id: 3,
    email: 'hana.lindqvist@larkspur.test',
    name: 'Hana Lindqvist',
    role: 'teacher',
  },
  student: { id: 5, email: 'felix.abara@larkspur.test', name: 'Felix Abara', role: 'student' },
  admin: { id: 1, email: 'imogen.vale@larkspur.test', name: 'Imogen Vale', role: 'admin' },
};

describe('Shell', () => {
  let fixture: ComponentFixture<Shell>;
  let backend: HttpTestingController;

  // The toolbar's menu and tooltip are a deferred block: its component resolves asynchronously.
  beforeEach(async () => {
    await TestBed.configureTestingModule({
      imports: [Shell],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([
          { path: 'sign-in', component: Blank },
          { path: '**', component: Blank },
        ]),
      ],
    }).compileComponents();
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  async function renderAs(person: SessionUser): Promise<HTMLElement> {
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(person.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: person });
    await signedIn;
    fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  const navLabels = (page: HTMLElement) =>
    [...page.querySelectorAll('nav[aria-label="Main"] a [matListItemTitle]')].map((title) =>
      title.textContent?.trim(),
    );
  const navTargets = (page: HTMLElement) =>
    [...page.querySelectorAll('nav[aria-label="Main"] a')].map((a) => a.getAttribute('href'));

  it('gives a teacher rule cards, the preset gallery, drills, worksheets, groove import and the studio', async () => {
    const page = await renderAs(people.teacher);
    expect(navLabels(page)).toEqual([
      'Rule cards',
      'Gallery',
      'Drills',
      'Worksheets',
      'Import groove',
      'Studio',
      'Print settings',
    ]);
    expect(navTargets(page)).toEqual([
      '/rule-cards',
      '/gallery',
      '/drills',
      '/worksheets',
      '/imports',
      '/studio',
      '/print-settings',
    ]);
  });

  it('gives a student assignments, practice and the preset gallery only', async () => {
    const page = await renderAs(people.student);
    expect(navLabels(page)).toEqual(['Assignments', 'Practice', 'Gallery']);
    expect(navTargets(page)).toEqual(['/assignments', '/practice', '/gallery']);
  });

  it('gives an admin presets and users', async () => {
    const page = await renderAs(people.admin);
    expect(navLabels(page)).toEqual(['Presets', 'Users']);
    expect(navTargets(page)).toEqual(['/presets', '/admin/users']);
  });

  it('marks the current page in the navigation', async () => {
    const page = await renderAs(people.student);
    await TestBed.inject(Router).navigateByUrl('/practice');
    await fixture.whenStable();
    const current = page.querySelector('nav a[aria-current="page"]');
    expect(current?.getAttribute('href')).toBe('/practice');
  });

  it('keeps Drills marked on the drills list, a drill, a new seed and back to the list', async () => {
    const page = await renderAs(people.teacher);
    const router = TestBed.inject(Router);
    for (const url of [
      '/drills',
      '/drills/backbeat-basics?seed=amber-1',
      '/drills/backbeat-basics?seed=amber-2',
      '/drills',
    ]) {
      await router.navigateByUrl(url);
      await fixture.whenStable();
      const current = [...page.querySelectorAll('nav a[aria-current="page"]')];
      expect(
        current.map((a) => a.getAttribute('href')),
        url,
      ).toEqual(['/drills']);
    }
  });

  it('names the person and role on the account button, and signs out', async () => {
    const page = await renderAs(people.admin);
    // The menu's code loads once idle; until then the same button stands in (see toolbar-actions).
    for (let wait = 0; wait < 50 && !page.querySelector('tensile-toolbar-actions'); wait++) {
      await new Promise((resolve) => setTimeout(resolve, 20));
      await fixture.whenStable();
    }
    const account = page.querySelector<HTMLButtonElement>('button[aria-label^="Account"]')!;
    expect(account.getAttribute('aria-label')).toBe('Account: Imogen Vale, Admin');
    account.click();
    await fixture.whenStable();
    const menuItem = () =>
      [...document.querySelectorAll<HTMLButtonElement>('[mat-menu-item]')].find((b) =>
        b.textContent?.includes('Sign out'),
      );
    const signOut = menuItem()!;
    signOut.click();
    backend.expectOne(AUTH_SIGN_OUT_URL).flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    expect(TestBed.inject(AuthSession).user()).toBeNull();
    expect(TestBed.inject(Router).url).toBe('/sign-in');
  });

  it('offers a skip link, a theme toggle and the safety note', async () => {
    const page = await renderAs(people.teacher);
    expect(page.querySelector('a.skip-link')?.textContent).toContain('Skip to content');
    expect(
      page.querySelector(
        'button[aria-label="Use dark theme"], button[aria-label="Use light theme"]',
      ),
    ).not.toBeNull();
    expect(page.querySelector('footer tensile-safety-note')?.textContent).toContain(
      'hearing protection',
    );
  });

  it('on a narrow screen, hides the navigation behind a labelled menu button', async () => {
    // jsdom matches no media query, so the shell lays out as on a tablet or phone.
    const page = await renderAs(people.teacher);
    const menu = page.querySelector<HTMLButtonElement>(
      'button[aria-controls="tensile-navigation"]',
    )!;
    expect(menu.getAttribute('aria-label')).toBe('Show navigation');
    expect(menu.getAttribute('aria-expanded')).toBe('false');
    menu.click();
    await fixture.whenStable();
    expect(menu.getAttribute('aria-expanded')).toBe('true');
    expect(menu.getAttribute('aria-label')).toBe('Hide navigation');
    expect(page.querySelector('mat-sidenav')?.classList).toContain('mat-drawer-opened');
  });
});
