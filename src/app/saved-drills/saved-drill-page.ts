import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { filter, switchMap } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { generateFromCard } from '../drills/drill-result';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { freshSeed } from '../drills/seed-words';
import { confirmAction } from '../ui/confirm-dialog';
import { SavedDrillsApi, type SavedDrill, type SeedLink } from './saved-drills-api';
import { SharePanel } from './share-panel';
import { ExportMenu } from '../exports/export-menu';

/**
 * `/saved-drills/:id`: a kept drill, drawn from its stored snapshot (so it reads the same after
 * engine changes), with its title and notes, a seed link, and "New seed" on the same card.
 */
@Component({
  selector: 'tensile-saved-drill-page',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    RouterLink,
    DrillScore,
    PlaybackPanel,
    SharePanel,
    ExportMenu,
  ],
  templateUrl: './saved-drill-page.html',
  styleUrl: './saved-drill-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SavedDrillPage {
  readonly id = input.required<string>();

  private readonly api = inject(SavedDrillsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly drill = signal<SavedDrill | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly title = signal('');
  protected readonly notes = signal('');
  protected readonly link = signal<SeedLink | null>(null);
  protected readonly cursor = signal<ScorePosition | null>(null);
  /** A fresh seed on the saved card, shown instead of the snapshot until saved or dropped. */
  protected readonly freshSeed = signal<string | null>(null);
  protected readonly fresh = computed(() => {
    const seed = this.freshSeed();
    const drill = this.drill();
    return seed && drill ? generateFromCard(drill.card, seed) : null;
  });
  protected readonly shown = computed(() => {
    const fresh = this.fresh();
    if (fresh) return fresh.status === 'ready' ? fresh.drill : null;
    return this.drill()?.snapshot ?? null;
  });
  protected readonly changed = computed(() => {
    const drill = this.drill();
    return !!drill && (drill.title !== this.title().trim() || drill.notes !== this.notes().trim());
  });

  constructor() {
    effect(() => {
      const id = this.id();
      untracked(() => this.load(id));
    });
  }

  protected saveDetails(): void {
    const drill = this.drill();
    const title = this.title().trim();
    if (!drill || !title) return;
    this.api.update(drill.id, { title, notes: this.notes().trim() }).subscribe({
      next: (saved) => {
        this.drill.set(saved);
        this.snackBar.open('Saved.', undefined, { duration: 2500 });
      },
      error: (error: unknown) => this.snackBar.open(apiErrorMessage(error), 'Dismiss'),
    });
  }

  protected newSeed(): void {
    this.cursor.set(null);
    this.freshSeed.set(freshSeed());
  }

  protected backToSaved(): void {
    this.cursor.set(null);
    this.freshSeed.set(null);
  }

  /** Keep the fresh seed as a new saved drill on the same card. */
  protected saveFresh(): void {
    const drill = this.drill();
    const seed = this.freshSeed();
    if (!drill || !seed) return;
    this.api
      .save({
        ...(drill.ruleCardId === null ? {} : { ruleCardId: drill.ruleCardId }),
        title: `${drill.title} · ${seed}`,
        notes: drill.notes,
        card: drill.card,
        seed,
      })
      .subscribe({
        next: (saved) => {
          this.freshSeed.set(null);
          this.snackBar.open(`Saved "${saved.title}".`, undefined, { duration: 3000 });
          void this.router.navigate(['/saved-drills', saved.id]);
        },
        error: (error: unknown) => this.snackBar.open(apiErrorMessage(error), 'Dismiss'),
      });
  }

  protected remove(): void {
    const drill = this.drill();
    if (!drill) return;
    confirmAction(this.dialog, {
      title: `Delete "${drill.title}"?`,
      message:
        'The drill is deleted; anyone opening its seed link is told it was withdrawn. This cannot be undone.',
      confirm: 'Delete',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.api.remove(drill.id)),
      )
      .subscribe({
        next: () => {
          this.snackBar.open(`Deleted "${drill.title}".`, undefined, { duration: 3000 });
          void this.router.navigate(['/drills']);
        },
        error: (error: unknown) => this.snackBar.open(apiErrorMessage(error), 'Dismiss'),
      });
  }

  private load(id: string): void {
    this.drill.set(null);
    this.loadError.set(null);
    this.freshSeed.set(null);
    this.api.get(id).subscribe({
      next: (drill) => {
        this.drill.set(drill);
        this.title.set(drill.title);
        this.notes.set(drill.notes ?? '');
        this.link.set(drill.shareLink);
      },
      error: (error: unknown) => this.loadError.set(apiErrorMessage(error)),
    });
  }
}
