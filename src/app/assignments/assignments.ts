import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, Signal, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import { LoadState, loadStateSignal } from '../core/load-state';
import {
  PracticeApi,
  STATUS_LABEL,
  type AssignmentStatus,
  type MyAssignment,
} from '../practice/practice-api';
import { builtInCardItems } from '../rule-cards/built-in-card-items';
import { BuiltInCard, RuleCardsApi } from '../rule-cards/rule-cards-api';
import { EmptyState } from '../ui/empty-state';
import { RuleCardList, RuleCardListItem } from '../ui/rule-card-list';

/**
 * The student's home: their assignments, due soonest first, with target and best tempo; below,
 * the built-in rule cards to practise read-only.
 */
@Component({
  selector: 'tensile-assignments',
  imports: [DatePipe, MatProgressBarModule, MatTableModule, RouterLink, EmptyState, RuleCardList],
  templateUrl: './assignments.html',
  styleUrl: './assignments.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Assignments {
  private readonly api = inject(RuleCardsApi);
  protected readonly mine: Signal<LoadState<readonly MyAssignment[]>> = loadStateSignal(
    inject(PracticeApi).myAssignments(),
  );
  protected readonly statusLabel = STATUS_LABEL;

  protected statusText(status: AssignmentStatus): string {
    return STATUS_LABEL[status];
  }
  protected readonly columns = ['title', 'due', 'target', 'best', 'status'];
  protected readonly cards: Signal<LoadState<readonly BuiltInCard[]>> = loadStateSignal(
    this.api.builtInCards(),
  );
  protected readonly items = computed<readonly RuleCardListItem[]>(() => {
    const state = this.cards();
    return state.status === 'ready' ? builtInCardItems(state.value) : [];
  });
  protected readonly errorMessage = computed(() => {
    const state = this.cards();
    return state.status === 'error' ? state.message : null;
  });
}
