import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { Subscription } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { saveFile } from '../exports/save-file';
import { PdfDownload, type PdfProgress } from './pdf-download';
import { PdfProgressBar } from './pdf-progress';

/**
 * A "Download PDF" button that shows the download's progress on a Material progress bar, with a
 * Cancel button while it runs. POSTs `body` to `url` when a body is given, else GETs `url`.
 */
@Component({
  selector: 'tensile-pdf-download',
  imports: [MatButtonModule, MatIconModule, PdfProgressBar],
  templateUrl: './pdf-download-button.html',
  styleUrl: './pdf-download-button.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PdfDownloadButton {
  private readonly downloads = inject(PdfDownload);
  readonly url = input.required<string>();
  readonly body = input<unknown>(undefined);
  readonly label = input('Download PDF');
  readonly filename = input('tensile.pdf');

  protected readonly progress = signal<PdfProgress | null>(null);
  protected readonly error = signal<string | null>(null);
  private running: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.cancel());
  }

  protected start(): void {
    this.cancel();
    this.error.set(null);
    this.progress.set({ state: 'preparing' });
    this.running = this.downloads.fetch(this.url(), this.body(), this.filename()).subscribe({
      next: (progress) => {
        this.progress.set(progress);
        if (progress.state === 'done') {
          saveFile(progress.file, progress.filename);
          this.finish();
        }
      },
      error: (error: unknown) => {
        this.error.set(apiErrorMessage(error, 'The PDF could not be made. Please try again.'));
        this.finish();
      },
    });
  }

  /** Stops the request; the server notices the closed connection and stops rendering. */
  protected cancel(): void {
    this.running?.unsubscribe();
    this.finish();
  }

  private finish(): void {
    this.running = null;
    this.progress.set(null);
  }
}
