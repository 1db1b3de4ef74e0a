import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { Observable, filter, switchMap } from 'rxjs';

import { apiErrorMessage } from '../../core/api-error-message';
import { LoadState, toLoadState } from '../../core/load-state';
import { ROLE_LABEL, Role, isRole } from '../../core/user';
import { confirmAction } from '../../ui/confirm-dialog';
import { EmptyState } from '../../ui/empty-state';
import { StudioUser, UsersApi } from './users-api';

/**
 * The admin's accounts table: create a teacher (by invitation), change a role, deactivate or
 * reactivate, send a password reset. The server keeps the last active admin.
 */
@Component({
  selector: 'tensile-users',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    EmptyState,
  ],
  templateUrl: './users.html',
  styleUrl: './users.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Users {
  private readonly api = inject(UsersApi);
  private readonly dialog = inject(MatDialog);
  private readonly version = signal(0);
  protected readonly roles: readonly Role[] = ['admin', 'teacher', 'student'];
  protected readonly roleLabel = ROLE_LABEL;
  protected readonly columns = ['name', 'email', 'role', 'status', 'actions'] as const;

  protected statusLabel(status: StudioUser['status']): string {
    return status === 'invited' ? 'Invited' : status === 'deactivated' ? 'Deactivated' : 'Active';
  }
  protected readonly state = toSignal(
    toObservable(this.version).pipe(switchMap(() => toLoadState(this.api.list()))),
    { initialValue: { status: 'loading' } as LoadState<readonly StudioUser[]> },
  );
  protected readonly users = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value : [];
  });
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : null;
  });
  protected readonly message = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
  });

  /** "Teacher" for 'teacher'; an unknown role from the server is shown as sent. */
  protected roleName(role: unknown): string {
    return isRole(role) ? ROLE_LABEL[role] : String(role);
  }

  protected inviteTeacher(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, email } = this.form.getRawValue();
    this.run(this.api.inviteTeacher(name.trim(), email.trim()), `Invitation sent to ${email}.`);
    this.form.reset();
  }

  protected changeRole(user: StudioUser, role: Role): void {
    if (role === user.role) return;
    this.run(this.api.update(user.id, { role }), `${user.name} is now ${ROLE_LABEL[role]}.`);
  }

  protected setActive(user: StudioUser, active: boolean): void {
    if (active) {
      this.run(this.api.update(user.id, { active }), `${user.name} can sign in again.`);
      return;
    }
    confirmAction(this.dialog, {
      title: `Deactivate ${user.name}?`,
      message: 'They can no longer sign in. Their data stays; you can reactivate them later.',
      confirm: 'Deactivate',
    })
      .pipe(filter(Boolean))
      .subscribe(() =>
        this.run(this.api.update(user.id, { active }), `${user.name} was deactivated.`),
      );
  }

  protected sendReset(user: StudioUser): void {
    this.run(this.api.sendReset(user.id), `A password reset link was sent to ${user.email}.`);
  }

  private run(request: Observable<unknown>, success: string): void {
    this.failure.set(null);
    this.message.set(null);
    request.subscribe({
      next: () => {
        this.message.set(success);
        this.version.update((v) => v + 1);
      },
      error: (error: unknown) => {
        this.failure.set(apiErrorMessage(error));
        this.version.update((v) => v + 1);
      },
    });
  }
}
