import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { Observable, map, switchMap } from 'rxjs';
import { apiErrorMessage } from '../../core/api-error-message';
import { AuthSession } from '../../core/auth-session';
import { toLoadState, type LoadState } from '../../core/load-state';
import { ROLE_HOME, isRole } from '../../core/user';
import { AccountLinksApi } from '../account-links-api';

/** Which link brought the person here (route data `kind`). */
type LinkKind = 'invitation' | 'reset';

/**
 * `/invitations/:token` and `/reset-password/:token`: choose a password. An invitation signs the
 * person in and takes them home; a reset sends them to sign in with the new password.
 */
@Component({
  selector: 'tensile-choose-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  templateUrl: './choose-password.html',
  styleUrl: '../sign-in/sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChoosePassword {
  readonly token = input.required<string>();
  private readonly api = inject(AccountLinksApi);
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  protected readonly kind: LinkKind =
    inject(ActivatedRoute).snapshot.data['kind'] === 'reset' ? 'reset' : 'invitation';

  protected readonly link = toSignal(
    toObservable(this.token).pipe(switchMap((token) => toLoadState(this.describe(token)))),
    { initialValue: { status: 'loading' } as LoadState<{ name: string | null; email: string }> },
  );
  protected readonly heading = computed(() =>
    this.kind === 'reset' ? 'Choose a new password' : 'Welcome to Tensile',
  );
  protected readonly form = inject(FormBuilder).nonNullable.group({
    password: ['', [Validators.required, Validators.minLength(10), Validators.maxLength(200)]],
    repeat: ['', Validators.required],
  });
  protected readonly pending = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly done = signal(false);

  protected submit(): void {
    if (this.pending()) return;
    const { password, repeat } = this.form.getRawValue();
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    if (password !== repeat) {
      this.failure.set('The two passwords differ: type the same one twice.');
      return;
    }
    const state = this.link();
    if (state.status !== 'ready') return;
    this.pending.set(true);
    this.failure.set(null);
    const fail = (error: unknown) => {
      this.pending.set(false);
      this.failure.set(apiErrorMessage(error, 'The password could not be saved.'));
    };
    if (this.kind === 'reset') {
      this.api.resetPassword(this.token(), password).subscribe({
        next: () => {
          this.pending.set(false);
          this.done.set(true);
        },
        error: fail,
      });
      return;
    }
    this.api
      .acceptInvitation(this.token(), password)
      // The server signed the person in; sign in here too so the app's session knows them.
      .pipe(switchMap(() => this.session.signIn(state.value.email, password)))
      .subscribe({
        next: (user) =>
          void this.router.navigateByUrl(isRole(user.role) ? ROLE_HOME[user.role] : '/'),
        error: fail,
      });
  }

  private describe(token: string): Observable<{ name: string | null; email: string }> {
    return this.kind === 'reset'
      ? this.api.reset(token).pipe(map((r) => ({ name: null, email: r.email })))
      : this.api.invitation(token);
  }
}
