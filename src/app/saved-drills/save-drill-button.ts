import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { of, switchMap } from 'rxjs';

import { apiErrorMessage } from '../core/api-error-message';
import { AuthSession } from '../core/auth-session';
import type { PresetDetail } from '../drills/drills-api';
import { SaveDrillDialog, type SaveDrillFields } from './save-drill-dialog';
import { SavedDrillsApi } from './saved-drills-api';

/**
 * "Save drill" for a built-in card's drill at a seed: asks for a title and notes, keeps the drill
 * (the server regenerates and stores it) and offers a link to the saved drill. Shown to teachers
 * and admins only; students practise what they are given.
 */
@Component({
  selector: 'tensile-save-drill-button',
  imports: [MatButtonModule],
  template: `
    @if (canSave()) {
      <button
        mat-stroked-button
        type="button"
        class="save-drill tensile-no-print"
        [disabled]="saving()"
        (click)="save()"
      >
        <span class="material-icons" aria-hidden="true">bookmark_add</span>
        Save drill
      </button>
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveDrillButton {
  /** The built-in card (its id is kept with the drill, its raw card is sent as it is). */
  readonly preset = input.required<Pick<PresetDetail, 'id' | 'title' | 'card'>>();
  readonly seed = input.required<string>();

  private readonly session = inject(AuthSession);
  private readonly dialog = inject(MatDialog);
  private readonly drills = inject(SavedDrillsApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly canSave = computed(() => {
    const role = this.session.role();
    return role === 'teacher' || role === 'admin';
  });
  protected readonly saving = signal(false);

  protected save(): void {
    const { id: presetId, title, card } = this.preset();
    const seed = this.seed();
    this.dialog
      .open<SaveDrillDialog, Partial<SaveDrillFields>, SaveDrillFields>(SaveDrillDialog, {
        data: { title: `${title} · ${seed}` },
      })
      .afterClosed()
      .pipe(
        switchMap((fields) => {
          if (!fields) return of(null);
          this.saving.set(true);
          return this.drills.save({
            presetId,
            title: fields.title,
            notes: fields.notes,
            card,
            seed,
          });
        }),
      )
      .subscribe({
        next: (saved) => {
          this.saving.set(false);
          if (!saved) return;
          this.snackBar
            .open(`Drill "${saved.title}" saved.`, 'Open', { duration: 8000 })
            .onAction()
            .subscribe(() => void this.router.navigate(['/saved-drills', saved.id]));
        },
        error: (error: unknown) => {
          this.saving.set(false);
          this.snackBar.open(`The drill was not saved: ${apiErrorMessage(error)}`, 'Dismiss');
        },
      });
  }
}
