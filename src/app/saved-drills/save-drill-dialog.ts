import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

export interface SaveDrillFields {
  readonly title: string;
  readonly notes: string;
}

/** Title and notes for a drill being kept; the title is required. */
@Component({
  selector: 'tensile-save-drill-dialog',
  imports: [FormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <form #form="ngForm" (ngSubmit)="form.valid && save()">
      <h2 mat-dialog-title>Save this drill</h2>
      <mat-dialog-content class="fields">
        <mat-form-field appearance="outline">
          <mat-label>Title</mat-label>
          <input
            matInput
            name="title"
            required
            maxlength="120"
            [(ngModel)]="title"
            cdkFocusInitial
          />
          <mat-error>Give the drill a title, e.g. "Week 3 groove".</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Notes</mat-label>
          <textarea matInput name="notes" rows="3" maxlength="2000" [(ngModel)]="notes"></textarea>
          <mat-hint>What to listen for, tempo steps… (optional)</mat-hint>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">Save drill</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .fields {
      display: grid;
      gap: 8px;
      min-width: min(420px, 80vw);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SaveDrillDialog {
  private readonly ref = inject<MatDialogRef<SaveDrillDialog, SaveDrillFields>>(MatDialogRef);
  private readonly initial = inject<Partial<SaveDrillFields> | null>(MAT_DIALOG_DATA, {
    optional: true,
  });
  protected title = this.initial?.title ?? '';
  protected notes = this.initial?.notes ?? '';

  protected save(): void {
    const title = this.title.trim();
    if (title) this.ref.close({ title, notes: this.notes.trim() });
  }
}
