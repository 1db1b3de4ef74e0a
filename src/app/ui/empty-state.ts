import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/** A calm placeholder for "nothing here yet": icon, heading, one sentence, optional actions. */
@Component({
  selector: 'tensile-empty-state',
  template: `
    <div class="empty-state" role="status">
      <span class="material-icons icon" aria-hidden="true">{{ icon() }}</span>
      <h2>{{ heading() }}</h2>
      <p><ng-content /></p>
      <div class="actions"><ng-content select="[emptyStateActions]" /></div>
    </div>
  `,
  styles: `
    .empty-state {
      display: grid;
      justify-items: center;
      text-align: center;
      gap: 8px;
      padding: 48px 16px;
      border: 1px dashed var(--tensile-rule);
      border-radius: var(--tensile-radius);
      background: var(--tensile-surface-raised);
    }
    .icon {
      font-size: 48px;
      color: var(--tensile-accent);
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-large);
    }
    p {
      margin: 0;
      max-width: 60ch;
      color: var(--tensile-ink-muted);
    }
    .actions {
      margin-top: 8px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EmptyState {
  readonly icon = input('inbox');
  readonly heading = input.required<string>();
}
