import { ChangeDetectionStrategy, Component, model } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';

export type LevelChoice = 'beginner' | 'intermediate' | 'advanced' | '';

/** A list's "Level" filter: any level, or one of the three a card or preset is marked with. */
@Component({
  selector: 'tensile-level-filter',
  imports: [MatFormFieldModule, MatSelectModule],
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Level</mat-label>
      <mat-select [value]="level()" (selectionChange)="level.set($event.value)">
        <mat-option value="">Any level</mat-option>
        <mat-option value="beginner">Beginner</mat-option>
        <mat-option value="intermediate">Intermediate</mat-option>
        <mat-option value="advanced">Advanced</mat-option>
      </mat-select>
    </mat-form-field>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LevelFilter {
  readonly level = model<LevelChoice>('');
}
