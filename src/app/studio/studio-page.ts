import { DatePipe } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { filter, switchMap } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { toLoadState, type LoadState } from '../core/load-state';
import { STATUS_LABEL } from '../practice/practice-api';
import { confirmAction } from '../ui/confirm-dialog';
import { AssignForm } from './assign-form';
import {
  StudioApi,
  type InviteResult,
  type RosterStudent,
  type TeacherAssignment,
} from './studio-api';

const INVITE_MESSAGE: Record<InviteResult['outcome'], (s: RosterStudent) => string> = {
  invited: (s) => `Invitation sent to ${s.name} (${s.email}).`,
  resent: (s) =>
    `Invitation sent again to ${s.name} (${s.email}); the earlier link no longer works.`,
  rejoined: (s) =>
    s.status === 'invited'
      ? `${s.name} is back in your studio, with their history. A new invitation is on its way to ${s.email}.`
      : `${s.name} is back in your studio, with their history.`,
};

/** `/studio`: the teacher's roster, invitations, and assignments with each student's status. */
@Component({
  selector: 'tensile-studio-page',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatTableModule,
    RouterLink,
    AssignForm,
  ],
  templateUrl: './studio-page.html',
  styleUrl: './studio-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudioPage {
  private readonly api = inject(StudioApi);
  private readonly dialog = inject(MatDialog);
  private readonly version = signal(0);
  protected readonly statusLabel = STATUS_LABEL;
  protected readonly rosterColumns = [
    'name',
    'status',
    'lastPractice',
    'open',
    'streak',
    'actions',
  ];
  protected readonly assignmentColumns = ['title', 'due', 'tempo', 'students'];
  protected readonly roster = toSignal(
    toObservable(this.version).pipe(switchMap(() => toLoadState(this.api.roster()))),
    { initialValue: { status: 'loading' } as LoadState<readonly RosterStudent[]> },
  );
  protected readonly assignments = toSignal(
    toObservable(this.version).pipe(switchMap(() => toLoadState(this.api.assignments()))),
    { initialValue: { status: 'loading' } as LoadState<readonly TeacherAssignment[]> },
  );
  /** Students who can sign in: only they can be given assignments. */
  protected readonly current = computed(() => {
    const state = this.roster();
    return state.status === 'ready' ? state.value.filter((s) => s.status === 'active') : [];
  });

  protected readonly inviteForm = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    email: ['', [Validators.required, Validators.email, Validators.maxLength(254)]],
  });
  protected readonly inviting = signal(false);
  /** The server's words when the address is taken, shown under the e-mail field. */
  protected readonly emailTaken = signal<string | null>(null);
  protected readonly message = signal<string | null>(null);
  protected readonly failure = signal<string | null>(null);

  protected invite(): void {
    if (this.inviting()) return;
    if (this.inviteForm.invalid) {
      this.inviteForm.markAllAsTouched();
      return;
    }
    const { name, email } = this.inviteForm.getRawValue();
    this.inviting.set(true);
    this.failure.set(null);
    this.api.invite(name.trim(), email.trim()).subscribe({
      next: ({ student, outcome }) => {
        this.inviting.set(false);
        this.inviteForm.reset();
        this.message.set(INVITE_MESSAGE[outcome](student));
        this.reload();
      },
      error: (error: unknown) => {
        this.inviting.set(false);
        const text = apiErrorMessage(error, 'The invitation could not be sent.');
        // An address already in use is a fault of the e-mail field: say so beside it.
        if (error instanceof HttpErrorResponse && error.status === 409) {
          this.emailTaken.set(text);
          this.inviteForm.controls.email.setErrors({ taken: true });
          this.inviteForm.controls.email.markAsTouched();
        } else {
          this.failure.set(text);
        }
      },
    });
  }

  /** Sends a pending invitation again (a new link; the old one stops working). */
  protected resend(student: RosterStudent): void {
    this.failure.set(null);
    this.api.resendInvitation(student.id).subscribe({
      next: (updated) => {
        this.message.set(INVITE_MESSAGE.resent(updated));
        this.reload();
      },
      error: (error: unknown) => this.failure.set(apiErrorMessage(error)),
    });
  }

  /** Invites a removed student back; they rejoin with their history. */
  protected inviteBack(student: RosterStudent): void {
    this.failure.set(null);
    this.api.invite(student.name, student.email).subscribe({
      next: ({ student: back, outcome }) => {
        this.message.set(INVITE_MESSAGE[outcome](back));
        this.reload();
      },
      error: (error: unknown) => this.failure.set(apiErrorMessage(error)),
    });
  }

  protected remove(student: RosterStudent): void {
    confirmAction(this.dialog, {
      title: `Remove ${student.name}?`,
      message:
        'They leave your studio and can no longer sign in. Their practice history stays here for you.',
      confirm: 'Remove',
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.api.remove(student.id)),
      )
      .subscribe({
        next: () => {
          this.message.set(`${student.name} was removed from your studio.`);
          this.reload();
        },
        error: (error: unknown) => this.failure.set(apiErrorMessage(error)),
      });
  }

  protected reload(): void {
    this.version.update((v) => v + 1);
  }

  protected summary(assignment: TeacherAssignment): string {
    return assignment.students.map((s) => `${s.name}: ${this.statusLabel[s.status]}`).join(' · ');
  }
}
