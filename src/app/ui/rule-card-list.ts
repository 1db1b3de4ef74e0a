import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { RouterLink } from '@angular/router';

/** One rule card as a list shows it: words only, already formatted by the feature. */
export interface RuleCardListItem {
  readonly id: string;
  readonly title: string;
  readonly summary: string;
  readonly meter: string;
  readonly subdivision: string;
  /** Where the card's action goes (e.g. a drill link with a fresh seed); none = no action. */
  readonly link?: {
    readonly path: readonly string[];
    readonly queryParams?: Record<string, string>;
  };
}

/** A responsive grid of rule cards with an optional "Open drill"-style action on each. */
@Component({
  selector: 'tensile-rule-card-list',
  imports: [MatCardModule, MatButtonModule, RouterLink],
  template: `
    <ul class="grid" role="list">
      @for (card of cards(); track card.id) {
        <li>
          <mat-card appearance="outlined" class="card">
            <mat-card-header>
              <mat-card-title>
                <h3 class="title">{{ card.title }}</h3>
              </mat-card-title>
              <mat-card-subtitle>
                <span class="meta"
                  ><span class="tensile-visually-hidden">Meter </span>{{ card.meter }}</span
                >
                <span aria-hidden="true"> · </span>
                <span class="meta"
                  ><span class="tensile-visually-hidden">, subdivision </span
                  >{{ card.subdivision }}</span
                >
              </mat-card-subtitle>
            </mat-card-header>
            <mat-card-content>
              <p class="summary">{{ card.summary }}</p>
            </mat-card-content>
            @if (card.link; as link) {
              <mat-card-actions align="end">
                <a
                  mat-flat-button
                  [routerLink]="link.path"
                  [queryParams]="link.queryParams"
                  [attr.aria-label]="actionLabel() + ': ' + card.title"
                  >{{ actionLabel() }}</a
                >
              </mat-card-actions>
            }
          </mat-card>
        </li>
      }
    </ul>
  `,
  styles: `
    .grid {
      list-style: none;
      margin: 0;
      padding: 0;
      display: grid;
      gap: 16px;
      grid-template-columns: repeat(auto-fill, minmax(280px, 1fr));
    }
    .card {
      height: 100%;
      display: flex;
      flex-direction: column;
    }
    .title {
      margin: 0;
      font: inherit;
    }
    .summary {
      margin: 8px 0 0;
      color: var(--tensile-ink-muted);
      display: -webkit-box;
      -webkit-line-clamp: 2;
      -webkit-box-orient: vertical;
      overflow: hidden;
    }
    mat-card-content {
      flex: 1;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RuleCardList {
  readonly cards = input.required<readonly RuleCardListItem[]>();
  readonly actionLabel = input('Open drill');
}
