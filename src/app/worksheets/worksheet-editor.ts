import { LiveAnnouncer } from '@angular/cdk/a11y';
import { CdkDrag, CdkDragHandle, CdkDropList, type CdkDragDrop } from '@angular/cdk/drag-drop';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  inject,
  input,
  signal,
  type OnInit,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { of, type Observable } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { apiErrorWithDetails } from '../rule-cards/api-details';
import { inputText } from '../rule-cards/input-text';
import { PdfDownloadButton } from '../pdf/pdf-download-button';
import type { LeavesSafely } from '../rule-card-editor/leave-guard';
import { confirmAction } from '../ui/confirm-dialog';
import { ItemPicker, type PickedItem } from './item-picker';
import { defaultLadder, ladderProblem, moveItem, rungs, type EditorItem } from './worksheet-items';
import {
  WorksheetsApi,
  type Aids,
  type Ladder,
  type Paper,
  type Worksheet,
  type WorksheetInput,
} from './worksheets-api';

/**
 * One worksheet: title, notes, paper, and its drills in order, each with a tempo ladder and the
 * aids to print. Drills are reordered by dragging, by the arrow keys on a drill's handle or by
 * its move buttons; every move is announced with the drill's new position.
 */
@Component({
  selector: 'tensile-worksheet-editor',
  imports: [
    CdkDrag,
    CdkDragHandle,
    CdkDropList,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    PdfDownloadButton,
    RouterLink,
  ],
  templateUrl: './worksheet-editor.html',
  styleUrl: './worksheet-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(window:beforeunload)': 'beforeUnload($event)' },
})
export class WorksheetEditor implements OnInit, LeavesSafely {
  /** Route parameter: the worksheet's id, absent for a new one. */
  readonly id = input<string>();

  private readonly api = inject(WorksheetsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);

  protected readonly loading = signal(false);
  protected readonly loadError = signal<string | null>(null);
  protected readonly saving = signal(false);
  protected readonly title = signal('');
  protected readonly notes = signal('');
  protected readonly paper = signal<Paper>('a4');
  protected readonly items = signal<readonly EditorItem[]>([]);
  private readonly savedAs = signal('');
  private nextKey = 1;

  private readonly input = computed<WorksheetInput>(() => ({
    title: this.title().trim(),
    notes: this.notes(),
    paper: this.paper(),
    items: this.items().map(({ source, ladder, aids }) => ({ source, ladder, aids })),
  }));
  protected readonly dirty = computed(() => JSON.stringify(this.input()) !== this.savedAs());
  protected readonly valid = computed(
    () => !!this.input().title && this.items().every((item) => !ladderProblem(item.ladder)),
  );
  protected readonly isNew = computed(() => !this.id());
  /** The saved worksheet's PDF on the chosen paper (what is saved, not unsaved edits). */
  protected readonly pdfUrl = computed(() => this.api.pdfUrl(this.id() ?? '', this.paper()));

  protected readonly inputText = inputText;
  protected readonly ladderProblem = ladderProblem;
  protected readonly rungs = rungs;

  ngOnInit(): void {
    const id = this.id();
    if (!id) {
      this.savedAs.set(JSON.stringify(this.input()));
      return;
    }
    this.loading.set(true);
    this.api.get(id).subscribe({
      next: (sheet) => {
        this.show(sheet);
        this.loading.set(false);
      },
      error: (error: unknown) => {
        this.loadError.set(apiErrorMessage(error));
        this.loading.set(false);
      },
    });
  }

  canLeave(): Observable<boolean> {
    if (!this.dirty() || this.loadError()) return of(true);
    return confirmAction(this.dialog, {
      title: 'Leave without saving?',
      message: 'This worksheet has changes that are not saved. Leaving now drops them.',
      confirm: 'Leave without saving',
      cancel: 'Stay',
    });
  }

