import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import type { PracticeLog } from './practice-api';

/** A table of practice sessions, newest first (the student's history, the teacher's view). */
@Component({
  selector: 'tensile-practice-log-table',
  imports: [DatePipe, MatTableModule],
  template: `
    <div class="table-frame">
      <table mat-table [dataSource]="logs()" [attr.aria-label]="label()">
        <ng-container matColumnDef="date">
          <th mat-header-cell *matHeaderCellDef scope="col">Date</th>
          <td mat-cell *matCellDef="let log">{{ log.practisedAt | date: 'mediumDate' }}</td>
        </ng-container>
        <ng-container matColumnDef="assignment">
          <th mat-header-cell *matHeaderCellDef scope="col">Assignment</th>
          <td mat-cell *matCellDef="let log">{{ log.assignmentTitle ?? 'Free practice' }}</td>
        </ng-container>
        <ng-container matColumnDef="minutes">
          <th mat-header-cell *matHeaderCellDef scope="col">Minutes</th>
          <td mat-cell *matCellDef="let log">{{ log.minutes }}</td>
        </ng-container>
        <ng-container matColumnDef="tempo">
          <th mat-header-cell *matHeaderCellDef scope="col">Clean tempo</th>
          <td mat-cell *matCellDef="let log">{{ log.tempo }} BPM</td>
        </ng-container>
        <ng-container matColumnDef="rating">
          <th mat-header-cell *matHeaderCellDef scope="col">Rating</th>
          <td mat-cell *matCellDef="let log">{{ log.rating }} / 5</td>
        </ng-container>
        <ng-container matColumnDef="note">
          <th mat-header-cell *matHeaderCellDef scope="col">Note</th>
          <td mat-cell *matCellDef="let log">{{ log.note }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
    </div>
  `,
  styles: `
    .table-frame {
      overflow-x: auto;
      border: 1px solid var(--tensile-rule);
      border-radius: var(--tensile-radius);
    }
    table {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PracticeLogTable {
  readonly logs = input.required<readonly PracticeLog[]>();
  readonly label = input('Practice history');
  protected readonly columns = ['date', 'assignment', 'minutes', 'tempo', 'rating', 'note'];
}
