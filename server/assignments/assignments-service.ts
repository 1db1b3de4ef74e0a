import type { Knex } from 'knex';
import type { Drill } from '../../shared/generator/index';
import type { PublicUser } from '../auth/roles';
import { DrillsRepository } from '../drills/drills-repository';
import { HttpError, notFound } from '../http-error';
import type { Mailer } from '../mail/mail-service';
import type { Page } from '../paging';
import { PracticeRepository, type AssignmentProgress } from '../practice/practice-repository';
import { assignmentStatus, dayOf, type AssignmentStatus } from '../practice/practice-stats';
import { StudioRepository } from '../studio/studio-repository';
import { resolveDrillSource, type DrillSourceDeps } from '../exports/drill-source';
import { WorksheetsRepository } from '../worksheets/worksheets-repository';
import {
  AssignmentsRepository,
  type AssignmentRecord,
  type NewAssignmentDrill,
} from './assignments-repository';

/** A student's standing on one assignment. */
export interface StudentProgress {
  readonly id: number;
  readonly name: string;
  readonly status: AssignmentStatus;
  readonly bestTempo: number | null;
  readonly logs: number;
  readonly minutes: number;
}

/** A drill of a worksheet assignment, without the drill itself (for lists). */
export interface AssignmentDrillSummary {
  readonly id: number;
  readonly position: number;
  readonly title: string;
  readonly ladder: { readonly start: number; readonly target: number };
}

/** A drill of a worksheet assignment as its student practises it. */
export interface StudentAssignmentDrill extends AssignmentDrillSummary {
  readonly drill: Drill;
  readonly bestTempo: number | null;
  readonly logs: number;
}

/** An assignment as its teacher sees it: every student's standing. */
export interface TeacherAssignment extends AssignmentRecord {
  readonly students: readonly StudentProgress[];
  /** A worksheet's drills, in order; empty for a drill assignment. */
  readonly drills: readonly AssignmentDrillSummary[];
}

/** An assignment as a student sees it: their own standing only. */
export interface StudentAssignment extends AssignmentRecord {
  readonly status: AssignmentStatus;
  readonly bestTempo: number | null;
  readonly logs: number;
}

export interface NewAssignmentInput {
  readonly drillId?: number | undefined;
  readonly worksheetId?: number | undefined;
  readonly studentIds: readonly number[];
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
}

/** Assignments: a teacher's saved drill or worksheet given to students of their studio. */
export class AssignmentsService {
  constructor(
    private readonly db: Knex,
    private readonly mailer: Mailer,
    private readonly publicUrl: string,
    private readonly now: () => Date = () => new Date(),
    private readonly sources?: DrillSourceDeps,
  ) {}

  private get repo(): AssignmentsRepository {
    return new AssignmentsRepository(this.db);
  }

  async create(
    teacher: PublicUser,
    input: NewAssignmentInput,
  ): Promise<TeacherAssignment & { noticesSent: number }> {
    const material = await this.material(teacher, input);
    const studentIds = [...new Set(input.studentIds)];
    const mine = new Set(
      await new StudioRepository(this.db)
        .activeStudents(teacher.id)
        .then((s) => s.map((x) => x.id)),
    );
    const strangers = studentIds.filter((id) => !mine.has(id));
    if (strangers.length > 0) {
      throw new HttpError(
        404,
        'not_found',
        'Some of these students are not in your studio.',
        strangers.map((id) => ({
          path: `body.studentIds.${input.studentIds.indexOf(id)}`,
          message: 'No student with this id in your studio.',
        })),
      );
    }
    const id = await this.repo.create({
      teacherId: teacher.id,
      ...material,
      createdAt: this.now(),
      dueDate: input.dueDate,
      startTempo: input.startTempo,
      targetTempo: input.targetTempo,
      note: input.note,
      studentIds,
    });
    const assignment = await this.getForTeacher(teacher.id, id);
    let noticesSent = 0;
    const recipients = await this.db('users').whereIn('id', studentIds).select('email', 'name');
    for (const student of recipients as { email: string; name: string }[]) {
      const sent = await this.mailer.trySend(student.email, {
        subject: `New assignment: ${material.title}`,
        greeting: `Hello ${student.name},`,
        blocks: [
          {
            text: `${teacher.name} has assigned you "${material.title}", due ${input.dueDate}. Start at ${input.startTempo} BPM and work up to ${input.targetTempo} BPM.`,
          },
          ...(input.note ? [{ text: `Note from ${teacher.name}: ${input.note}` }] : []),
          { link: `${this.publicUrl}/assignments/${id}`, label: 'Open the assignment' },
        ],
      });
      if (sent) noticesSent += 1;
    }
    return { ...assignment, noticesSent };
  }

