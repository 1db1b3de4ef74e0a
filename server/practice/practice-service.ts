import type { Knex } from 'knex';
import { AssignmentsRepository } from '../assignments/assignments-repository';
import type { PublicUser } from '../auth/roles';
import { HttpError, notFound } from '../http-error';
import type { Page } from '../paging';
import { StudioRepository } from '../studio/studio-repository';
import { PracticeRepository, type PracticeLog } from './practice-repository';
import { minutesPerWeek } from './practice-stats';

export interface LogInput {
  readonly assignmentId: number | null;
  /** Which drill of a worksheet assignment; required for those, refused for others. */
  readonly assignmentDrillId: number | null;
  readonly minutes: number;
  readonly tempo: number;
  readonly rating: number;
  readonly note: string;
}

/** Chart data: each log's clean tempo over time, and minutes per ISO week. */
export interface Progress {
  readonly tempo: readonly {
    practisedAt: string;
    tempo: number;
    studentId: number;
    assignmentId: number | null;
  }[];
  readonly minutesPerWeek: readonly { weekStart: string; minutes: number }[];
}

/**
 * Practice logs. A student writes and reads only their own; a teacher reads those of students
 * in their studio (removed ones too: the history stays). Anything else answers 404.
 */
export class PracticeService {
  constructor(
    private readonly db: Knex,
    private readonly now: () => Date = () => new Date(),
  ) {}

  private get logs(): PracticeRepository {
    return new PracticeRepository(this.db);
  }

  async log(student: PublicUser, input: LogInput): Promise<PracticeLog> {
    if (input.assignmentId === null) {
      if (input.assignmentDrillId !== null) {
        throw invalidField('body.assignmentDrillId', 'A worksheet drill needs its assignment id.');
      }
    } else {
      const assignments = new AssignmentsRepository(this.db);
      const assignment = await assignments.findForStudent(student.id, input.assignmentId);
      if (!assignment) {
        throw new HttpError(404, 'not_found', 'No assignment with this id.', [
          { path: 'body.assignmentId', message: 'No assignment with this id.' },
        ]);
      }
      if (assignment.kind === 'worksheet') {
        if (input.assignmentDrillId === null) {
          throw invalidField(
            'body.assignmentDrillId',
            'Say which drill of the worksheet you practised.',
          );
        }
        const drills = await assignments.drills([assignment.id]);
        if (!drills.some((d) => d.id === input.assignmentDrillId)) {
          throw new HttpError(404, 'not_found', 'No drill with this id in the assignment.', [
            { path: 'body.assignmentDrillId', message: 'No drill with this id in the assignment.' },
          ]);
        }
      } else if (input.assignmentDrillId !== null) {
        throw invalidField('body.assignmentDrillId', 'This assignment is a single drill.');
      }
    }
    const id = await this.logs.insert({ ...input, studentId: student.id, practisedAt: this.now() });
    return (await this.logs.find(id))!;
  }

  async list(
    viewer: PublicUser,
    query: {
      page: number;
      pageSize: number;
      studentId?: number | undefined;
      assignmentId?: number | undefined;
    },
  ): Promise<Page<PracticeLog>> {
    const studentId = await this.readableStudent(viewer, query.studentId);
    return this.logs.list(studentId, query);
  }

  async get(viewer: PublicUser, id: number): Promise<PracticeLog> {
    const log = await this.logs.find(id);
    if (!log || !(await this.canRead(viewer, log.studentId)))
      throw notFound('No practice log with this id.');
    return log;
  }

  async progress(
    viewer: PublicUser,
    query: { studentId?: number | undefined; assignmentId?: number | undefined },
  ): Promise<Progress> {
    let logs: PracticeLog[];
    if (viewer.role === 'teacher' && query.assignmentId !== undefined) {
      const own = await new AssignmentsRepository(this.db).findForTeacher(
        viewer.id,
        query.assignmentId,
      );
      if (!own) throw notFound('No assignment with this id.');
      logs = await this.logs.allFor({ assignmentId: query.assignmentId });
      if (query.studentId !== undefined) logs = logs.filter((l) => l.studentId === query.studentId);
    } else {
      const studentId = await this.readableStudent(viewer, query.studentId);
      if (query.assignmentId !== undefined) {
        const mine = await new AssignmentsRepository(this.db).findForStudent(
          studentId,
          query.assignmentId,
        );
        if (!mine) throw notFound('No assignment with this id.');
        logs = await this.logs.allFor({
          studentIds: [studentId],
          assignmentId: query.assignmentId,
        });
      } else {
        logs = await this.logs.allFor({ studentIds: [studentId] });
      }
    }
    return {
      tempo: logs.map((l) => ({
        practisedAt: l.practisedAt,
        tempo: l.tempo,
        studentId: l.studentId,
        assignmentId: l.assignmentId,
      })),
      minutesPerWeek: minutesPerWeek(logs),
    };
  }

  /** The student whose logs the viewer asks for, or 400/404. */
  private async readableStudent(
    viewer: PublicUser,
    studentId: number | undefined,
  ): Promise<number> {
    if (viewer.role === 'student') {
      if (studentId !== undefined && studentId !== viewer.id)
        throw notFound('No student with this id.');
      return viewer.id;
    }
    if (studentId === undefined) {
      throw new HttpError(400, 'validation_failed', 'Choose a student.', [
        { path: 'query.studentId', message: 'Choose a student.' },
      ]);
    }
    if (!(await this.canRead(viewer, studentId)))
      throw notFound('No student with this id in your studio.');
    return studentId;
  }

  private async canRead(viewer: PublicUser, studentId: number): Promise<boolean> {
    if (viewer.role === 'student') return viewer.id === studentId;
    return new StudioRepository(this.db).has(viewer.id, studentId, true);
  }
}

function invalidField(path: string, message: string): HttpError {
  return new HttpError(400, 'validation_failed', message, [{ path, message }]);
}
