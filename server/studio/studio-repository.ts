import type { Knex } from 'knex';
import { isoTime, isoTimeOrNull } from '../rows';

/** A student of a studio with what the roster shows beside them. */
export interface RosterRow {
  readonly id: number;
  readonly name: string;
  readonly email: string;
  readonly joinedAt: string;
  readonly removedAt: string | null;
  /** The account cannot sign in (removed, or invited and no password chosen yet). */
  readonly disabled: boolean;
  readonly invitationOpen: boolean;
  readonly lastPractice: string | null;
}

interface RawRosterRow {
  id: number;
  name: string;
  email: string;
  created_at: Date | number | string;
  removed_at: Date | number | string | null;
  disabled_at: Date | number | string | null;
  open_invitations: number | string;
  last_practice: Date | number | string | null;
}

/** The `studio_students` links: which teacher teaches which student. */
export class StudioRepository {
  constructor(private readonly db: Knex) {}

  async link(teacherId: number, studentId: number): Promise<void> {
    await this.db('studio_students').insert({
      teacher_id: teacherId,
      student_id: studentId,
      created_at: new Date(),
    });
  }

  /** Brings a removed student back: the same link, so their history is still theirs. */
  async restore(teacherId: number, studentId: number): Promise<void> {
    await this.db('studio_students')
      .where({ teacher_id: teacherId, student_id: studentId })
      .update({ removed_at: null });
  }

  /** The link between this teacher and student, current or removed. */
  async linkOf(teacherId: number, studentId: number): Promise<{ removed: boolean } | undefined> {
    const row = (await this.db('studio_students')
      .where({ teacher_id: teacherId, student_id: studentId })
      .first()) as { removed_at: unknown } | undefined;
    return row ? { removed: row.removed_at !== null } : undefined;
  }

  /** Marks the link removed; returns false when the teacher has no such (current) student. */
  async remove(teacherId: number, studentId: number): Promise<boolean> {
    const changed = await this.db('studio_students')
      .where({ teacher_id: teacherId, student_id: studentId })
      .whereNull('removed_at')
      .update({ removed_at: new Date() });
    return Number(changed) === 1;
  }

  /** Whether the student is (or was, with `includeRemoved`) in the teacher's studio. */
  async has(teacherId: number, studentId: number, includeRemoved = false): Promise<boolean> {
    const query = this.db('studio_students').where({
      teacher_id: teacherId,
      student_id: studentId,
    });
    if (!includeRemoved) query.whereNull('removed_at');
    return (await query.first()) !== undefined;
  }

  /** Whether any other teacher still has the student. */
  async otherTeachers(teacherId: number, studentId: number): Promise<number> {
    const rows = await this.db('studio_students')
      .where({ student_id: studentId })
      .whereNot({ teacher_id: teacherId })
      .whereNull('removed_at')
      .count<{ n: number | string }[]>({ n: '*' });
    return Number(rows[0]?.n ?? 0);
  }

  /** The teacher's students, current and removed, by name. */
  async roster(teacherId: number): Promise<RosterRow[]> {
    const rows = (await this.db('studio_students as s')
      .join('users as u', 'u.id', 's.student_id')
      .where('s.teacher_id', teacherId)
      .select(
        'u.id',
        'u.name',
        'u.email',
        'u.disabled_at',
        's.created_at',
        's.removed_at',
        this.db.raw(
          '(select count(*) from invitations i where i.user_id = u.id and i.used_at is null) as open_invitations',
        ),
        this.db.raw(
          '(select max(p.practised_at) from practice_logs p where p.student_id = u.id) as last_practice',
        ),
      )
      .orderBy('u.name')
      .orderBy('u.id')) as RawRosterRow[];
    return rows.map((row) => ({
      id: Number(row.id),
      name: row.name,
      email: row.email,
      joinedAt: isoTime(row.created_at),
      removedAt: isoTimeOrNull(row.removed_at),
      disabled: row.disabled_at !== null,
      invitationOpen: Number(row.open_invitations) > 0,
      lastPractice: isoTimeOrNull(row.last_practice),
    }));
  }

  /** The teacher's current students who can sign in, as lists to pick from show them. */
  async activeStudents(teacherId: number): Promise<{ id: number; name: string; email: string }[]> {
    const rows = (await this.db('studio_students as s')
      .join('users as u', 'u.id', 's.student_id')
      .where('s.teacher_id', teacherId)
      .whereNull('s.removed_at')
      .whereNull('u.disabled_at')
      .where('u.role', 'student')
      .select('u.id', 'u.name', 'u.email')) as { id: number; name: string; email: string }[];
    return rows.map((row) => ({ id: Number(row.id), name: row.name, email: row.email }));
  }

  /** The ids of the teacher's current (not removed) students. */
  async currentIds(teacherId: number): Promise<number[]> {
    const rows = (await this.db('studio_students')
      .where({ teacher_id: teacherId })
      .whereNull('removed_at')
      .select('student_id')) as { student_id: number }[];
    return rows.map((row) => Number(row.student_id));
  }
}
