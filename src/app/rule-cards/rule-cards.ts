import { ChangeDetectionStrategy, Component, Signal, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import { LoadState, loadStateSignal } from '../core/load-state';
import { EmptyState } from '../ui/empty-state';
import { RuleCardList, RuleCardListItem } from '../ui/rule-card-list';
import { CardTable } from './card-table';
import { builtInCardItems } from './built-in-card-items';
import { BuiltInCard, RuleCardsApi } from './rule-cards-api';

/** The teacher's home: their own rule cards (a table), then the built-in ones, each opening a fresh drill. */
@Component({
  selector: 'tensile-rule-cards',
  imports: [MatProgressBarModule, CardTable, EmptyState, RuleCardList],
  templateUrl: './rule-cards.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RuleCards {
  private readonly api = inject(RuleCardsApi);
  protected readonly state: Signal<LoadState<readonly BuiltInCard[]>> = loadStateSignal(
    this.api.builtInCards(),
  );
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : null;
  });
  protected readonly items = computed<readonly RuleCardListItem[]>(() => {
    const state = this.state();
    return state.status === 'ready' ? builtInCardItems(state.value) : [];
  });
}
