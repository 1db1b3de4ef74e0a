import type { Knex } from 'knex';
import { countRows, type Page } from '../paging';
import { isoTime } from '../rows';

interface LogRow {
  id: number;
  student_id: number;
  assignment_id: number | null;
  assignment_drill_id: number | null;
  minutes: number;
  tempo: number;
  rating: number;
  note: string;
  practised_at: Date | number | string;
  assignment_title?: string | null;
}

/** One practice session as a student logged it. */
export interface PracticeLog {
  readonly id: number;
  readonly studentId: number;
  readonly assignmentId: number | null;
  readonly assignmentTitle: string | null;
  /** For a worksheet assignment, which of its drills was practised. */
  readonly assignmentDrillId: number | null;
  readonly minutes: number;
  readonly tempo: number;
  readonly rating: number;
  readonly note: string;
  readonly practisedAt: string;
}

export interface NewPracticeLog {
  readonly studentId: number;
  readonly assignmentId: number | null;
  readonly assignmentDrillId: number | null;
  readonly minutes: number;
  readonly tempo: number;
  readonly rating: number;
  readonly note: string;
  readonly practisedAt: Date;
}

/** Best clean tempo, logs and minutes of one student on one assignment. */
export interface AssignmentProgress {
  readonly assignmentId: number;
  readonly studentId: number;
  readonly bestTempo: number | null;
  readonly logs: number;
  readonly minutes: number;
}

/** The `practice_logs` table. */
export class PracticeRepository {
  constructor(private readonly db: Knex) {}

  async insert(log: NewPracticeLog): Promise<number> {
    const [row] = (await this.db('practice_logs')
      .insert({
        student_id: log.studentId,
        assignment_id: log.assignmentId,
        assignment_drill_id: log.assignmentDrillId,
        minutes: log.minutes,
        tempo: log.tempo,
        rating: log.rating,
        note: log.note,
        practised_at: log.practisedAt,
      })
      .returning('id')) as ({ id: number } | number)[];
    return typeof row === 'object' ? Number(row.id) : Number(row);
  }

  private base(): Knex.QueryBuilder {
    return this.db('practice_logs as p')
      .leftJoin('assignments as a', 'a.id', 'p.assignment_id')
      .select('p.*', 'a.title as assignment_title');
  }

  async find(id: number): Promise<PracticeLog | undefined> {
    const row = (await this.base().where('p.id', id).first()) as LogRow | undefined;
    return row ? toLog(row) : undefined;
  }

  /** A student's logs, newest first, optionally for one assignment. */
  async list(
    studentId: number,
    query: { page: number; pageSize: number; assignmentId?: number | undefined },
  ): Promise<Page<PracticeLog>> {
    const rows = this.base().where('p.student_id', studentId);
    if (query.assignmentId !== undefined) rows.where('p.assignment_id', query.assignmentId);
    const total = await countRows(rows);
    const page = (await rows
      .orderBy('p.practised_at', 'desc')
      .orderBy('p.id', 'desc')
      .limit(query.pageSize)
      .offset(query.page * query.pageSize)) as LogRow[];
    return { items: page.map(toLog), total, page: query.page, pageSize: query.pageSize };
  }

  /** Every log of the students (or of one assignment), oldest first, for charts. */
  async allFor(filter: {
    studentIds?: readonly number[];
    assignmentId?: number;
  }): Promise<PracticeLog[]> {
    const rows = this.base();
    if (filter.studentIds) rows.whereIn('p.student_id', filter.studentIds);
    if (filter.assignmentId !== undefined) rows.where('p.assignment_id', filter.assignmentId);
    const found = (await rows.orderBy('p.practised_at').orderBy('p.id')) as LogRow[];
    return found.map(toLog);
  }

  /** Best tempo, count and minutes per (assignment, student) for these assignments. */
  async progress(assignmentIds: readonly number[]): Promise<AssignmentProgress[]> {
    if (assignmentIds.length === 0) return [];
    const rows = (await this.db('practice_logs')
      .whereIn('assignment_id', assignmentIds)
      .groupBy('assignment_id', 'student_id')
      .select('assignment_id', 'student_id')
      .max({ best: 'tempo' })
      .count({ logs: '*' })
      .sum({ minutes: 'minutes' })) as {
      assignment_id: number;
      student_id: number;
      best: number | null;
      logs: number | string;
      minutes: number | string | null;
    }[];
    return rows.map((row) => ({
      assignmentId: Number(row.assignment_id),
      studentId: Number(row.student_id),
      bestTempo: row.best === null ? null : Number(row.best),
      logs: Number(row.logs),
      minutes: Number(row.minutes ?? 0),
    }));
  }

  /** Best tempo and count of one student's logs per drill of a worksheet assignment. */
  async drillProgress(
    assignmentId: number,
    studentId: number,
  ): Promise<{ assignmentDrillId: number; bestTempo: number; logs: number }[]> {
    const rows = (await this.db('practice_logs')
      .where({ assignment_id: assignmentId, student_id: studentId })
      .whereNotNull('assignment_drill_id')
      .groupBy('assignment_drill_id')
      .select('assignment_drill_id')
      .max({ best: 'tempo' })
      .count({ logs: '*' })) as {
      assignment_drill_id: number;
      best: number;
      logs: number | string;
    }[];
    return rows.map((row) => ({
      assignmentDrillId: Number(row.assignment_drill_id),
      bestTempo: Number(row.best),
      logs: Number(row.logs),
    }));
  }

  /** The days (as stored moments) a student practised since `since`. */
  async momentsSince(studentId: number, since: Date): Promise<string[]> {
    const rows = (await this.db('practice_logs')
      .where('student_id', studentId)
      .where('practised_at', '>=', since)
      .select('practised_at')) as { practised_at: Date | number | string }[];
    return rows.map((row) => isoTime(row.practised_at));
  }
}

function toLog(row: LogRow): PracticeLog {
  return {
    id: Number(row.id),
    studentId: Number(row.student_id),
    assignmentId: row.assignment_id === null ? null : Number(row.assignment_id),
    assignmentTitle: row.assignment_title ?? null,
    assignmentDrillId: row.assignment_drill_id === null ? null : Number(row.assignment_drill_id),
    minutes: Number(row.minutes),
    tempo: Number(row.tempo),
    rating: Number(row.rating),
    note: row.note,
    practisedAt: isoTime(row.practised_at),
  };
}
