import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import type { AssignmentStatus } from '../practice/practice-api';

/** One line of the teacher's roster. */
export interface RosterStudent {
  readonly id: number;
  readonly name: string;
  readonly email: string;
  readonly status: 'active' | 'invited' | 'removed';
  readonly removedAt: string | null;
  readonly lastPractice: string | null;
  readonly openAssignments: number;
  readonly streak: number;
}

/** A student's standing on an assignment, as the teacher sees it. */
export interface StudentStanding {
  readonly id: number;
  readonly name: string;
  readonly status: AssignmentStatus;
  readonly bestTempo: number | null;
  readonly logs: number;
  readonly minutes: number;
}

/** A drill of a worksheet assignment (copied from the worksheet when assigned). */
export interface AssignmentDrillSummary {
  readonly id: number;
  readonly position: number;
  readonly title: string;
  readonly ladder: { readonly start: number; readonly target: number };
}
export interface TeacherAssignment {
  readonly id: number;
  readonly kind: 'drill' | 'worksheet';
  readonly drillId: number | null;
  readonly worksheetId: number | null;
  readonly drills: readonly AssignmentDrillSummary[];
  readonly title: string;
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
  readonly students: readonly StudentStanding[];
}

export interface NewAssignment {
  /** Exactly one of a saved drill and a worksheet. */
  readonly drillId?: number;
  readonly worksheetId?: number;
  readonly studentIds: readonly number[];
  readonly dueDate: string;
  readonly startTempo: number;
  readonly targetTempo: number;
  readonly note: string;
}

/** What inviting did. */
export interface InviteResult {
  readonly student: RosterStudent;
  readonly outcome: 'invited' | 'resent' | 'rejoined';
}
/** A saved drill or worksheet to pick when assigning. */
export interface DrillChoice {
  readonly id: number;
  readonly title: string;
}

/** HTTP calls for the teacher's studio: roster, invitations and assignments. */
@Injectable({ providedIn: 'root' })
export class StudioApi {
  private readonly http = inject(HttpClient);

  roster(): Observable<readonly RosterStudent[]> {
    return this.http
      .get<{ students: readonly RosterStudent[] }>('/api/studio/students')
      .pipe(map((body) => body.students));
  }

  /** Invites a new address, resends a pending invitation or brings a removed student back. */
  invite(name: string, email: string): Observable<InviteResult> {
    return this.http.post<InviteResult>('/api/studio/students', { name, email });
  }
  resendInvitation(id: number): Observable<RosterStudent> {
    return this.http
      .post<{ student: RosterStudent }>(`/api/studio/students/${id}/invitation`, {})
      .pipe(map((body) => body.student));
  }

  remove(id: number): Observable<void> {
    return this.http.delete<void>(`/api/studio/students/${id}`);
  }

  assignments(studentId?: number): Observable<readonly TeacherAssignment[]> {
    const query = studentId === undefined ? '' : `&studentId=${studentId}`;
    return this.http
      .get<{ items: readonly TeacherAssignment[] }>(`/api/assignments?pageSize=100${query}`)
      .pipe(map((body) => body.items));
  }

  assignment(id: string): Observable<TeacherAssignment> {
    return this.http
      .get<{ assignment: TeacherAssignment }>(`/api/assignments/${encodeURIComponent(id)}`)
      .pipe(map((body) => body.assignment));
  }

  assign(input: NewAssignment): Observable<TeacherAssignment> {
    return this.http
      .post<{ assignment: TeacherAssignment }>('/api/assignments', input)
      .pipe(map((body) => body.assignment));
  }

  removeAssignment(id: number): Observable<void> {
    return this.http.delete<void>(`/api/assignments/${id}`);
  }

  drills(): Observable<readonly DrillChoice[]> {
    return this.http
      .get<{ items: readonly DrillChoice[] }>('/api/drills?pageSize=100&sort=title')
      .pipe(map((body) => body.items));
  }
  worksheets(): Observable<readonly (DrillChoice & { itemCount: number })[]> {
    return this.http
      .get<{
        items: readonly (DrillChoice & { itemCount: number })[];
      }>('/api/worksheets?pageSize=100&sort=title&direction=asc')
      .pipe(map((body) => body.items));
  }
}
