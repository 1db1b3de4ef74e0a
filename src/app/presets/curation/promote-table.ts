import { ChangeDetectionStrategy, Component, inject, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';

import { apiErrorWithDetails } from '../../rule-cards/api-details';
import type { CardLevel } from '../../rule-cards/rule-cards-api';
import { debounced } from '../../rule-cards/debounced';
import { inputText } from '../../rule-cards/input-text';
import { EmptyState } from '../../ui/empty-state';
import { LevelFilter } from '../../ui/level-filter';
import { ServerTable } from '../../ui/server-table';
import { CuratedPresetsApi, type PresetView, type PromotionCandidate } from '../presets-api';

/**
 * Teachers' rule cards for the admin (paged, sorted and searched on the server), each with
 * "Promote to preset": a credited copy, withdrawn until published.
 */
@Component({
  selector: 'tensile-promote-table',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    LevelFilter,
    MatSortModule,
    MatTableModule,
    EmptyState,
  ],
  templateUrl: './promote-table.html',
  styleUrl: './promote-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PromoteTable {
  private readonly api = inject(CuratedPresetsApi);
  private readonly snackBar = inject(MatSnackBar);

  /** A card became a preset. */
  readonly promoted = output<PresetView>();

  protected readonly columns = ['title', 'ownerName', 'meter', 'level', 'updatedAt', 'actions'];
  protected readonly q = signal('');
  protected readonly level = signal<CardLevel | ''>('');
  protected readonly busy = signal<number | null>(null);
  private readonly typedQ = debounced(this.q, 250);

  protected readonly table = new ServerTable<PromotionCandidate>({
    sort: { active: 'updatedAt', direction: 'desc' },
    pageSize: 10,
    filters: () => ({ q: this.typedQ().trim(), level: this.level() }),
    load: (query) => this.api.candidates(query),
  });

  protected search(event: Event): void {
    this.q.set(inputText(event));
    this.table.firstPage();
  }

  protected chooseLevel(level: CardLevel | ''): void {
    this.level.set(level);
    this.table.firstPage();
  }

  protected promote(card: PromotionCandidate): void {
    const id = Number(card.id);
    this.busy.set(id);
    this.api.promote(id).subscribe({
      next: (preset) => {
        this.busy.set(null);
        this.snackBar.open(
          `"${preset.title}" by ${card.ownerName} is a new preset, withdrawn until you publish it.`,
          undefined,
          { duration: 5000 },
        );
        this.promoted.emit(preset);
      },
      error: (error: unknown) => {
        this.busy.set(null);
        this.snackBar.open(apiErrorWithDetails(error), 'Dismiss');
      },
    });
  }
}