  protected beforeUnload(event: BeforeUnloadEvent): void {
    if (this.dirty()) event.preventDefault();
  }

  protected addItem(): void {
    this.dialog
      .open<ItemPicker, void, PickedItem>(ItemPicker, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((picked) => {
        if (!picked) return;
        const item: EditorItem = {
          key: this.nextKey++,
          source: picked.source,
          title: picked.title,
          tempo: picked.tempo,
          problem: null,
          ladder: defaultLadder(picked.tempo),
          aids: { sticking: true, counts: true, tension: true },
        };
        this.items.update((items) => [...items, item]);
        this.announcer.announce(
          `Added "${picked.title}" as drill ${this.items().length} of ${this.items().length}.`,
        );
      });
  }

  protected removeItem(index: number): void {
    const item = this.items()[index];
    if (!item) return;
    this.items.update((items) => items.filter((_, i) => i !== index));
    this.announcer.announce(`Removed "${item.title}" from the worksheet.`);
  }

  protected dropped(event: CdkDragDrop<unknown>): void {
    this.move(event.previousIndex, event.currentIndex);
  }

  /** Up and down arrows on a drill's handle move it, keeping the focus on that handle. */
  protected keyMove(event: KeyboardEvent, index: number): void {
    const to =
      event.key === 'ArrowUp' ? index - 1 : event.key === 'ArrowDown' ? index + 1 : undefined;
    if (to === undefined) return;
    event.preventDefault();
    this.move(index, to, 'handle');
  }

  protected move(from: number, to: number, keepFocusOn?: 'handle'): void {
    const items = this.items();
    const item = items[from];
    if (!item || to < 0 || to >= items.length || to === from) return;
    this.items.set(moveItem(items, from, to));
    this.announcer.announce(`"${item.title}" moved to position ${to + 1} of ${items.length}.`);
    if (keepFocusOn) {
      // The row's node moves in the list, which drops the focus; put it back on the handle.
      afterNextRender(
        () =>
          this.host.nativeElement
            .querySelector<HTMLElement>(`[data-key="${item.key}"] .handle`)
            ?.focus(),
        { injector: this.injector },
      );
    }
  }

  protected setLadder(index: number, field: keyof Ladder, event: Event): void {
    const value = Number(inputText(event));
    this.updateItem(index, (item) => ({ ...item, ladder: { ...item.ladder, [field]: value } }));
  }

  protected setAid(index: number, aid: keyof Aids, on: boolean): void {
    this.updateItem(index, (item) => ({ ...item, aids: { ...item.aids, [aid]: on } }));
  }

  protected save(): void {
    if (!this.valid() || this.saving()) return;
    const input = this.input();
    const id = this.id();
    this.saving.set(true);
    const request = id ? this.api.update(id, input) : this.api.create(input);
    request.subscribe({
      next: (sheet) => {
        this.saving.set(false);
        this.show(sheet);
        this.snackBar.open(`Saved "${sheet.title}".`, undefined, { duration: 4000 });
        if (!id) void this.router.navigate(['/worksheets', sheet.id], { replaceUrl: true });
      },
      error: (error: unknown) => {
        this.saving.set(false);
        this.snackBar.open(apiErrorWithDetails(error), 'Dismiss');
      },
    });
  }

  private updateItem(index: number, change: (item: EditorItem) => EditorItem): void {
    this.items.update((items) => items.map((item, i) => (i === index ? change(item) : item)));
  }

  private show(sheet: Worksheet): void {
    this.title.set(sheet.title);
    this.notes.set(sheet.notes);
    this.paper.set(sheet.paper);
    this.items.set(
      sheet.items.map((item) => ({
        key: this.nextKey++,
        source: item.source,
        title: item.title,
        tempo: item.tempo,
        problem: item.problem,
        ladder: item.ladder,
        aids: item.aids,
      })),
    );
    this.savedAs.set(JSON.stringify(this.input()));
  }
}
