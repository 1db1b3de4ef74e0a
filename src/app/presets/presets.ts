import { ChangeDetectionStrategy, Component, Signal, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import { LoadState, loadStateSignal } from '../core/load-state';
import { meterLabel, subdivisionLabel } from '../rule-cards/card-labels';
import { freshSeedWord } from '../rule-cards/seed-word';
import { EmptyState } from '../ui/empty-state';
import { RuleCardList, RuleCardListItem } from '../ui/rule-card-list';
import { PresetSummary, PresetsApi } from './presets-api';

/** The admin's home: the presets every teacher is offered. */
@Component({
  selector: 'tensile-presets',
  imports: [MatProgressBarModule, EmptyState, RuleCardList],
  template: `
    <section class="tensile-page" aria-labelledby="presets-heading">
      <h1 id="presets-heading">Presets</h1>
      <p class="tensile-lede">
        Presets are rule cards offered to every teacher. These are the built-in ones shipped with
        Tensile; open one to check the drills it makes.
      </p>
      @switch (state().status) {
        @case ('loading') {
          <mat-progress-bar mode="indeterminate" aria-label="Loading presets" />
        }
        @case ('error') {
          <tensile-empty-state icon="cloud_off" heading="Presets could not load">
            {{ errorMessage() }}
          </tensile-empty-state>
        }
        @default {
          @if (items().length) {
            <tensile-rule-card-list [cards]="items()" actionLabel="Try a drill" />
          } @else {
            <tensile-empty-state icon="library_music" heading="No presets yet">
              No built-in rule cards are installed on this server.
            </tensile-empty-state>
          }
        }
      }
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Presets {
  private readonly api = inject(PresetsApi);
  protected readonly state: Signal<LoadState<readonly PresetSummary[]>> = loadStateSignal(
    this.api.list(),
  );
  protected readonly items = computed<readonly RuleCardListItem[]>(() => {
    const state = this.state();
    if (state.status !== 'ready') return [];
    return state.value.map((preset) => ({
      id: preset.id,
      title: preset.title,
      summary: preset.summary,
      meter: meterLabel(preset.meter),
      subdivision: subdivisionLabel(preset.subdivision, preset.meter),
      link: { path: ['/drills', preset.id], queryParams: { seed: freshSeedWord() } },
    }));
  });
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : null;
  });
}
