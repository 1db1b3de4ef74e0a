import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import type { Drill } from '../../../shared/generator/index';

/** Where a student stands on an assignment. */
export type AssignmentStatus = 'not_started' | 'practising' | 'target_reached' | 'overdue';

export const STATUS_LABEL: Readonly<Record<AssignmentStatus, string>> = {
  not_started: 'Not started',
  practising: 'Practising',
  target_reached: 'Target reached',
  overdue: 'Overdue',
};

/** An assignment as its student sees it. */
export interface MyAssignment {
  readonly id: number;
  readonly kind: 'drill' | 'worksheet';
  readonly title: string;
  readonly teacherName: string | null;
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
  readonly status: AssignmentStatus;
  readonly bestTempo: number | null;
  readonly logs: number;
}

/** One drill of a worksheet assignment, with the student's best tempo on it. */
export interface MyAssignmentDrill {
  readonly id: number;
  readonly position: number;
  readonly title: string;
  readonly drill: Drill;
  readonly ladder: { readonly start: number; readonly target: number };
  readonly bestTempo: number | null;
  readonly logs: number;
}

/** An assignment with what to practise: its drill, or a worksheet's drills. */
export type MyAssignmentDetail = MyAssignment & {
  readonly drill: Drill | null;
  readonly drills: readonly MyAssignmentDrill[];
};

/** One logged practice session. */
export interface PracticeLog {
  readonly id: number;
  readonly studentId: number;
  readonly assignmentId: number | null;
  readonly assignmentTitle: string | null;
  readonly assignmentDrillId: number | null;
  readonly minutes: number;
  readonly tempo: number;
  readonly rating: number;
  readonly note: string;
  readonly practisedAt: string;
}

export interface NewPracticeLog {
  readonly assignmentId: number | null;
  /** Which drill of a worksheet assignment was practised. */
  readonly assignmentDrillId: number | null;
  readonly minutes: number;
  readonly tempo: number;
  readonly rating: number;
  readonly note: string;
}

/** Chart data from the server. */
export interface Progress {
  readonly tempo: readonly {
    practisedAt: string;
    tempo: number;
    studentId: number;
    assignmentId: number | null;
  }[];
  readonly minutesPerWeek: readonly { weekStart: string; minutes: number }[];
}

export interface LogPage {
  readonly items: readonly PracticeLog[];
  readonly total: number;
  readonly page: number;
  readonly pageSize: number;
}

/** HTTP calls for practice: the student's assignments, logs and progress (teachers read too). */
@Injectable({ providedIn: 'root' })
export class PracticeApi {
  private readonly http = inject(HttpClient);

  myAssignments(): Observable<readonly MyAssignment[]> {
    return this.http
      .get<{ assignments: readonly MyAssignment[] }>('/api/assignments/mine')
      .pipe(map((body) => body.assignments));
  }

  myAssignment(id: string): Observable<MyAssignmentDetail> {
    return this.http
      .get<{
        assignment: MyAssignmentDetail;
      }>(`/api/assignments/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.assignment));
  }

  log(entry: NewPracticeLog): Observable<PracticeLog> {
    return this.http
      .post<{ log: PracticeLog }>('/api/practice/logs', entry)
      .pipe(map((body) => body.log));
  }

  logs(query: { studentId?: number; assignmentId?: number; page?: number; pageSize?: number }) {
    return this.http.get<LogPage>('/api/practice/logs', { params: params(query) });
  }

  progress(query: { studentId?: number; assignmentId?: number }): Observable<Progress> {
    return this.http
      .get<{ progress: Progress }>('/api/practice/progress', { params: params(query) })
      .pipe(map((body) => body.progress));
  }
}

function params(query: Record<string, number | undefined>): HttpParams {
  let result = new HttpParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined) result = result.set(key, String(value));
  }
  return result;
}
