import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ExportMenu, type MenuSource } from './export-menu';
import { filenameOf } from './exports-api';

@Component({
  imports: [ExportMenu],
  template: '<tensile-export-menu [source]="source()" />',
})
class Host {
  readonly source = signal<MenuSource>({ kind: 'saved', drillId: '7' });
}

describe('ExportMenu', () => {
  let fixture: ComponentFixture<Host>;
  let backend: HttpTestingController;
  let saved: { name: string; href: string }[];

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [Host],
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    saved = [];
    // jsdom has no object URLs and does not navigate: record what would be saved instead.
    URL.createObjectURL = vi.fn(() => 'blob:tensile/1');
    URL.revokeObjectURL = vi.fn();
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push({ name: this.download, href: this.href });
    });
    fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
  });

  afterEach(() => {
    backend.verify();
    vi.restoreAllMocks();
  });

  async function choose(label: string): Promise<void> {
    const trigger = (fixture.nativeElement as HTMLElement).querySelector('button')!;
    trigger.click();
    await fixture.whenStable();
    const item = [...document.querySelectorAll<HTMLButtonElement>('[mat-menu-item]')].find((b) =>
      b.textContent?.includes(label),
    );
    expect(item, `menu item ${label}`).toBeDefined();
    item!.click();
    await fixture.whenStable();
  }

  it('posts the source and saves the file under the name the server gives', async () => {
    await choose('MIDI');
    const request = backend.expectOne('/api/exports/midi');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ source: { kind: 'saved', drillId: 7 } });
    request.flush(new Blob([new Uint8Array([0x4d, 0x54, 0x68, 0x64])]), {
      headers: { 'Content-Disposition': 'attachment; filename=quintuplets-week-3.mid' },
    });
    await fixture.whenStable();
    expect(saved).toEqual([{ name: 'quintuplets-week-3.mid', href: 'blob:tensile/1' }]);
  });

  it('shows the server’s reason in a snackbar when the export fails', async () => {
    await choose('MusicXML');
    const message = 'There is no saved drill with that id among yours.';
    backend
      .expectOne('/api/exports/musicxml')
      .flush(new Blob([JSON.stringify({ error: { code: 'not_found', message } })]), {
        status: 404,
        statusText: 'Not Found',
      });
    // The error body is read from the Blob asynchronously.
    await vi.waitFor(() => {
      expect(document.body.textContent).toContain(`The export failed: ${message}`);
    });
    expect(saved).toEqual([]);
  });
  it('prints a PDF with progress and Cancel, and saves it when it arrives', async () => {
    await choose('PDF');
    const request = backend.expectOne('/api/pdf/drill');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ source: { kind: 'saved', drillId: 7 }, paper: 'a4' });
    const host = fixture.nativeElement as HTMLElement;
    expect(host.querySelector('mat-progress-bar')).not.toBeNull();
    expect(host.textContent).toContain('Laying out the pages');
    request.flush(new Blob(['%PDF-1.3']), {
      headers: { 'Content-Disposition': 'attachment; filename=quintuplets-week-3.pdf' },
    });
    await fixture.whenStable();
    expect(saved).toEqual([{ name: 'quintuplets-week-3.pdf', href: 'blob:tensile/1' }]);
    expect(host.querySelector('mat-progress-bar')).toBeNull();
  });

  it('cancels a PDF that is still being laid out', async () => {
    await choose('PDF');
    const request = backend.expectOne('/api/pdf/drill');
    const host = fixture.nativeElement as HTMLElement;
    const cancel = [...host.querySelectorAll('button')].find((b) =>
      b.textContent?.includes('Cancel'),
    );
    cancel!.click();
    await fixture.whenStable();
    expect(request.cancelled).toBe(true);
    expect(host.querySelector('mat-progress-bar')).toBeNull();
    expect(saved).toEqual([]);
  });
});

describe('filenameOf', () => {
  it('reads quoted and bare file names', () => {
    expect(filenameOf('attachment; filename="a b.musicxml"')).toBe('a b.musicxml');
    expect(filenameOf('attachment; filename=drill.mid')).toBe('drill.mid');
    expect(filenameOf(null)).toBeNull();
  });
});