  /** What is assigned: the teacher's saved drill, or a copy of their worksheet's drills. */
  private async material(
    teacher: PublicUser,
    input: NewAssignmentInput,
  ): Promise<{
    kind: 'drill' | 'worksheet';
    drillId: number | null;
    worksheetId: number | null;
    title: string;
    drills: NewAssignmentDrill[];
  }> {
    if (input.worksheetId === undefined) {
      const drill = await new DrillsRepository(this.db).find(teacher.id, input.drillId!);
      if (!drill) {
        throw new HttpError(404, 'not_found', 'No saved drill with this id among yours.', [
          { path: 'body.drillId', message: 'No saved drill with this id among yours.' },
        ]);
      }
      return {
        kind: 'drill',
        drillId: drill.id,
        worksheetId: null,
        title: drill.title,
        drills: [],
      };
    }
    const sheet = await new WorksheetsRepository(this.db).find(teacher.id, input.worksheetId);
    if (!sheet) {
      throw new HttpError(404, 'not_found', 'No worksheet with this id among yours.', [
        { path: 'body.worksheetId', message: 'No worksheet with this id among yours.' },
      ]);
    }
    if (sheet.items.length === 0) {
      throw new HttpError(409, 'empty_worksheet', 'This worksheet has no drills to assign yet.', [
        { path: 'body.worksheetId', message: 'This worksheet has no drills to assign yet.' },
      ]);
    }
    if (!this.sources) throw new Error('Worksheet assignments need the drill sources');
    const drills: NewAssignmentDrill[] = [];
    for (const [index, item] of sheet.items.entries()) {
      const resolved = await resolveDrillSource(this.sources, teacher, item.source).catch(
        (error: unknown) => {
          if (!(error instanceof HttpError) || error.status !== 404) throw error;
          throw new HttpError(
            409,
            'not_assignable',
            `Drill ${index + 1} of this worksheet can no longer be opened: its preset has been withdrawn. Take it off the worksheet or choose another.`,
          );
        },
      );
      drills.push({
        title:
          item.source.kind === 'preset'
            ? `${resolved.title} (seed ${item.source.seed})`
            : resolved.title,
        drill: resolved.drill,
        ladder: { start: item.ladder.start, target: item.ladder.target },
      });
    }
    return {
      kind: 'worksheet',
      drillId: null,
      worksheetId: sheet.id,
      title: sheet.title,
      drills,
    };
  }

  async listForTeacher(
    teacherId: number,
    query: { page: number; pageSize: number; studentId?: number | undefined },
  ): Promise<Page<TeacherAssignment>> {
    const page = await this.repo.listForTeacher(teacherId, query);
    return { ...page, items: await this.withStudents(page.items) };
  }

  async getForTeacher(teacherId: number, id: number): Promise<TeacherAssignment> {
    const found = await this.repo.findForTeacher(teacherId, id);
    if (!found) throw assignmentNotFound();
    const [withStudents] = await this.withStudents([found]);
    return withStudents!;
  }

  /** The student's assignments, due soonest first, with their best tempo so far. */
  async listForStudent(studentId: number): Promise<StudentAssignment[]> {
    const records = await this.repo.listForStudent(studentId);
    const progress = await new PracticeRepository(this.db).progress(records.map((r) => r.id));
    return records.map((record) => this.forStudent(record, studentId, progress));
  }

  /**
   * One of the student's assignments with what to practise: the drill (its saved snapshot) or,
   * for a worksheet, each of its drills with the student's best tempo on it.
   */
  async getForStudent(
    studentId: number,
    id: number,
  ): Promise<
    StudentAssignment & { drill: Drill | null; drills: readonly StudentAssignmentDrill[] }
  > {
    const record = await this.repo.findForStudent(studentId, id);
    if (!record) throw assignmentNotFound();
    const practice = new PracticeRepository(this.db);
    const progress = await practice.progress([id]);
    const saved =
      record.drillId === null
        ? undefined
        : await new DrillsRepository(this.db).findShared(record.drillId);
    const perDrill = await practice.drillProgress(id, studentId);
    const drills = (await this.repo.drills([id])).map(({ assignmentId: _, ...d }) => {
      const mine = perDrill.find((p) => p.assignmentDrillId === d.id);
      return { ...d, bestTempo: mine?.bestTempo ?? null, logs: mine?.logs ?? 0 };
    });
    return {
      ...this.forStudent(record, studentId, progress),
      drill: saved?.snapshot ?? null,
      drills,
    };
  }

  async remove(teacherId: number, id: number): Promise<void> {
    if (!(await this.repo.remove(teacherId, id))) throw assignmentNotFound();
  }

  private forStudent(
    record: AssignmentRecord,
    studentId: number,
    progress: readonly AssignmentProgress[],
  ): StudentAssignment {
    const mine = progress.find((p) => p.assignmentId === record.id && p.studentId === studentId);
    const bestTempo = mine?.bestTempo ?? null;
    return {
      ...record,
      bestTempo,
      logs: mine?.logs ?? 0,
      status: assignmentStatus({ ...record, bestTempo, today: dayOf(this.now()) }),
    };
  }

  private async withStudents(records: readonly AssignmentRecord[]): Promise<TeacherAssignment[]> {
    const ids = records.map((r) => r.id);
    const students = await this.repo.students(ids);
    const drills = await this.repo.drills(ids);
    const progress = await new PracticeRepository(this.db).progress(ids);
    const today = dayOf(this.now());
    return records.map((record) => ({
      ...record,
      drills: drills
        .filter((d) => d.assignmentId === record.id)
        .map((d) => ({ id: d.id, position: d.position, title: d.title, ladder: d.ladder })),
      students: students
        .filter((s) => s.assignmentId === record.id)
        .map((s) => {
          const p = progress.find((x) => x.assignmentId === record.id && x.studentId === s.id);
          const bestTempo = p?.bestTempo ?? null;
          return {
            id: s.id,
            name: s.name,
            bestTempo,
            logs: p?.logs ?? 0,
            minutes: p?.minutes ?? 0,
            status: assignmentStatus({ ...record, bestTempo, today }),
          };
        }),
    }));
  }
}

export function assignmentNotFound(): HttpError {
  return notFound('No assignment with this id.');
}
