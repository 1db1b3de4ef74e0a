import type { Knex } from 'knex';
import { countRows, type Page } from '../paging';
import type { Drill } from '../../shared/generator/index';
import { isoTime } from '../rows';

interface AssignmentDrillRow {
  id: number;
  assignment_id: number;
  position: number;
  title: string;
  drill: string;
  ladder_start: number;
  ladder_target: number;
}

interface AssignmentRow {
  id: number;
  teacher_id: number;
  kind: string;
  saved_drill_id: number | null;
  worksheet_id: number | null;
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
  /** A saved drill, or a worksheet whose drills were copied when it was assigned. */
  readonly kind: AssignmentKind;
  readonly drillId: number | null;
  readonly worksheetId: number | null;
  readonly title: string;
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
  readonly createdAt: string;
}

export type AssignmentKind = 'drill' | 'worksheet';

/** One drill of a worksheet assignment, as copied from the worksheet. */
export interface AssignmentDrillRecord {
  readonly id: number;
  readonly assignmentId: number;
  readonly position: number;
  readonly title: string;
  readonly drill: Drill;
  readonly ladder: { readonly start: number; readonly target: number };
}

export interface NewAssignmentDrill {
  readonly title: string;
  readonly drill: Drill;
  readonly ladder: { readonly start: number; readonly target: number };
}

export interface NewAssignment {
  readonly teacherId: number;
  readonly kind: AssignmentKind;
  readonly drillId: number | null;
  readonly worksheetId: number | null;
  /** The worksheet's drills, in order (empty for a drill assignment). */
  readonly drills: readonly NewAssignmentDrill[];
  readonly createdAt: Date;
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
          kind: input.kind,
          saved_drill_id: input.drillId,
          worksheet_id: input.worksheetId,
          title: input.title,
          due_date: input.dueDate,
          start_tempo: input.startTempo,
          target_tempo: input.targetTempo,
          note: input.note,
          created_at: input.createdAt,
        })
        .returning('id')) as ({ id: number } | number)[];
      const id = typeof row === 'object' ? Number(row.id) : Number(row);
      await trx('assignment_students').insert(
        input.studentIds.map((studentId) => ({ assignment_id: id, student_id: studentId })),
      );
      if (input.drills.length > 0) {
        await trx('assignment_drills').insert(
          input.drills.map((d, position) => ({
            assignment_id: id,
            position,
            title: d.title,
            drill: JSON.stringify(d.drill),
            ladder_start: d.ladder.start,
            ladder_target: d.ladder.target,
          })),
        );
      }
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

  /** The drills of these (worksheet) assignments, in worksheet order. */
  async drills(assignmentIds: readonly number[]): Promise<AssignmentDrillRecord[]> {
    if (assignmentIds.length === 0) return [];
    const rows = (await this.db('assignment_drills')
      .whereIn('assignment_id', assignmentIds)
      .orderBy('assignment_id')
      .orderBy('position')) as AssignmentDrillRow[];
    return rows.map(toDrill);
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
    kind: row.kind === 'worksheet' ? 'worksheet' : 'drill',
    drillId: row.saved_drill_id === null ? null : Number(row.saved_drill_id),
    worksheetId: row.worksheet_id === null ? null : Number(row.worksheet_id),
    title: row.title,
    dueDate: row.due_date,
    startTempo: Number(row.start_tempo),
    targetTempo: Number(row.target_tempo),
    note: row.note,
    createdAt: isoTime(row.created_at),
  };
}

function toDrill(row: AssignmentDrillRow): AssignmentDrillRecord {
  return {
    id: Number(row.id),
    assignmentId: Number(row.assignment_id),
    position: Number(row.position),
    title: row.title,
    drill: JSON.parse(row.drill) as Drill,
    ladder: { start: Number(row.ladder_start), target: Number(row.ladder_target) },
  };
}
