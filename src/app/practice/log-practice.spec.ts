import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { LogPractice } from './log-practice';

describe('LogPractice', () => {
  let fixture: ComponentFixture<LogPractice>;
  let page: HTMLElement;
  let backend: HttpTestingController;
  let snack: ReturnType<typeof vi.fn>;

  beforeEach(async () => {
    snack = vi.fn();
    TestBed.configureTestingModule({
      imports: [LogPractice],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snack } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(LogPractice);
    page = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('assignmentId', 7);
    fixture.componentRef.setInput('assignmentDrillId', 12);
    await fixture.whenStable();
  });

  afterEach(() => backend.verify());

  function field(label: string): HTMLInputElement {
    const input = [...page.querySelectorAll('mat-form-field')]
      .find((f) => f.querySelector('mat-label')?.textContent?.trim() === label)
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

  const errors = () => [...page.querySelectorAll('mat-error')].map((e) => e.textContent?.trim());

  it('shows the practice caution beside the form', () => {
    const caution = page.querySelector('.caution')?.textContent ?? '';
    expect(caution).toMatch(/Warm up/);
    expect(caution).toMatch(/protect your hearing/);
    expect(caution).toMatch(/qualified teacher or clinician/);
  });

  it('pre-fills the clean tempo from playback until the student edits it', async () => {
    fixture.componentRef.setInput('suggestedTempo', 88);
    await fixture.whenStable();
    expect(field('Highest clean tempo (BPM)').value).toBe('88');
    await type('Highest clean tempo (BPM)', '80');
    fixture.componentRef.setInput('suggestedTempo', 96);
    await fixture.whenStable();
    expect(field('Highest clean tempo (BPM)').value).toBe('80');
  });

  it('says what is wrong and sends nothing while a field is out of range', async () => {
    await type('Minutes', '0');
    await type('Highest clean tempo (BPM)', '400');
    await submit();
    expect(errors()).toEqual(['Between 1 and 600 minutes.', 'Between 20 and 300 BPM.']);
    backend.expectNone('/api/practice/logs');
  });

  it('logs the worksheet drill it is given and confirms in a snackbar', async () => {
    await type('Minutes', '15');
    await type('Highest clean tempo (BPM)', '72');
    await submit();
    const request = backend.expectOne('/api/practice/logs');
    expect(request.request.body).toEqual({
      assignmentId: 7,
      assignmentDrillId: 12,
      minutes: 15,
      tempo: 72,
      rating: 3,
      note: '',
    });
    request.flush({ log: { id: 1, minutes: 15, tempo: 72 } });
    await fixture.whenStable();
    expect(snack).toHaveBeenCalledTimes(1);
    expect(snack.mock.calls[0]![0]).toMatch(/^Logged 15 minutes at 72 BPM\./);
  });
});
