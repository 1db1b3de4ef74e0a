import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

export interface TitleDialogData {
  readonly heading: string;
  readonly title: string;
  readonly confirm: string;
}

/** Asks for a title (rename a card); answers the trimmed title, or nothing when cancelled. */
@Component({
  selector: 'tensile-title-dialog',
  imports: [FormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <form #form="ngForm" (ngSubmit)="done()">
      <h2 mat-dialog-title>{{ data.heading }}</h2>
      <mat-dialog-content>
        <mat-form-field appearance="outline" class="field">
          <mat-label>Title</mat-label>
          <input
            matInput
            name="title"
            required
            maxlength="120"
            [(ngModel)]="title"
            cdkFocusInitial
          />
          <mat-error>A card needs a title.</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">{{ data.confirm }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .field {
      min-width: min(380px, 80vw);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TitleDialog {
  protected readonly data = inject<TitleDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<TitleDialog, string>>(MatDialogRef);
  protected title = this.data.title;

  protected done(): void {
    const title = this.title.trim();
    if (title) this.ref.close(title);
  }
}
