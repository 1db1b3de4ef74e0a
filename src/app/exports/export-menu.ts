import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { DrillSource } from '../../../shared/formats/drill-source';
import type { Subscription } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { PdfDownload, type PdfProgress } from '../pdf/pdf-download';
import { PdfProgressBar } from '../pdf/pdf-progress';
import { ExportsApi, type ExportFormat } from './exports-api';
import { saveFile } from './save-file';

/** What a page passes: a drill source whose saved-drill id may still be text. */
export type MenuSource =
  | Exclude<DrillSource, { kind: 'saved' }>
  | { readonly kind: 'saved'; readonly drillId: number | string };

function toDrillSource(source: MenuSource): DrillSource {
  return source.kind === 'saved' ? { kind: 'saved', drillId: Number(source.drillId) } : source;
}

/**
 * "Export" menu of a drill: the drill as a Standard MIDI File (for a sequencer or e-kit) or a
 * MusicXML score (for a notation program), downloaded as a file, or a printable PDF sheet (with
 * progress and Cancel while the server lays it out). A failure shows in a snackbar.
 */
@Component({
  selector: 'tensile-export-menu',
  imports: [MatButtonModule, MatMenuModule, PdfProgressBar],
  templateUrl: './export-menu.html',
  styleUrl: './export-menu.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'tensile-no-print' },
})
export class ExportMenu {
  /** The drill to export (a saved drill's id as the page holds it, number or text). */
  readonly source = input.required<DrillSource, MenuSource>({ transform: toDrillSource });

  private readonly api = inject(ExportsApi);
  private readonly snackBar = inject(MatSnackBar);

  /** The format being downloaded, while it is. */
  protected readonly busy = signal<ExportFormat | null>(null);

  private readonly pdf = inject(PdfDownload);
  /** The PDF download's progress, while it runs. */
  protected readonly pdfProgress = signal<PdfProgress | null>(null);
  private pdfRun: Subscription | null = null;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.cancelPdf());
  }

  protected downloadPdf(): void {
    if (this.pdfRun) return;
    this.pdfProgress.set({ state: 'preparing' });
    this.pdfRun = this.pdf
      .fetch('/api/pdf/drill', { source: this.source(), paper: 'a4' }, 'drill.pdf')
      .subscribe({
        next: (progress) => {
          this.pdfProgress.set(progress);
          if (progress.state === 'done') {
            saveFile(progress.file, progress.filename);
            this.cancelPdf();
          }
        },
        error: (error: unknown) => {
          this.cancelPdf();
          this.snackBar.open(`The PDF failed: ${apiErrorMessage(error)}`, 'Dismiss');
        },
      });
  }

  /** Unsubscribing aborts the request; the server stops rendering when the connection closes. */
  protected cancelPdf(): void {
    this.pdfRun?.unsubscribe();
    this.pdfRun = null;
    this.pdfProgress.set(null);
  }

  protected download(format: ExportFormat): void {
    if (this.busy()) return;
    this.busy.set(format);
    this.api.download(format, this.source()).subscribe({
      next: (file) => {
        this.busy.set(null);
        saveFile(file.blob, file.filename);
      },
      error: (error: unknown) => {
        this.busy.set(null);
        this.snackBar.open(`The export failed: ${apiErrorMessage(error)}`, 'Dismiss');
      },
    });
  }
}
