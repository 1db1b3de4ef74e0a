import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';

import { apiErrorMessage } from '../../core/api-error-message';
import { AuthSession } from '../../core/auth-session';
import { ROLE_HOME, Role } from '../../core/user';

/** The sign-in page: e-mail and password, then on to the returnUrl or the role's home. */
@Component({
  selector: 'tensile-sign-in',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);

  /** Where to go after signing in (query parameter, bound by the router). */
  readonly returnUrl = input<string>();

  // The same length caps as the server's, so an over-long entry is explained by its length.
  protected readonly maxEmailLength = 254;
  protected readonly maxPasswordLength = 200;
  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: ['', [Validators.required, Validators.maxLength(this.maxEmailLength), Validators.email]],
    password: ['', [Validators.required, Validators.maxLength(this.maxPasswordLength)]],
  });
  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);

  /** Sends the credentials; on success navigates, on failure shows the server's words. */
  protected signIn(): void {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, password } = this.form.getRawValue();
    this.pending.set(true);
    this.failure.set(null);
    this.session.signIn(email.trim(), password).subscribe({
      next: (user) => void this.router.navigateByUrl(this.destination(user.role)),
      error: (error: unknown) => {
        this.pending.set(false);
        this.failure.set(apiErrorMessage(error, 'Sign-in failed. Check your e-mail and password.'));
      },
    });
  }

  /** Only same-site paths are followed, so a crafted link cannot send someone elsewhere. */
  private destination(role: Role): string {
    const target = this.returnUrl();
    const safe =
      target &&
      target.startsWith('/') &&
      !target.startsWith('//') &&
      !target.startsWith('/sign-in');
    return safe ? target : ROLE_HOME[role];
  }
}
