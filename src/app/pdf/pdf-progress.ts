import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { PdfProgress } from './pdf-download';

/**
 * A running PDF download: a Material progress bar (moving while the server lays out the pages,
 * filling as the file arrives when its size is known), a line of words, and a Cancel button.
 */
@Component({
  selector: 'tensile-pdf-progress',
  imports: [MatButtonModule, MatProgressBarModule],
  template: `
    @let share = percent();
    @if (share !== null) {
      <mat-progress-bar mode="determinate" [value]="share" aria-label="PDF download" />
    } @else {
      <mat-progress-bar mode="indeterminate" aria-label="PDF download" />
    }
    <span class="words">{{ words() }}</span>
    <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
  `,
  styles: `
    :host {
      display: grid;
      grid-template-columns: 1fr auto;
      align-items: center;
      gap: 4px 12px;
      min-width: 16rem;
    }
    mat-progress-bar {
      grid-column: 1 / -1;
    }
  `,
  host: { role: 'status', 'aria-live': 'polite' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PdfProgressBar {
  readonly progress = input.required<PdfProgress>();
  readonly cancelled = output<void>();

  protected readonly percent = computed(() => {
    const progress = this.progress();
    return progress.state === 'receiving' && progress.total
      ? Math.round((100 * progress.loaded) / progress.total)
      : null;
  });

  protected readonly words = computed(() => {
    const progress = this.progress();
    if (progress.state === 'preparing') return 'Laying out the pages…';
    if (progress.state === 'done') return 'Saving the file…';
    const share = this.percent();
    return share !== null
      ? `Downloading, ${share}%`
      : `Downloading, ${Math.round(progress.loaded / 1024)} kB`;
  });
}
