import type { Knex } from 'knex';
import type { AccountLinksService } from '../auth/account-links-service';
import type { PublicUser } from '../auth/roles';
import { AccountTokensRepository } from '../auth/account-tokens-repository';
import { UsersRepository, toPublicUser, type UserRow } from '../auth/users-repository';
import { AssignmentsRepository } from '../assignments/assignments-repository';
import { HttpError, notFound } from '../http-error';
import { PracticeRepository } from '../practice/practice-repository';
import { dayOf, practiceStreak } from '../practice/practice-stats';
import { StudioRepository } from './studio-repository';

/** Where a student stands in a studio. */
export type RosterStatus = 'active' | 'invited' | 'removed';

/** One line of the roster table. */
export interface RosterEntry {
  readonly id: number;
  readonly name: string;
  readonly email: string;
  readonly status: RosterStatus;
  readonly joinedAt: string;
  readonly removedAt: string | null;
  readonly lastPractice: string | null;
  /** Assignments from this teacher whose target tempo the student has not reached yet. */
  readonly openAssignments: number;
  /** Days in a row with practice, up to today (or yesterday). */
  readonly streak: number;
}

/** What inviting did: a new account, a pending invitation sent again, a removed student back. */
export type InviteOutcome = 'invited' | 'resent' | 'rejoined';

const EMAIL_TAKEN =
  'This e-mail address belongs to someone else’s account. Ask them for another address, or ask an admin.';
const ALREADY_HERE = 'This student is already in your studio.';

/** Days of logs read back for streaks: a longer streak shows as this many. */
const STREAK_WINDOW_DAYS = 366;

/** A teacher's students: invitations, the roster and removal. */
export class StudioService {
  constructor(
    private readonly db: Knex,
    private readonly links: AccountLinksService,
    private readonly now: () => Date = () => new Date(),
  ) {}

  async roster(teacherId: number): Promise<RosterEntry[]> {
    const rows = await new StudioRepository(this.db).roster(teacherId);
    const pairs = await new AssignmentsRepository(this.db).pairsForTeacher(teacherId);
    const practice = new PracticeRepository(this.db);
    const progress = await practice.progress([...new Set(pairs.map((p) => p.assignmentId))]);
    const best = new Map(progress.map((p) => [`${p.assignmentId}:${p.studentId}`, p.bestTempo]));
    const now = this.now();
    const today = dayOf(now);
    const since = new Date(now.getTime() - STREAK_WINDOW_DAYS * 86_400_000);
    const entries: RosterEntry[] = [];
    for (const row of rows) {
      const open = pairs.filter(
        (p) =>
          p.studentId === row.id && (best.get(`${p.assignmentId}:${row.id}`) ?? -1) < p.targetTempo,
      ).length;
      const days = new Set((await practice.momentsSince(row.id, since)).map(dayOf));
      entries.push({
        id: row.id,
        name: row.name,
        email: row.email,
        status: row.removedAt
          ? 'removed'
          : row.invitationOpen && row.disabled
            ? 'invited'
            : 'active',
        joinedAt: row.joinedAt,
        removedAt: row.removedAt,
        lastPractice: row.lastPractice,
        openAssignments: open,
        streak: practiceStreak(days, today),
      });
    }
    return entries;
  }

  /**
   * Invites a student by e-mail. A new address gets an account and an invitation. An address
   * already in this studio is invited again: a pending invitation is resent, a removed student
   * rejoins with their history (a fresh invitation when their sign-in was disabled). Any other
   * account answers 409 `email_taken`; a current student 409 `already_in_studio`. Resends are
   * rate limited through `limit` (called with the address before anything is sent).
   */
  async invite(
    teacher: PublicUser,
    invitee: { name: string; email: string },
    limit: (email: string) => void = () => undefined,
  ): Promise<{ student: RosterEntry; outcome: InviteOutcome }> {
    const existing = await new UsersRepository(this.db).findByEmail(invitee.email);
    if (existing) {
      const outcome = await this.inviteAgain(teacher, existing, limit);
      return { student: await this.entry(teacher.id, existing.id), outcome };
    }
    const { user, token } = await this.db.transaction(async (trx) => {
      const created = await this.links.createInvitation(
        trx,
        { ...invitee, role: 'student' },
        teacher.id,
      );
      await new StudioRepository(trx).link(teacher.id, created.user.id);
      return created;
    });
    await this.links.sendInvitation(user, token, teacher.name);
    return { student: await this.entry(teacher.id, user.id), outcome: 'invited' };
  }

