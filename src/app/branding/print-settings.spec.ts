import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { PrintSettings } from './print-settings';

describe('PrintSettings', () => {
  let fixture: ComponentFixture<PrintSettings>;
  let backend: HttpTestingController;
  const page = () => fixture.nativeElement as HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [PrintSettings],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PrintSettings);
    backend.expectOne('/api/branding').flush({
      branding: {
        studioName: 'Larkspur North Room',
        logo: { mime: 'image/png', width: 600, height: 133 },
        updatedAt: '2026-12-02T16:00:00.000Z',
      },
    });
    await fixture.whenStable();
  });
  afterEach(() => backend.verify());

  it('shows the stored name and a preview of the stored logo', () => {
    expect(page().querySelector<HTMLInputElement>('input[name="studioName"]')!.value).toBe(
      'Larkspur North Room',
    );
    const img = page().querySelector('img')!;
    expect(img.getAttribute('src')).toBe('/api/branding/logo?v=2026-12-02T16%3A00%3A00.000Z');
    expect(page().textContent).toContain('600 × 133 pixels');
  });

  it('saves the studio name as typed', async () => {
    const input = page().querySelector<HTMLInputElement>('input[name="studioName"]')!;
    input.value = 'Larkspur East';
    input.dispatchEvent(new Event('input'));
    page().querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    const request = backend.expectOne('/api/branding');
    expect(request.request.method).toBe('PUT');
    expect(request.request.body).toEqual({ studioName: 'Larkspur East' });
    request.flush({ branding: { studioName: 'Larkspur East', logo: null, updatedAt: null } });
    await fixture.whenStable();
    expect(page().textContent).toContain('Studio name saved.');
    expect(page().querySelector('img')).toBeNull();
  });

  it('uploads the chosen file and shows the server’s refusal in its words', async () => {
    const input = page().querySelector<HTMLInputElement>('input[type="file"]')!;
    const file = new File(['not an image'], 'logo.png', { type: 'image/png' });
    Object.defineProperty(input, 'files', { value: [file] });
    input.dispatchEvent(new Event('change'));
    const request = backend.expectOne('/api/branding/logo');
    expect(request.request.method).toBe('PUT');
    expect((request.request.body as FormData).get('logo')).toBeInstanceOf(File);
    const message = 'The logo must be a PNG or JPEG image; this file is neither.';
    request.flush(
      { error: { code: 'invalid_logo', message } },
      { status: 400, statusText: 'Bad Request' },
    );
    await fixture.whenStable();
    expect(page().querySelector('[role="alert"]')?.textContent).toContain(message);
  });
});
