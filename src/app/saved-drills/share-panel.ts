import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input, model } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { filter, switchMap } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { confirmAction } from '../ui/confirm-dialog';
import { SavedDrillsApi, type SeedLink } from './saved-drills-api';

/** A saved drill's seed link: make it, copy it, see its views, revoke it. */
@Component({
  selector: 'tensile-share-panel',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <h2>Share</h2>
    @if (live(); as current) {
      <p class="link">
        <a [href]="absolute(current)" target="_blank" rel="noopener" data-testid="seed-link">{{
          absolute(current)
        }}</a>
      </p>
      <p class="views" role="status">
        Opened {{ current.views }} time{{ current.views === 1 ? '' : 's' }}.
      </p>
      <div class="actions">
        <button mat-stroked-button type="button" (click)="copy(current)">
          <mat-icon>content_copy</mat-icon> Copy link
        </button>
        <button mat-button type="button" (click)="revoke()">
          <mat-icon>link_off</mat-icon> Revoke link
        </button>
      </div>
    } @else {
      @if (link()?.revokedAt) {
        <p>The last link was revoked: anyone opening it sees that the drill was withdrawn.</p>
      }
      <p>
        A link lets anyone (signed in or not) see and play this drill, and nothing else of yours.
      </p>
      <button mat-flat-button type="button" (click)="share()">
        <mat-icon>share</mat-icon> Share a link
      </button>
    }
  `,
  styles: `
    :host {
      display: grid;
      gap: 4px;
    }
    h2 {
      margin: 0;
      font-size: 1.1rem;
    }
    .link {
      word-break: break-all;
      margin: 0;
    }
    .views {
      margin: 0;
    }
    .actions {
      display: flex;
      gap: 8px;
      flex-wrap: wrap;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SharePanel {
  readonly drillId = input.required<number | string>();
  readonly link = model<SeedLink | null>(null);

  private readonly api = inject(SavedDrillsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly clipboard = inject(Clipboard);
  protected readonly live = computed(() => {
    const link = this.link();
    return link && !link.revokedAt ? link : null;
  });

  protected absolute(link: SeedLink): string {
    return new URL(link.url, window.location.origin).href;
  }

  protected share(): void {
    this.api.share(this.drillId()).subscribe({
      next: (link) => {
        this.link.set(link);
        this.snackBar.open('Link made: copy it and send it.', undefined, { duration: 3000 });
      },
      error: (error: unknown) => this.snackBar.open(apiErrorMessage(error), 'Dismiss'),
    });
  }

  protected copy(link: SeedLink): void {
    const copied = this.clipboard.copy(this.absolute(link));
    this.snackBar.open(
      copied ? 'Link copied.' : 'The browser refused to copy: select the link instead.',
      undefined,
      {
        duration: 3000,
      },
    );
  }

  protected revoke(): void {
    confirmAction(this.dialog, {
      title: 'Revoke this link?',
      message:
        'Anyone opening it from now on sees that the drill was withdrawn. The drill itself stays saved.',
      confirm: 'Revoke link',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.api.revoke(this.drillId())),
      )
      .subscribe({
        next: () => {
          const link = this.link();
          this.link.set(link ? { ...link, revokedAt: new Date().toISOString() } : null);
          this.snackBar.open('Link revoked.', undefined, { duration: 3000 });
        },
        error: (error: unknown) => this.snackBar.open(apiErrorMessage(error), 'Dismiss'),
      });
  }
}
