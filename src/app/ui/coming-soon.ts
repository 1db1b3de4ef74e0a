import { ChangeDetectionStrategy, Component, input } from '@angular/core';

import { EmptyState } from './empty-state';

/**
 * An honest page for an area not built yet: its name and purpose, and no sample data.
 * Inputs come from the route's `data` (router input binding).
 */
@Component({
  selector: 'tensile-coming-soon',
  imports: [EmptyState],
  template: `
    <section class="tensile-page">
      <h1>{{ heading() }}</h1>
      <tensile-empty-state [icon]="icon()" heading="Coming soon">{{
        purpose()
      }}</tensile-empty-state>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ComingSoon {
  readonly heading = input.required<string>();
  readonly purpose = input.required<string>();
  readonly icon = input('construction');
}
