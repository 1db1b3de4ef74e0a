import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { filter, switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../../core/load-state';
import { apiErrorWithDetails } from '../../rule-cards/api-details';
import { freshSeedWord } from '../../rule-cards/seed-word';
import { EmptyState } from '../../ui/empty-state';
import { CuratedPresetsApi, type PresetEdit, type PresetView } from '../presets-api';
import { PresetEditDialog } from './preset-edit-dialog';
import { PromoteTable } from './promote-table';

/**
 * `/presets` (admin): every preset, published or withdrawn, in gallery order; edit, publish or
 * withdraw, and promote a teacher's rule card (chosen from a list of them) to a new preset.
 */
@Component({
  selector: 'tensile-preset-curation',
  imports: [
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatTableModule,
    RouterLink,
    EmptyState,
    PromoteTable,
  ],
  templateUrl: './preset-curation.html',
  styleUrl: './preset-curation.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PresetCuration {
  private readonly api = inject(CuratedPresetsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly reload = signal(0);

  protected readonly columns = [
    'position',
    'title',
    'level',
    'tags',
    'credit',
    'published',
    'actions',
  ];
  protected readonly state = toSignal(
    toObservable(this.reload).pipe(switchMap(() => toLoadState(this.api.list({ all: true })))),
    { initialValue: { status: 'loading' } as LoadState<readonly PresetView[]> },
  );
  protected readonly presets = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value : [];
  });
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : '';
  });

  protected drillLink(id: string) {
    return { path: ['/drills', id], queryParams: { seed: freshSeedWord() } };
  }

  protected edit(preset: PresetView): void {
    this.dialog
      .open<PresetEditDialog, PresetView, PresetEdit>(PresetEditDialog, { data: preset })
      .afterClosed()
      .pipe(
        filter((edit): edit is PresetEdit => !!edit),
        switchMap((edit) => this.api.update(preset.id, edit)),
      )
      .subscribe(this.done((saved) => `Saved "${saved.title}".`));
  }

  protected setPublished(preset: PresetView, published: boolean): void {
    this.api
      .update(preset.id, { published })
      .subscribe(
        this.done((saved) =>
          saved.published
            ? `"${saved.title}" is in the gallery.`
            : `"${saved.title}" is withdrawn.`,
        ),
      );
  }

  protected reloadPresets(): void {
    this.reload.update((n) => n + 1);
  }

  private done<T>(message: (value: T) => string) {
    return {
      next: (value: T) => {
        this.snackBar.open(message(value), undefined, { duration: 4000 });
        this.reload.update((n) => n + 1);
      },
      error: (error: unknown) => this.snackBar.open(apiErrorWithDetails(error), 'Dismiss'),
    };
  }
}
