import type { Knex } from 'knex';
import type { AccountLinksService } from '../auth/account-links-service';
import type { PublicUser } from '../auth/roles';
import { AccountTokensRepository } from '../auth/account-tokens-repository';
import { UsersRepository } from '../auth/users-repository';
import { AssignmentsRepository } from '../assignments/assignments-repository';
import { notFound } from '../http-error';
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

  /** Creates the student's account and invitation in the teacher's studio, then e-mails it. */
  async invite(
    teacher: PublicUser,
    invitee: { name: string; email: string },
  ): Promise<RosterEntry> {
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
    const entry = (await this.roster(teacher.id)).find((e) => e.id === user.id);
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
