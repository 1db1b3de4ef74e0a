import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  viewChild,
  type ElementRef,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { filter, switchMap, type Observer } from 'rxjs';
import { CardFilters } from '../ui/card-filters';
import { confirmAction } from '../ui/confirm-dialog';
import { EmptyState } from '../ui/empty-state';
import { ServerTable } from '../ui/server-table';
import { apiErrorWithDetails } from './api-details';
import { debounced } from './debounced';
import { downloadJson, readJsonFile } from './json-file';
import { TeacherCardsApi, type CardLevel, type RuleCardSummary } from './rule-cards-api';
import { inputText } from './input-text';
import { TitleDialog, type TitleDialogData } from './title-dialog';

const FILTER_DEBOUNCE_MS = 250;

/**
 * The teacher's own rule cards: a server-side table with sort, filters and paging, and every
 * card action (open, rename, duplicate, export, delete or archive) plus new and import.
 */
@Component({
  selector: 'tensile-card-table',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
    EmptyState,
    CardFilters,
  ],
  templateUrl: './card-table.html',
  styleUrl: './card-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CardTable {
  private readonly api = inject(TeacherCardsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly fileInput = viewChild<ElementRef<HTMLInputElement>>('importFile');

  protected readonly columns = [
    'title',
    'level',
    'meter',
    'subdivision',
    'bars',
    'tempo',
    'tags',
    'drillCount',
    'updatedAt',
    'actions',
  ];
  protected readonly q = signal('');
  protected readonly tag = signal('');
  protected readonly level = signal<CardLevel | ''>('');
  protected readonly meter = signal('');
  protected readonly subdivision = signal<number | ''>('');
  protected readonly archived = signal(false);

  private readonly typedQ = debounced(this.q, FILTER_DEBOUNCE_MS);
  private readonly typedTag = debounced(this.tag, FILTER_DEBOUNCE_MS);
  private readonly typedMeter = debounced(this.meter, FILTER_DEBOUNCE_MS);

  protected readonly table = new ServerTable<RuleCardSummary>({
    sort: { active: 'updatedAt', direction: 'desc' },
    pageSize: 20,
    filters: () => ({
      q: this.typedQ().trim(),
      tag: this.typedTag().trim(),
      level: this.level(),
      meter: this.typedMeter().trim(),
      subdivision: this.subdivision(),
      archived: this.archived() ? true : '',
    }),
    load: (query) => this.api.list(query),
  });
  protected readonly filtered = computed(
    () => !!(this.q() || this.tag() || this.level() || this.meter() || this.subdivision() !== ''),
  );

  /** Any filter change starts again from the first page. */
  protected setFilter<T>(target: { set(value: T): void }, value: T): void {
    target.set(value);
    this.table.firstPage();
  }

  protected textFilter(target: { set(value: string): void }, event: Event): void {
    this.setFilter(target, inputText(event));
  }

  protected clearFilters(): void {
    this.q.set('');
    this.tag.set('');
    this.level.set('');
    this.meter.set('');
    this.subdivision.set('');
    this.table.firstPage();
  }

  protected rename(card: RuleCardSummary): void {
    this.dialog
      .open<TitleDialog, TitleDialogData, string>(TitleDialog, {
        data: { heading: 'Rename the card', title: card.title, confirm: 'Rename' },
      })
      .afterClosed()
      .pipe(
        filter((title): title is string => !!title && title !== card.title),
        switchMap((title) => this.api.update(card.id, { title })),
      )
      .subscribe(this.done((saved) => `Renamed to "${saved.title}".`));
  }

  protected duplicate(card: RuleCardSummary): void {
    this.api.duplicate(card.id).subscribe(this.done((copy) => `Made "${copy.title}".`));
  }

  protected remove(card: RuleCardSummary): void {
    const inUse = card.drillCount > 0;
    confirmAction(this.dialog, {
      title: `Delete "${card.title}"?`,
      message: inUse
        ? `Saved drills use this card (${card.drillCount}), so it is archived rather than destroyed: the drills keep working and the card leaves this list.`
        : 'The card is destroyed. This cannot be undone.',
      confirm: inUse ? 'Archive' : 'Delete',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.api.remove(card.id)),
      )
      .subscribe(
        this.done((archived) =>
          archived
            ? `"${card.title}" is archived: saved drills still use it.`
            : `Deleted "${card.title}".`,
        ),
      );
  }

  protected exportCard(card: RuleCardSummary): void {
    this.api.export(card.id).subscribe({
      next: (envelope) => downloadJson(envelope, card.title),
      error: (error: unknown) => this.failed(error),
    });
  }

  protected chooseImport(): void {
    this.fileInput()?.nativeElement.click();
  }

  protected imported(input: HTMLInputElement): void {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    readJsonFile(file)
      .pipe(switchMap((envelope) => this.api.import(envelope)))
      .subscribe(this.done((card) => `Imported "${card.title}".`));
  }

  private done<T>(message: (value: T) => string): Partial<Observer<T>> {
    return {
      next: (value) => {
        this.snackBar.open(message(value), undefined, { duration: 4000 });
        this.table.reload();
      },
      error: (error: unknown) => this.failed(error),
    };
  }

  private failed(error: unknown): void {
    this.snackBar.open(apiErrorWithDetails(error), 'Dismiss');
  }
}