  /** Resends a pending invitation of a student in the studio (rate limited through `limit`). */
  async resend(
    teacher: PublicUser,
    studentId: number,
    limit: (email: string) => void = () => undefined,
  ): Promise<RosterEntry> {
    const user = await new UsersRepository(this.db).findById(studentId);
    const link = await new StudioRepository(this.db).linkOf(teacher.id, studentId);
    if (!user || !link) throw studentNotFound();
    if (link.removed || user.disabled_at === null) {
      throw new HttpError(
        409,
        'not_pending',
        link.removed
          ? 'This student was removed: invite them again from the invitation form.'
          : 'This student has already joined; there is no invitation to resend.',
      );
    }
    await this.inviteAgain(teacher, user, limit);
    return this.entry(teacher.id, studentId);
  }

  private async inviteAgain(
    teacher: PublicUser,
    user: UserRow,
    limit: (email: string) => void,
  ): Promise<InviteOutcome> {
    const link =
      user.role === 'student'
        ? await new StudioRepository(this.db).linkOf(teacher.id, user.id)
        : undefined;
    if (!link) {
      throw new HttpError(409, 'email_taken', EMAIL_TAKEN, [
        { path: 'body.email', message: EMAIL_TAKEN },
      ]);
    }
    const pending = !link.removed && user.disabled_at !== null;
    if (!link.removed && !pending) {
      throw new HttpError(409, 'already_in_studio', ALREADY_HERE, [
        { path: 'body.email', message: ALREADY_HERE },
      ]);
    }
    limit(user.email);
    const token = await this.db.transaction(async (trx) => {
      if (link.removed) await new StudioRepository(trx).restore(teacher.id, user.id);
      // A student still taught elsewhere keeps signing in as before: no new password needed.
      if (user.disabled_at === null) return null;
      return this.links.reissueInvitation(trx, user.id, teacher.id);
    });
    const student = toPublicUser(user);
    if (token !== null) await this.links.sendInvitation(student, token, teacher.name);
    return pending ? 'resent' : 'rejoined';
  }

  private async entry(teacherId: number, studentId: number): Promise<RosterEntry> {
    const entry = (await this.roster(teacherId)).find((e) => e.id === studentId);
    if (!entry) throw new Error('An invited student is missing from the roster');
    return entry;
  }

  /**
   * Takes the student out of the studio. Their logs stay (the teacher still sees the history);
   * their sign-in is disabled unless another teacher still teaches them.
   */
  async remove(teacherId: number, studentId: number): Promise<void> {
    await this.db.transaction(async (trx) => {
      const studio = new StudioRepository(trx);
      if (!(await studio.remove(teacherId, studentId))) throw studentNotFound();
      if ((await studio.otherTeachers(teacherId, studentId)) === 0) {
        await new UsersRepository(trx).setDisabled(studentId, true);
        await new AccountTokensRepository(trx, 'invitations').retireAll(studentId);
        await new AccountTokensRepository(trx, 'password_resets').retireAll(studentId);
      }
    });
  }

  /** 404 unless the student is (or, with `includeRemoved`, was) in the teacher's studio. */
  async requireStudent(
    teacherId: number,
    studentId: number,
    includeRemoved = false,
  ): Promise<void> {
    if (!(await new StudioRepository(this.db).has(teacherId, studentId, includeRemoved))) {
      throw studentNotFound();
    }
  }
}

export function studentNotFound(): ReturnType<typeof notFound> {
  return notFound('No student with this id in your studio.');
}
