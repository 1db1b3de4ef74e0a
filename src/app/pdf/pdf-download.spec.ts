import { HttpEventType, HttpHeaders, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiErrorMessage } from '../core/api-error-message';
import { attachmentName, PdfDownload, type PdfProgress } from './pdf-download';

describe('attachmentName', () => {
  it('reads the file name of a Content-Disposition header, quoted or not', () => {
    expect(attachmentName('attachment; filename=early-backbeat.pdf', 'x.pdf')).toBe(
      'early-backbeat.pdf',
    );
    expect(attachmentName('attachment; filename="week 3.pdf"', 'x.pdf')).toBe('week 3.pdf');
    expect(attachmentName(null, 'x.pdf')).toBe('x.pdf');
  });
});

describe('PdfDownload', () => {
  let backend: HttpTestingController;
  let downloads: PdfDownload;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    downloads = TestBed.inject(PdfDownload);
  });
  afterEach(() => backend.verify());

  it('POSTs the body and reports preparing, receiving and the finished file', () => {
    const seen: PdfProgress[] = [];
    downloads
      .fetch('/api/pdf/drill', { source: { kind: 'saved', drillId: 3 } })
      .subscribe((p) => seen.push(p));
    const request = backend.expectOne('/api/pdf/drill');
    expect(request.request.method).toBe('POST');
    expect(request.request.reportProgress).toBe(true);
    expect(request.request.responseType).toBe('blob');
    // HttpClient reports the request as sent itself: the server is laying out the pages.
    expect(seen.map((p) => p.state)).toEqual(['preparing']);
    request.event({ type: HttpEventType.DownloadProgress, loaded: 512, total: 2048 });
    request.event({ type: HttpEventType.DownloadProgress, loaded: 4096 });
    request.flush(new Blob(['%PDF-1.3'], { type: 'application/pdf' }), {
      headers: new HttpHeaders({ 'Content-Disposition': 'attachment; filename=linear.pdf' }),
    });
    expect(seen.map((p) => p.state)).toEqual(['preparing', 'receiving', 'receiving', 'done']);
    expect(seen[1]).toEqual({ state: 'receiving', loaded: 512, total: 2048 });
    expect(seen[2]).toEqual({ state: 'receiving', loaded: 4096, total: null });
    const done = seen[3] as Extract<PdfProgress, { state: 'done' }>;
    expect(done.filename).toBe('linear.pdf');
    expect(done.file.size).toBe(8);
  });

  it('GETs when no body is given, and cancels the request on unsubscribe', () => {
    const subscription = downloads.fetch('/api/worksheets/4/pdf?paper=a4').subscribe();
    const request = backend.expectOne('/api/worksheets/4/pdf?paper=a4');
    expect(request.request.method).toBe('GET');
    subscription.unsubscribe();
    expect(request.cancelled).toBe(true);
  });

  it('turns the server’s JSON error, which arrives as a Blob, into its message', async () => {
    const failure = new Promise<unknown>((resolve) =>
      downloads.fetch('/api/pdf/drill', {}).subscribe({ error: resolve }),
    );
    const body = { error: { code: 'not_found', message: 'There is no saved drill with that id.' } };
    backend
      .expectOne('/api/pdf/drill')
      .flush(new Blob([JSON.stringify(body)], { type: 'application/json' }), {
        status: 404,
        statusText: 'Not Found',
      });
    expect(apiErrorMessage(await failure)).toBe('There is no saved drill with that id.');
  });
});
