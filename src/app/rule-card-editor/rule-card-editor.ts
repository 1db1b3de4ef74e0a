import { COMMA, ENTER } from '@angular/cdk/keycodes';
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
import { MatChipsModule, type MatChipInputEvent } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router } from '@angular/router';
import { Observable, of, switchMap } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { TeacherCardsApi, type CardLevel } from '../rule-cards/rule-cards-api';
import { SaveDrillDialog, type SaveDrillFields } from '../saved-drills/save-drill-dialog';
import { SavedDrillsApi } from '../saved-drills/saved-drills-api';
import { confirmAction } from '../ui/confirm-dialog';
import { CardBasics } from './card-basics';
import { CardEditorStore } from './card-editor-store';
import { blankCard, type CardDraft } from './card-draft';
import { CardPreview } from './card-preview';
import { OstinatoGrid } from './ostinato-grid';
import { RuleList } from './rule-list';
import { VoiceSetup } from './voice-setup';

/** Tags a teacher reaches for most; any other word may be typed. */
export const SUGGESTED_TAGS = [
  'polyrhythm',
  'odd subdivision',
  'displacement',
  'linear',
  'release',
];

/**
 * `/rule-cards/new` and `/rule-cards/:id`: the teacher's main screen. The form on the left writes
 * the card; the preview on the right regenerates as they pause. Undo and redo cover the session.
 */
@Component({
  selector: 'tensile-rule-card-editor',
  imports: [
    FormsModule,
    MatButtonModule,
    MatChipsModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTooltipModule,
    CardBasics,
    CardPreview,
    OstinatoGrid,
    RuleList,
    VoiceSetup,
  ],
  providers: [CardEditorStore],
  templateUrl: './rule-card-editor.html',
  styleUrl: './rule-card-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    '(keydown)': 'shortcut($event)',
    '(window:beforeunload)': 'beforeUnload($event)',
  },
})
export class RuleCardEditor {
  /** Route parameter: a card id, or absent for a new card. */
  readonly id = input<string>();

  protected readonly store = inject(CardEditorStore);
  private readonly api = inject(TeacherCardsApi);
  private readonly drills = inject(SavedDrillsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly separators = [ENTER, COMMA];
  protected readonly suggestedTags = SUGGESTED_TAGS;
  protected readonly loading = signal(false);
  protected readonly loadError = signal<string | null>(null);
  protected readonly saving = signal(false);
  protected readonly title = computed(() => this.store.meta().title);
  protected readonly tags = computed(() => this.store.meta().tags);
  protected readonly level = computed(() => this.store.meta().level);
  protected readonly titleProblem = computed(() =>
    this.title().trim() === '' ? 'Give the card a title.' : null,
  );
  protected readonly titleErrors = { isErrorState: () => this.titleProblem() !== null };
  protected readonly dirty = this.store.dirty;
  protected readonly cardInvalid = computed(() => this.store.outcome()?.status === 'invalid');

  constructor() {
    effect(() => {
      const id = this.id();
      untracked(() => this.open(id));
    });
  }

  /** Whether it is fine to leave: asks first when there are unsaved changes. */
  canLeave(): Observable<boolean> {
    if (!this.dirty()) return of(true);
    return confirmAction(this.dialog, {
      title: 'Leave without saving?',
      message: 'This rule card has changes that are not saved. Leaving now drops them.',
      confirm: 'Leave without saving',
      cancel: 'Stay',
    });
  }

  protected beforeUnload(event: BeforeUnloadEvent): void {
    if (this.dirty()) event.preventDefault();
  }

  protected shortcut(event: KeyboardEvent): void {
    if (!(event.ctrlKey || event.metaKey) || event.key.toLowerCase() !== 'z') return;
    const target = event.target as HTMLElement | null;
    // Text fields keep their own undo; the card's undo works everywhere else.
    if (target?.matches('input[type=text], input:not([type]), textarea')) return;
    event.preventDefault();
    if (event.shiftKey) this.store.redo();
    else this.store.undo();
  }

  protected setTitle(title: string): void {
    this.store.editMeta({ title }, 'title');
  }

  protected setLevel(level: CardLevel | null): void {
    this.store.editMeta({ level });
  }

  protected addTag(event: MatChipInputEvent): void {
    const tag = event.value.trim().toLowerCase();
    if (tag && !this.tags().includes(tag)) this.store.editMeta({ tags: [...this.tags(), tag] });
    event.chipInput.clear();
  }

  protected toggleTag(tag: string): void {
    const tags = this.tags();
    this.store.editMeta({
      tags: tags.includes(tag) ? tags.filter((t) => t !== tag) : [...tags, tag],
    });
  }

  protected removeTag(tag: string): void {
    this.store.editMeta({ tags: this.tags().filter((t) => t !== tag) });
  }

  protected save(): void {
    if (this.titleProblem() !== null || this.saving()) return;
    const id = this.id();
    const body = {
      title: this.title().trim(),
      card: this.store.card(),
      tags: this.tags(),
      level: this.level(),
    };
    this.saving.set(true);
    const request = id === undefined ? this.api.create(body) : this.api.update(id, body);
    request.subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.store.markSaved();
        this.snackBar.open(`Saved "${saved.title}".`, undefined, { duration: 3000 });
        if (id === undefined) {
          void this.router.navigate(['/rule-cards', saved.id], { replaceUrl: true });
        }
      },
      error: (error: unknown) => {
        this.saving.set(false);
        this.snackBar.open(`Not saved: ${apiErrorMessage(error)}`, 'Dismiss');
      },
    });
  }

  /** Keep the drill now in the preview as a saved drill (the card is saved first if it is new). */
  protected saveDrill(): void {
    const drill = this.store.lastGood();
    if (drill === null || this.store.stale()) return;
    const seed = this.store.seed();
    const card = this.store.card();
    const keep = this.store.pinned();
    this.dialog
      .open<SaveDrillDialog, Partial<SaveDrillFields>, SaveDrillFields>(SaveDrillDialog, {
        data: { title: `${this.title().trim()} · ${seed}` },
      })
      .afterClosed()
      .pipe(
        switchMap((fields) => {
          if (!fields) return of(null);
          const id = this.id();
          return this.drills.save({
            ...(id === undefined ? {} : { ruleCardId: Number(id) }),
            title: fields.title,
            notes: fields.notes,
            card,
            seed,
            ...(keep.length ? { keep } : {}),
          });
        }),
      )
      .subscribe({
        next: (saved) => {
          if (!saved) return;
          this.snackBar
            .open(`Drill "${saved.title}" saved.`, 'Open', { duration: 5000 })
            .onAction()
            .subscribe(() => void this.router.navigate(['/saved-drills', saved.id]));
        },
        error: (error: unknown) =>
          this.snackBar.open(`The drill was not saved: ${apiErrorMessage(error)}`, 'Dismiss'),
      });
  }

  private open(id: string | undefined): void {
    this.loadError.set(null);
    if (id === undefined) {
      this.applyLoaded('Untitled card', [], null, blankCard());
      return;
    }
    this.loading.set(true);
    this.api.get(id).subscribe({
      next: (detail) => {
        this.loading.set(false);
        this.applyLoaded(detail.title, detail.tags, detail.level, detail.card as CardDraft);
      },
      error: (error: unknown) => {
        this.loading.set(false);
        this.loadError.set(apiErrorMessage(error));
      },
    });
  }

  private applyLoaded(
    title: string,
    tags: readonly string[],
    level: CardLevel | null,
    card: CardDraft,
  ): void {
    this.store.load(card, { title, tags: [...tags], level });
  }
}
