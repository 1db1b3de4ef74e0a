import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  inject,
  linkedSignal,
  signal,
  viewChild,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { interval, map, of } from 'rxjs';

import { AuthSession } from '../core/auth-session';
import { SavedDrillsTable } from '../saved-drills/saved-drills-table';
import { loadStateSignal } from '../core/load-state';
import { meterLabel, subdivisionLabel } from '../rule-cards/card-labels';
import { RuleCardsApi } from '../rule-cards/rule-cards-api';
import { EmptyState } from '../ui/empty-state';
import { openedAtInFull, openedWhen } from './opened-when';
import { RecentDrills } from './recent-drills';
import { MAX_SEED_LENGTH, seedErrorState, seedProblem } from './seed-problem';
import { freshSeed } from './seed-words';

/** How often "5 minutes ago" is brought up to date while the page is open. */
const CLOCK_TICK_MS = 60_000;

/**
 * `/drills`: the drills this browser opened recently, each reopening exactly, and (for teachers)
 * a compact form to open a built-in rule card with a chosen or fresh seed.
 */
@Component({
  selector: 'tensile-drills-index',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
    EmptyState,
    SavedDrillsTable,
  ],
  templateUrl: './drills-index.html',
  styleUrl: './drills-index.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DrillsIndex {
  private readonly recent = inject(RecentDrills);
  private readonly router = inject(Router);
  private readonly session = inject(AuthSession);
  private readonly injector = inject(Injector);
  private readonly clearButton = viewChild('clearButton', { read: ElementRef<HTMLElement> });
  private readonly keepButton = viewChild('keepButton', { read: ElementRef<HTMLElement> });
  private readonly recentHeading = viewChild<ElementRef<HTMLElement>>('recentHeading');

  /** Teachers (and admins) pick cards and seeds; students reopen what they were given. */
  protected readonly canChooseSeed = computed(() => {
    const role = this.session.role();
    return role === 'teacher' || role === 'admin';
  });
  /** Saved drills belong to teachers. */
  protected readonly isTeacher = computed(() => this.session.role() === 'teacher');
  // Only people who may pick a card ask for the list; the role cannot change on this page.
  protected readonly cards = loadStateSignal(
    this.canChooseSeed() ? inject(RuleCardsApi).builtInCards() : of([]),
  );
  protected readonly cardOptions = computed(() => {
    const cards = this.cards();
    if (cards.status !== 'ready') return [];
    return cards.value.map((card) => ({
      id: card.id,
      title: card.title,
      feel: `${meterLabel(card.meter)} · ${subdivisionLabel(card.subdivision, card.meter)}`,
    }));
  });
  protected readonly cardsError = computed(() => {
    const cards = this.cards();
    return cards.status === 'error' ? cards.message : null;
  });

  private readonly now = toSignal(interval(CLOCK_TICK_MS).pipe(map(() => Date.now())), {
    initialValue: Date.now(),
  });
  protected readonly entries = computed(() => {
    const now = this.now();
    return this.recent.entries().map((entry) => ({
      ...entry,
      when: openedWhen(entry.openedAt, now),
      whenInFull: openedAtInFull(entry.openedAt),
    }));
  });

  /** The card last opened, if it is still offered; else the first card. */
  protected readonly cardId = linkedSignal<string | null>(() => {
    const ids = this.cardOptions().map((card) => card.id);
    const last = this.recent.entries()[0]?.cardId;
    return last && ids.includes(last) ? last : (ids[0] ?? null);
  });
  protected readonly seedDraft = signal(freshSeed());
  protected readonly seedProblem = computed(() => seedProblem(this.seedDraft()));
  protected readonly seedErrors = seedErrorState(this.seedProblem);
  protected readonly maxSeedLength = MAX_SEED_LENGTH;
  protected readonly confirmingClear = signal(false);
  /** What "Clear …" would remove, for the confirmation question. */
  protected readonly clearScope = computed(() => {
    const count = this.recent.entries().length;
    return count === 1 ? 'the recent drill' : `all ${count} recent drills`;
  });

  /** Open the chosen card's drill for the typed seed. */
  protected openDrill(): void {
    const cardId = this.cardId();
    const seed = this.seedDraft().trim();
    if (cardId === null || seedProblem(seed) !== null) return;
    void this.router.navigate(['/drills', cardId], { queryParams: { seed } });
  }

  /** Fill the seed field with a fresh seed. */
  protected newSeed(): void {
    this.seedDraft.set(freshSeed());
  }

  /** Clearing is not undoable, so it asks first (focus moves to the safe answer). */
  protected askToClear(): void {
    this.confirmingClear.set(true);
    this.focusAfterRender(() => this.keepButton());
  }

  protected keepRecent(): void {
    this.confirmingClear.set(false);
    this.focusAfterRender(() => this.clearButton());
  }

  protected clearRecent(): void {
    this.recent.clear();
    this.confirmingClear.set(false);
    this.focusAfterRender(() => this.recentHeading());
  }

  private focusAfterRender(target: () => ElementRef<HTMLElement> | undefined): void {
    afterNextRender(() => target()?.nativeElement.focus(), { injector: this.injector });
  }
}
