import { ChangeDetectionStrategy, Component, Signal, computed, inject } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';

import { LoadState, loadStateSignal } from '../../core/load-state';
import { ROLE_LABEL, isRole } from '../../core/user';
import { EmptyState } from '../../ui/empty-state';
import { StudioUser, UsersApi } from './users-api';

/** The admin's list of accounts: name, e-mail and role. */
@Component({
  selector: 'tensile-users',
  imports: [MatProgressBarModule, MatTableModule, EmptyState],
  templateUrl: './users.html',
  styleUrl: './users.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Users {
  private readonly api = inject(UsersApi);
  protected readonly columns = ['name', 'email', 'role'] as const;
  protected readonly state: Signal<LoadState<readonly StudioUser[]>> = loadStateSignal(
    this.api.list(),
  );
  protected readonly users = computed(() => {
    const state = this.state();
    return state.status === 'ready' ? state.value : [];
  });
  protected readonly errorMessage = computed(() => {
    const state = this.state();
    return state.status === 'error' ? state.message : null;
  });

  /** "Teacher" for 'teacher'; an unknown role from the server is shown as sent. */
  protected roleName(role: unknown): string {
    return isRole(role) ? ROLE_LABEL[role] : String(role);
  }
}
