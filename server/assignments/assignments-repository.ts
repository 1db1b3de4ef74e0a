import type { Knex } from 'knex';
import { countRows, type Page } from '../paging';
import { isoTime } from '../rows';

interface AssignmentRow {
  id: number;
  teacher_id: number;
  saved_drill_id: number | null;
  title: string;
  due_date: string;
  start_tempo: number;
  target_tempo: number;
  note: string;
  created_at: Date | number | string;
  teacher_name?: string;
}

/** An assignment as stored, without its students. */
export interface AssignmentRecord {
  readonly id: number;
  readonly teacherId: number;
  readonly teacherName: string | null;
  readonly drillId: number | null;
  readonly title: string;
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
  readonly createdAt: string;
}

export interface NewAssignment {
  readonly teacherId: number;
  readonly drillId: number;
  readonly title: string;
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
  readonly studentIds: readonly number[];
}

/** A student given an assignment. */
export interface AssignedStudent {
  readonly assignmentId: number;
  readonly id: number;
  readonly name: string;
}

/** The `assignments` and `assignment_students` tables. */
export class AssignmentsRepository {
  constructor(private readonly db: Knex) {}

  async create(input: NewAssignment): Promise<number> {
    return this.db.transaction(async (trx) => {
      const [row] = (await trx('assignments')
        .insert({
          teacher_id: input.teacherId,
          saved_drill_id: input.drillId,
          title: input.title,
          due_date: input.dueDate,
          start_tempo: input.startTempo,
          target_tempo: input.targetTempo,
          note: input.note,
          created_at: new Date(),
        })
        .returning('id')) as ({ id: number } | number)[];
      const id = typeof row === 'object' ? Number(row.id) : Number(row);
      await trx('assignment_students').insert(
        input.studentIds.map((studentId) => ({ assignment_id: id, student_id: studentId })),
      );
      return id;
    });
  }

  private base(): Knex.QueryBuilder {
    return this.db('assignments as a')
      .join('users as t', 't.id', 'a.teacher_id')
      .select('a.*', 't.name as teacher_name');
  }

  /** A teacher's assignments, due soonest first (or newest with `sort=createdAt`). */
  async listForTeacher(
    teacherId: number,
    query: { page: number; pageSize: number; studentId?: number | undefined },
  ): Promise<Page<AssignmentRecord>> {
    const rows = this.base().where('a.teacher_id', teacherId);
    if (query.studentId !== undefined) {
      rows.whereExists(
        this.db('assignment_students as s')
          .whereRaw('s.assignment_id = a.id')
          .where('s.student_id', query.studentId),
      );
    }
    const total = await countRows(rows);
    const page = (await rows
      .orderBy('a.due_date', 'desc')
      .orderBy('a.id', 'desc')
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as AssignmentRow[];
    return { items: page.map(toRecord), total, page: query.page, pageSize: query.pageSize };
  }

  /** A student's assignments, due soonest first. */
  async listForStudent(studentId: number): Promise<AssignmentRecord[]> {
    const rows = (await this.base()
      .join('assignment_students as s', 's.assignment_id', 'a.id')
      .where('s.student_id', studentId)
      .orderBy('a.due_date', 'asc')
      .orderBy('a.id', 'asc')) as AssignmentRow[];
    return rows.map(toRecord);
  }

  async findForTeacher(teacherId: number, id: number): Promise<AssignmentRecord | undefined> {
    const row = (await this.base().where({ 'a.id': id, 'a.teacher_id': teacherId }).first()) as
      AssignmentRow | undefined;
    return row ? toRecord(row) : undefined;
  }

  async findForStudent(studentId: number, id: number): Promise<AssignmentRecord | undefined> {
    const row = (await this.base()
      .join('assignment_students as s', 's.assignment_id', 'a.id')
      .where({ 'a.id': id, 's.student_id': studentId })
      .first()) as AssignmentRow | undefined;
    return row ? toRecord(row) : undefined;
  }

  async students(assignmentIds: readonly number[]): Promise<AssignedStudent[]> {
    if (assignmentIds.length === 0) return [];
    const rows = (await this.db('assignment_students as s')
      .join('users as u', 'u.id', 's.student_id')
      .whereIn('s.assignment_id', assignmentIds)
      .select('s.assignment_id', 'u.id', 'u.name')
      .orderBy('u.name')) as { assignment_id: number; id: number; name: string }[];
    return rows.map((row) => ({
      assignmentId: Number(row.assignment_id),
      id: Number(row.id),
      name: row.name,
    }));
  }

  /** Every (assignment, student) pair a teacher gave, with the target, for roster figures. */
  async pairsForTeacher(
    teacherId: number,
  ): Promise<{ assignmentId: number; studentId: number; targetTempo: number; dueDate: string }[]> {
    const rows = (await this.db('assignments as a')
      .join('assignment_students as s', 's.assignment_id', 'a.id')
      .where('a.teacher_id', teacherId)
      .select('a.id', 's.student_id', 'a.target_tempo', 'a.due_date')) as {
      id: number;
      student_id: number;
      target_tempo: number;
      due_date: string;
    }[];
    return rows.map((row) => ({
      assignmentId: Number(row.id),
      studentId: Number(row.student_id),
      targetTempo: Number(row.target_tempo),
      dueDate: row.due_date,
    }));
  }

  async remove(teacherId: number, id: number): Promise<boolean> {
    const removed = await this.db('assignments').where({ id, teacher_id: teacherId }).delete();
    return Number(removed) === 1;
  }
}

function toRecord(row: AssignmentRow): AssignmentRecord {
  return {
    id: Number(row.id),
    teacherId: Number(row.teacher_id),
    teacherName: row.teacher_name ?? null,
    drillId: row.saved_drill_id === null ? null : Number(row.saved_drill_id),
    title: row.title,
    dueDate: row.due_date,
    startTempo: Number(row.start_tempo),
    targetTempo: Number(row.target_tempo),
    note: row.note,
    createdAt: isoTime(row.created_at),
  };
}
