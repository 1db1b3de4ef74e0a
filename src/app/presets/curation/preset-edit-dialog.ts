import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { PresetEdit, PresetLevel, PresetView } from '../presets-api';

/** The admin's edit of one preset: title, summary, level, tags, order and whether it is shown. */
@Component({
  selector: 'tensile-preset-edit-dialog',
  imports: [
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
  ],
  template: `
    <form #form="ngForm" (ngSubmit)="form.valid && save()">
      <h2 mat-dialog-title>Edit "{{ preset.title }}"</h2>
      <mat-dialog-content class="fields">
        <mat-form-field appearance="outline">
          <mat-label>Title</mat-label>
          <input matInput name="title" required maxlength="120" [(ngModel)]="title" />
          <mat-error>A preset needs a title.</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Summary</mat-label>
          <textarea
            matInput
            name="summary"
            rows="3"
            maxlength="2000"
            [(ngModel)]="summary"
          ></textarea>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Level</mat-label>
          <mat-select name="level" [(ngModel)]="level">
            <mat-option [value]="null">Not set</mat-option>
            <mat-option value="beginner">Beginner</mat-option>
            <mat-option value="intermediate">Intermediate</mat-option>
            <mat-option value="advanced">Advanced</mat-option>
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Tags (comma-separated)</mat-label>
          <input matInput name="tags" pattern="^[A-Za-z0-9 ,\\-]*$" [(ngModel)]="tags" />
          <mat-error>Tags use letters, digits, spaces and hyphens.</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Position in the gallery</mat-label>
          <input
            matInput
            name="position"
            type="number"
            min="0"
            max="100000"
            required
            [(ngModel)]="position"
          />
          <mat-error>A whole number from 0 (first).</mat-error>
        </mat-form-field>
        <mat-checkbox name="published" [(ngModel)]="published"
          >Published in the gallery</mat-checkbox
        >
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">Save preset</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .fields {
      display: grid;
      gap: 4px;
      min-width: min(460px, 80vw);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PresetEditDialog {
  protected readonly preset = inject<PresetView>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<PresetEditDialog, PresetEdit>>(MatDialogRef);
  protected title = this.preset.title;
  protected summary = this.preset.summary;
  protected level: PresetLevel | null = this.preset.level;
  protected tags = this.preset.tags.join(', ');
  protected position = this.preset.position;
  protected published = this.preset.published;

  protected save(): void {
    const title = this.title.trim();
    if (!title) return;
    this.ref.close({
      title,
      summary: this.summary.trim(),
      level: this.level,
      tags: [
        ...new Set(
          this.tags
            .split(',')
            .map((tag) => tag.trim().toLowerCase())
            .filter(Boolean),
        ),
      ],
      position: Math.trunc(Number(this.position)),
      published: this.published,
    });
  }
}
