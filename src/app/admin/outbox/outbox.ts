import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { DomSanitizer } from '@angular/platform-browser';
import { RouterLink } from '@angular/router';
import { EMPTY, map, switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../../core/load-state';
import { OutboxApi, type OutboxMessage, type OutboxSummary } from './outbox-api';

/**
 * `/admin/outbox`: every message the app would have e-mailed while no mail server is set, newest
 * first; opening one shows its plain-text part and its HTML part (in a sandboxed frame).
 */
@Component({
  selector: 'tensile-outbox',
  imports: [DatePipe, MatButtonModule, MatProgressBarModule, MatTableModule, RouterLink],
  templateUrl: './outbox.html',
  styleUrl: './outbox.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Outbox {
  private readonly api = inject(OutboxApi);
  protected readonly columns = ['createdAt', 'to', 'subject'];
  protected readonly list = toSignal(toLoadState(this.api.list()), {
    initialValue: { status: 'loading' } as LoadState<{
      items: readonly OutboxSummary[];
      total: number;
    }>,
  });
  protected readonly openId = signal<number | null>(null);
  protected readonly open = toSignal(
    toObservable(this.openId).pipe(
      switchMap((id) => (id === null ? EMPTY : toLoadState<OutboxMessage>(this.api.message(id)))),
      map((state): LoadState<OutboxMessage> | null => state),
    ),
    { initialValue: null as LoadState<OutboxMessage> | null },
  );
  private readonly sanitizer = inject(DomSanitizer);
  /**
   * The HTML part as written (Angular's sanitiser would strip its inline styles). It is shown in
   * an iframe with an empty `sandbox`: no scripts, no forms, its own opaque origin.
   */
  protected readonly html = computed(() => {
    const state = this.open();
    return state?.status === 'ready'
      ? this.sanitizer.bypassSecurityTrustHtml(state.value.html)
      : null;
  });
}
