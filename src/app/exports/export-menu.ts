import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatMenuModule } from '@angular/material/menu';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { DrillSource } from '../../../shared/formats/drill-source';
import { apiErrorMessage } from '../core/api-error-message';
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
 * MusicXML score (for a notation program), downloaded as a file. A failure shows in a snackbar.
 */
@Component({
  selector: 'tensile-export-menu',
  imports: [MatButtonModule, MatMenuModule],
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
