import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { MatDialog } from '@angular/material/dialog';
import { firstValueFrom, of } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { AUTH_SIGN_IN_URL, AuthSession } from '../core/auth-session';
import type { SessionUser } from '../core/user';
import { SaveDrillButton } from './save-drill-button';
import type { SaveDrillFields } from './save-drill-dialog';

/** The dialog's answer stands in for a person typing into it (its form has its own checks). */
class FakeDialog {
  answer: SaveDrillFields | undefined;
  asked: unknown;
  open(_component: unknown, config: { data: unknown }) {
    this.asked = config.data;
    return { afterClosed: () => of(this.answer) };
  }
}

@Component({ template: '<p>page</p>' })
class Blank {}

const teacher: SessionUser = {
  id: 3,
  email: 'hana.lindqvist@larkspur.test',
  name: 'Hana Lindqvist',
  role: 'teacher',
};
const student: SessionUser = { ...teacher, id: 5, role: 'student' };
const card = { meter: '4/4', bars: 4 };

describe('SaveDrillButton', () => {
  let backend: HttpTestingController;
  let dialog: FakeDialog;

  beforeEach(() => {
    dialog = new FakeDialog();
    TestBed.configureTestingModule({
      imports: [SaveDrillButton],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([{ path: '**', component: Blank }]),
        { provide: MatDialog, useValue: dialog },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  async function renderAs(person: SessionUser) {
    const signedIn = firstValueFrom(TestBed.inject(AuthSession).signIn(person.email, 'demo'));
    backend.expectOne(AUTH_SIGN_IN_URL).flush({ user: person });
    await signedIn;
    const fixture = TestBed.createComponent(SaveDrillButton);
    fixture.componentRef.setInput('preset', {
      id: 'four-over-three',
      title: 'Four over three',
      card,
    });
    fixture.componentRef.setInput('seed', 'amber-fox-12');
    await fixture.whenStable();
    return fixture;
  }

  const overlay = () => document.querySelector('.cdk-overlay-container') as HTMLElement | null;
  const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

  it('keeps the drill with the preset, card and seed, then links to it', async () => {
    const fixture = await renderAs(teacher);
    const button = (fixture.nativeElement as HTMLElement).querySelector('button')!;
    expect(button.textContent).toContain('Save drill');
    dialog.answer = { title: 'Week 3 groove', notes: 'Count out loud.' };
    button.click();
    await fixture.whenStable();
    expect(dialog.asked).toEqual({ title: 'Four over three · amber-fox-12' });

    const post = backend.expectOne('/api/drills');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual({
      presetId: 'four-over-three',
      title: 'Week 3 groove',
      notes: 'Count out loud.',
      card,
      seed: 'amber-fox-12',
    });
    post.flush(
      { drill: { id: 41, title: 'Week 3 groove' } },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();
    await settle();

    const snack = overlay()!.querySelector('mat-snack-bar-container')!;
    expect(snack.textContent).toContain('Drill "Week 3 groove" saved.');
    const navigated = new Promise<string>((resolve) =>
      TestBed.inject(Router).events.subscribe((event) => {
        if ('urlAfterRedirects' in event) resolve(event.urlAfterRedirects as string);
      }),
    );
    snack.querySelector<HTMLButtonElement>('button')!.click();
    expect(await navigated).toBe('/saved-drills/41');
  });

  it('says why when the server refuses', async () => {
    const fixture = await renderAs(teacher);
    dialog.answer = { title: 'Week 3 groove', notes: '' };
    (fixture.nativeElement as HTMLElement).querySelector('button')!.click();
    await fixture.whenStable();
    backend
      .expectOne('/api/drills')
      .flush(
        { error: { code: 'search_exhausted', message: 'Try another seed.' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await fixture.whenStable();
    await settle();
    expect(overlay()!.textContent).toContain('The drill was not saved: Try another seed.');
  });

  it('sends nothing when the dialog is cancelled', async () => {
    const fixture = await renderAs(teacher);
    (fixture.nativeElement as HTMLElement).querySelector('button')!.click();
    await fixture.whenStable();
    backend.expectNone('/api/drills');
  });

  it('is not offered to a student', async () => {
    const fixture = await renderAs(student);
    expect((fixture.nativeElement as HTMLElement).querySelector('button')).toBeNull();
  });
});
