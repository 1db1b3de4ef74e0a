import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { LogPractice } from '../practice/log-practice';
import { PracticeApi, STATUS_LABEL, type MyAssignmentDetail } from '../practice/practice-api';
import type { Drill } from '../../../shared/generator/index';

/** What the page drills: the assignment's drill, or the chosen drill of its worksheet. */
interface OnStand {
  readonly drill: Drill | null;
  readonly assignmentDrillId: number | null;
}

/**
 * `/assignments/:id`: the assigned drill (as the teacher saved it) with playback, the target,
 * and the log practice form, its tempo pre-filled from the fastest tempo played back. For a
 * worksheet, `?drill=<id>` picks which of its drills is on the stand (the first by default), and
 * each log names that drill.
 */
@Component({
  selector: 'tensile-assignment-page',
  imports: [MatProgressBarModule, RouterLink, DrillScore, PlaybackPanel, LogPractice],
  templateUrl: './assignment-page.html',
  styleUrl: './assignment-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AssignmentPage {
  readonly id = input.required<string>();
  /** The query parameter `drill`: a worksheet drill's id. */
  readonly drill = input<string | undefined>();
  private readonly api = inject(PracticeApi);
  private readonly version = signal(0);
  protected readonly statusLabel = STATUS_LABEL;
  protected readonly assignment = toSignal(
    toObservable(this.id).pipe(switchMap((id) => toLoadState(this.api.myAssignment(id)))),
    { initialValue: { status: 'loading' } as LoadState<MyAssignmentDetail> },
  );
  protected readonly standing = toSignal(
    toObservable(this.version).pipe(switchMap(() => this.api.myAssignment(this.id()))),
  );
  /** The drill on the stand. */
  protected readonly onStand = computed<OnStand | null>(() => {
    const state = this.assignment();
    if (state.status !== 'ready') return null;
    const a = state.value;
    if (a.kind !== 'worksheet') return { drill: a.drill, assignmentDrillId: null };
    const chosen = a.drills.find((d) => String(d.id) === this.drill()) ?? a.drills[0];
    return { drill: chosen?.drill ?? null, assignmentDrillId: chosen?.id ?? null };
  });
  /** Each worksheet drill's best tempo and logs, refreshed after a log. */
  protected readonly drillStanding = computed(() => {
    const fresh = this.standing();
    const state = this.assignment();
    return fresh?.drills ?? (state.status === 'ready' ? state.value.drills : []);
  });

  protected readonly cursor = signal<ScorePosition | null>(null);
  /** The fastest tempo heard in playback this visit (the tempo trainer raises it). */
  protected readonly fastestHeard = signal<number | null>(null);

  protected heardTempo(bpm: number | null): void {
    if (bpm !== null) this.fastestHeard.update((best) => Math.max(best ?? 0, bpm));
  }

  /** A new drill on the stand starts from the top, with its own fastest tempo. */
  protected changedDrill(): void {
    this.cursor.set(null);
    this.fastestHeard.set(null);
  }

  protected refresh(): void {
    this.version.update((v) => v + 1);
  }
}
