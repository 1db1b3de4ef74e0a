import { ChangeDetectionStrategy, Component, Signal, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import { LoadState, loadStateSignal } from '../core/load-state';
import { builtInCardItems } from '../rule-cards/built-in-card-items';
import { BuiltInCard, RuleCardsApi } from '../rule-cards/rule-cards-api';
import { EmptyState } from '../ui/empty-state';
import { RuleCardList, RuleCardListItem } from '../ui/rule-card-list';

/**
 * The student's home. Assignments from a teacher are not part of this release, so the page says so
 * plainly and offers the built-in rule cards to practise read-only meanwhile.
 */
@Component({
  selector: 'tensile-assignments',
  imports: [MatProgressBarModule, RouterLink, EmptyState, RuleCardList],
  templateUrl: './assignments.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Assignments {
  private readonly api = inject(RuleCardsApi);
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
