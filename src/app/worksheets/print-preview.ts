import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  signal,
  type OnInit,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { DomSanitizer, type SafeResourceUrl } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import type { Subscription } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { saveFile } from '../exports/save-file';
import { PdfDownload, type PdfProgress } from '../pdf/pdf-download';
import { WorksheetsApi, type Paper } from './worksheets-api';

type PrintState =
  | { readonly status: 'idle' }
  | { readonly status: 'loading'; readonly received: number }
  | { readonly status: 'ready'; readonly file: Blob; readonly url: string; readonly name: string }
  | { readonly status: 'error'; readonly message: string };

/**
 * The printed worksheet as the server lays it out: the PDF itself, shown page by page in the
 * browser's own viewer, with a download of the very same file. Laying out takes a while, so the
 * progress shows and the teacher can cancel.
 */
@Component({
  selector: 'tensile-print-preview',
  imports: [
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './print-preview.html',
  styles: `
    :host {
      display: block;
    }
    section {
      display: grid;
      gap: 12px;
    }
    .bar {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 12px;
      align-items: center;
    }
    .spacer {
      flex: 1;
    }
    .pages {
      box-sizing: border-box;
      width: 100%;
      height: 80vh;
      border: 1px solid var(--tensile-rule);
      border-radius: var(--tensile-radius);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PrintPreview implements OnInit {
  /** Route parameter: the worksheet's id. */
  readonly id = input.required<string>();

  private readonly api = inject(WorksheetsApi);
  private readonly downloads = inject(PdfDownload);
  private readonly sanitizer = inject(DomSanitizer);
  protected readonly title = signal('');
  protected readonly paper = signal<Paper>('a4');
  protected readonly state = signal<PrintState>({ status: 'loading', received: 0 });
  protected readonly frameUrl = computed<SafeResourceUrl | null>(() => {
    const state = this.state();
    // A blob: URL this page made itself from the server's PDF.
    return state.status === 'ready'
      ? this.sanitizer.bypassSecurityTrustResourceUrl(state.url)
      : null;
  });
  protected readonly kilobytes = computed(() => {
    const state = this.state();
    return state.status === 'loading' ? Math.round(state.received / 1024) : 0;
  });
  private request: Subscription | undefined;

  constructor() {
    inject(DestroyRef).onDestroy(() => {
      this.request?.unsubscribe();
      this.release();
    });
  }

  ngOnInit(): void {
    this.api.get(this.id()).subscribe({
      next: (sheet) => {
        this.title.set(sheet.title);
        this.paper.set(sheet.paper);
        this.lay();
      },
      error: (error: unknown) =>
        this.state.set({ status: 'error', message: apiErrorMessage(error) }),
    });
  }

  protected choosePaper(paper: Paper): void {
    this.paper.set(paper);
    this.lay();
  }

  protected lay(): void {
    this.request?.unsubscribe();
    this.release();
    this.state.set({ status: 'loading', received: 0 });
    this.request = this.downloads
      .fetch(this.api.pdfUrl(this.id(), this.paper()), undefined, 'worksheet.pdf')
      .subscribe({
        next: (progress) => this.progress(progress),
        error: (error: unknown) =>
          this.state.set({
            status: 'error',
            message: apiErrorMessage(error, 'The PDF could not be made. Please try again.'),
          }),
      });
  }

  protected cancel(): void {
    this.request?.unsubscribe();
    this.state.set({ status: 'idle' });
  }

  /** Saves the very file the preview shows; nothing is laid out twice. */
  protected download(): void {
    const state = this.state();
    if (state.status === 'ready') saveFile(state.file, state.name);
  }

  private progress(progress: PdfProgress): void {
    if (progress.state === 'receiving') {
      this.state.set({ status: 'loading', received: progress.loaded });
    } else if (progress.state === 'done') {
      const file = new Blob([progress.file], { type: 'application/pdf' });
      const url = URL.createObjectURL(file);
      this.state.set({ status: 'ready', file, url, name: progress.filename });
    }
  }

  private release(): void {
    const state = this.state();
    if (state.status === 'ready') URL.revokeObjectURL(state.url);
  }
}
