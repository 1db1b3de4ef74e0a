import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../../core/api-error-message';
import { AccountLinksApi } from '../account-links-api';

/** `/forgot-password`: ask for a reset link; the answer never says whether the address exists. */
@Component({
  selector: 'tensile-forgot-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  template: `
    <main id="main-content" class="sign-in" tabindex="-1">
      <mat-card appearance="outlined" class="panel">
        <mat-card-header>
          <mat-card-title><h1 class="title">Forgot your password?</h1></mat-card-title>
        </mat-card-header>
        <mat-card-content>
          @if (sent(); as message) {
            <p role="status">{{ message }}</p>
          } @else {
            <form [formGroup]="form" (ngSubmit)="send()" novalidate>
              <mat-form-field appearance="outline">
                <mat-label>E-mail</mat-label>
                <input matInput type="email" formControlName="email" autocomplete="username" />
                <mat-error>Enter an e-mail address like name&#64;school.test.</mat-error>
              </mat-form-field>
              @if (failure(); as message) {
                <p class="failure" role="alert">{{ message }}</p>
              }
              <button mat-flat-button type="submit" [disabled]="pending()">
                Send a reset link
              </button>
            </form>
          }
          <p><a routerLink="/sign-in">Back to sign in</a></p>
        </mat-card-content>
      </mat-card>
    </main>
  `,
  styleUrl: '../sign-in/sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForgotPassword {
  private readonly api = inject(AccountLinksApi);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
  });
  protected readonly pending = signal(false);
  protected readonly sent = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);

  protected send(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.api.requestReset(this.form.getRawValue().email.trim()).subscribe({
      next: (message) => this.sent.set(message),
      error: (error: unknown) => {
        this.pending.set(false);
        this.failure.set(apiErrorMessage(error));
      },
    });
  }
}
