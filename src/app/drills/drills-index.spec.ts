import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { AUTH_SIGN_IN_URL, AuthSession } from '../core/auth-session';
import { SessionUser } from '../core/user';
import { DrillsIndex } from './drills-index';
import { RecentDrills } from './recent-drills';

@Component({ template: '' })
class Blank {}

const TEACHER: SessionUser = {
  id: 2,
  email: 'tomasz.reyes@larkspur.test',
  name: 'Tomasz Reyes',
  role: 'teacher',
};
const STUDENT: SessionUser = {
  id: 4,
  email: 'juno.marsh@larkspur.test',
  name: 'Juno Marsh',
  role: 'student',
};

const PRESETS = [
  {
    id: 'early-backbeat',
    title: 'Early backbeat',
    summary: 'Snare a sixteenth before 2 and 4.',
    card: {},
    meter: { beats: 4, unit: 4 },
    subdivision: 4,
  },
  {
    id: 'four-over-three',
    title: 'Four over three',
    summary: 'Four evenly spaced hits against three beats.',
    card: {},
    meter: { beats: 3, unit: 4 },
    subdivision: 4,
  },
];

describe('DrillsIndex', () => {
  let backend: HttpTestingController;
  let fixture: ComponentFixture<DrillsIndex>;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      imports: [DrillsIndex],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([{ path: '**', component: Blank }]),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    // A teacher's saved-drills table asks for its first page; saved-drills-table.spec covers it.
    backend.match((request) => request.url === '/api/drills');
    backend.verify();
    localStorage.clear();
  });

  async function renderAs(person: SessionUser): Promise<HTMLElement> {
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(person.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: person });
    await signedIn;
    fixture = TestBed.createComponent(DrillsIndex);
    await fixture.whenStable();
    backend.expectOne('/api/presets').flush({ presets: PRESETS });
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  const buttonNamed = (page: HTMLElement, name: string) =>
    [...page.querySelectorAll<HTMLButtonElement>('button')].find(
      (b) => b.textContent?.trim() === name,
    );

  it('says so when nothing was opened yet', async () => {
    const page = await renderAs(TEACHER);
    expect(page.querySelector('tensile-empty-state')?.textContent).toContain('No recent drills');
    expect(page.querySelector('button[aria-label="Clear recent drills"]')).toBeNull();
  });

  it('lists recent drills newest first, each reopening its card and seed', async () => {
    const recent = TestBed.inject(RecentDrills);
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(TEACHER.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: TEACHER });
    await signedIn;
    const now = Date.now();
    recent.record(
      { cardId: 'four-over-three', title: 'Four over three', seed: 'fern-2' },
      new Date(now - 3 * 60_000),
    );
    recent.record(
      { cardId: 'early-backbeat', title: 'Early backbeat', seed: 'amber 1' },
      new Date(now),
    );
    fixture = TestBed.createComponent(DrillsIndex);
    await fixture.whenStable();
    backend.expectOne('/api/presets').flush({ presets: PRESETS });
    await fixture.whenStable();
    const page = fixture.nativeElement as HTMLElement;

    const items = [...page.querySelectorAll<HTMLAnchorElement>('a.recent-item')];
    expect(items.map((a) => a.querySelector('.recent-title')?.textContent?.trim())).toEqual([
      'Early backbeat',
      'Four over three',
    ]);
    expect(items[0]?.textContent).toContain('amber 1');
    expect(items[0]?.textContent).toContain('just now');
    expect(items[1]?.textContent).toContain('3 minutes ago');
    const first = new URL(items[0]!.href, 'http://localhost');
    expect(first.pathname).toBe('/drills/early-backbeat');
    expect(first.searchParams.get('seed')).toBe('amber 1');
    // The form starts on the card opened last.
    expect(page.querySelector('mat-select')?.textContent).toContain('Early backbeat');
  });

  it('asks before clearing, keeps the list on "Keep them", and clears on "Clear list"', async () => {
    const recent = TestBed.inject(RecentDrills);
    const page = await renderAs(TEACHER);
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'a' });
    recent.record({ cardId: 'early-backbeat', title: 'Early backbeat', seed: 'b' });
    await fixture.whenStable();

    page.querySelector<HTMLButtonElement>('button[aria-label="Clear recent drills"]')!.click();
    await fixture.whenStable();
    expect(page.querySelector('.confirm')?.textContent).toContain('Clear all 2 recent drills');
    expect(page.querySelectorAll('a.recent-item')).toHaveLength(2);
    expect(document.activeElement?.textContent?.trim()).toBe('Keep them');

    buttonNamed(page, 'Keep them')!.click();
    await fixture.whenStable();
    expect(page.querySelector('.confirm')).toBeNull();
    expect(recent.entries()).toHaveLength(2);

    page.querySelector<HTMLButtonElement>('button[aria-label="Clear recent drills"]')!.click();
    await fixture.whenStable();
    buttonNamed(page, 'Clear list')!.click();
    await fixture.whenStable();
    expect(recent.entries()).toEqual([]);
    expect(page.querySelector('tensile-empty-state')?.textContent).toContain('No recent drills');
  });

  it('opens the chosen card with the typed seed', async () => {
    const page = await renderAs(TEACHER);
    const seed = page.querySelector<HTMLInputElement>('input[name="seed"]')!;
    expect(seed.value).toMatch(/^[a-z]+-\d{3}$/);
    seed.value = '  lesson-12 ';
    seed.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    buttonNamed(page, 'Open')!.click();
    await fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/drills/early-backbeat?seed=lesson-12');
  });

  it('will not open without a seed, and says what to type', async () => {
    const page = await renderAs(TEACHER);
    const seed = page.querySelector<HTMLInputElement>('input[name="seed"]')!;
    seed.value = '   ';
    seed.dispatchEvent(new Event('input'));
    seed.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
    expect(buttonNamed(page, 'Open')!.disabled).toBe(true);
    expect(page.textContent).toContain('Type a seed');
    buttonNamed(page, 'New seed')!.click();
    await fixture.whenStable();
    expect(seed.value).toMatch(/^[a-z]+-\d{3}$/);
    expect(buttonNamed(page, 'Open')!.disabled).toBe(false);
  });

  it('shows a student their recent drills but no seed form', async () => {
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(STUDENT.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: STUDENT });
    await signedIn;
    TestBed.inject(RecentDrills).record({
      cardId: 'early-backbeat',
      title: 'Early backbeat',
      seed: 'given-by-teacher',
    });
    fixture = TestBed.createComponent(DrillsIndex);
    await fixture.whenStable();
    // No card list is asked for: afterEach verifies there is no open request.
    const page = fixture.nativeElement as HTMLElement;
    expect(page.querySelector('input[name="seed"]')).toBeNull();
    expect(page.querySelector('mat-select')).toBeNull();
    expect(page.querySelector('a.recent-item')?.textContent).toContain('given-by-teacher');
  });
});
