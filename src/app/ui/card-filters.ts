import { ChangeDetectionStrategy, Component, input, model, output } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { subdivisionLabel } from '../rule-cards/card-labels';
import { inputText } from '../rule-cards/input-text';
import { LevelFilter, type LevelChoice } from './level-filter';

/**
 * The filters a list of rule cards offers (tag, level, meter, subdivision), bound two ways;
 * a list's own filters go in before them (`filtersFirst`) or after them (the rest).
 */
@Component({
  selector: 'tensile-card-filters',
  imports: [MatFormFieldModule, MatInputModule, MatSelectModule, LevelFilter],
  template: `
    <ng-content select="[filtersFirst]" />
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Tag</mat-label>
      <input matInput [value]="tag()" (input)="set(tag, inputText($event))" />
    </mat-form-field>
    <tensile-level-filter [level]="level()" (levelChange)="set(level, $event)" />
    <mat-form-field appearance="outline" subscriptSizing="dynamic" class="narrow">
      <mat-label>Meter</mat-label>
      <input matInput placeholder="7/8" [value]="meter()" (input)="set(meter, inputText($event))" />
    </mat-form-field>
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Subdivision</mat-label>
      <mat-select [value]="subdivision()" (selectionChange)="set(subdivision, $event.value)">
        <mat-option value="">Any</mat-option>
        @for (slots of slotChoices; track slots) {
          <mat-option [value]="slots">{{ subdivisionWords(slots) }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
    <ng-content />
  `,
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 12px;
      align-items: center;
    }
    .narrow {
      width: 110px;
    }
  `,
  host: { role: 'search', '[attr.aria-label]': 'label()' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CardFilters {
  readonly label = input.required<string>();
  readonly tag = model('');
  readonly level = model<LevelChoice>('');
  readonly meter = model('');
  readonly subdivision = model<number | ''>('');
  /** The teacher changed a filter here (a paged list goes back to its first page). */
  readonly changed = output<void>();

  protected readonly slotChoices = [1, 2, 3, 4, 5, 6, 7, 8];
  protected readonly inputText = inputText;

  protected subdivisionWords(slots: number): string {
    return subdivisionLabel(slots);
  }

  protected set<T>(target: { set(value: T): void }, value: T): void {
    target.set(value);
    this.changed.emit();
  }
}
