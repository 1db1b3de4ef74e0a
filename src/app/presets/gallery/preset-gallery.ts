import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatChipsModule } from '@angular/material/chips';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { apiErrorMessage } from '../../core/api-error-message';
import { AuthSession } from '../../core/auth-session';
import { toLoadState, type LoadState } from '../../core/load-state';
import { debounced } from '../../rule-cards/debounced';
import { freshSeedWord } from '../../rule-cards/seed-word';
import { CardFilters } from '../../ui/card-filters';
import { EmptyState } from '../../ui/empty-state';
import { CuratedPresetsApi, type PresetLevel, type PresetView } from '../presets-api';

/**
 * `/gallery`: the published presets as cards with a notation thumbnail each, filtered by tag,
 * level, meter and subdivision. Teachers copy one into their own cards ("Start from this");
 * everyone can open a drill from it.
 */
@Component({
  selector: 'tensile-preset-gallery',
  imports: [
    MatButtonModule,
    MatCardModule,
    MatChipsModule,
    MatProgressBarModule,
    RouterLink,
    EmptyState,
    CardFilters,
  ],
  templateUrl: './preset-gallery.html',
  styleUrl: './preset-gallery.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PresetGallery {
  private readonly api = inject(CuratedPresetsApi);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(AuthSession);

  protected readonly tag = signal('');
  protected readonly meter = signal('');
  protected readonly level = signal<PresetLevel | ''>('');
  protected readonly subdivision = signal<number | ''>('');
  protected readonly starting = signal<string | null>(null);
  private readonly typedTag = debounced(this.tag, 250);
  private readonly typedMeter = debounced(this.meter, 250);
  protected readonly canStart = computed(() => {
    const role = this.session.role();
    return role === 'teacher' || role === 'admin';
  });
  protected readonly state = toSignal(
    toObservable(
      computed(() => ({
        tag: this.typedTag().trim().toLowerCase(),
        meter: this.typedMeter().trim(),
        level: this.level(),
        subdivision: this.subdivision(),
      })),
    ).pipe(switchMap((filter) => toLoadState(this.api.list(filter)))),
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

  protected thumbnail(id: string): string {
    return this.api.thumbnailUrl(id);
  }

  protected drillLink(id: string) {
    return { path: ['/drills', id], queryParams: { seed: freshSeedWord() } };
  }

  protected start(preset: PresetView): void {
    this.starting.set(preset.id);
    this.api.start(preset.id).subscribe({
      next: (card) => {
        this.starting.set(null);
        this.snackBar.open(`"${card.title}" is now one of your rule cards.`, undefined, {
          duration: 4000,
        });
        void this.router.navigate(['/rule-cards', card.id]);
      },
      error: (error: unknown) => {
        this.starting.set(null);
        this.snackBar.open(apiErrorMessage(error), 'Dismiss');
      },
    });
  }
}
