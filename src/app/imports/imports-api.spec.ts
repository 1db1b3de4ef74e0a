import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ImportsApi, type UploadState } from './imports-api';

describe('ImportsApi', () => {
  let api: ImportsApi;
  let backend: HttpTestingController;
  const file = new File([new Uint8Array([0x4d, 0x54, 0x68, 0x64])], 'groove.mid');

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    api = TestBed.inject(ImportsApi);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('uploads the file and the chosen track, and reports sending, reading, done', () => {
    const states: UploadState<unknown>[] = [];
    api.preview(file, 2).subscribe((state) => states.push(state));
    const req = backend.expectOne('/api/imports/midi');
    expect(req.request.method).toBe('POST');
    const body = req.request.body as FormData;
    expect(body.get('track')).toBe('2');
    expect((body.get('file') as File).name).toBe('groove.mid');
    req.event({ type: HttpEventType.UploadProgress, loaded: 2, total: 4 });
    req.event({ type: HttpEventType.UploadProgress, loaded: 4, total: 4 });
    req.flush({ groove: { warnings: [] } });
    expect(states).toEqual([
      { phase: 'sending', share: null },
      { phase: 'sending', share: 0.5 },
      { phase: 'reading' },
      { phase: 'done', value: { warnings: [] } },
    ]);
  });

  it('leaves the track out when every channel-10 track is read, and cancels on unsubscribe', () => {
    const subscription = api.preview(file, null).subscribe();
    const req = backend.expectOne('/api/imports/midi');
    expect((req.request.body as FormData).has('track')).toBe(false);
    subscription.unsubscribe();
    expect(req.cancelled).toBe(true);
  });

  it('saves with a title and answers the saved drill', () => {
    let saved: unknown;
    api.save(file, null, 'Rock groove').subscribe((drill) => (saved = drill));
    const req = backend.expectOne('/api/imports/midi/save');
    expect((req.request.body as FormData).get('title')).toBe('Rock groove');
    req.flush({ drill: { id: 7 } }, { status: 201, statusText: 'Created' });
    expect(saved).toEqual({ id: 7 });
  });
});
