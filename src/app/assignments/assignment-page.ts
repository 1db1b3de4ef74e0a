import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { toLoadState, type LoadState } from '../core/load-state';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { LogPractice } from '../practice/log-practice';
import { PracticeApi, STATUS_LABEL, type MyAssignment } from '../practice/practice-api';
import type { Drill } from '../../../shared/generator/index';

type Loaded = MyAssignment & { drill: Drill | null };

/**
 * `/assignments/:id`: the assigned drill (as the teacher saved it) with playback, the target,
 * and the log practice form, its tempo pre-filled from the fastest tempo played back.
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
  private readonly api = inject(PracticeApi);
  private readonly version = signal(0);
  protected readonly statusLabel = STATUS_LABEL;
  protected readonly assignment = toSignal(
    toObservable(this.id).pipe(switchMap((id) => toLoadState(this.api.myAssignment(id)))),
    { initialValue: { status: 'loading' } as LoadState<Loaded> },
  );
  protected readonly standing = toSignal(
    toObservable(this.version).pipe(switchMap(() => this.api.myAssignment(this.id()))),
  );
  protected readonly cursor = signal<ScorePosition | null>(null);
  /** The fastest tempo heard in playback this visit (the tempo trainer raises it). */
  protected readonly fastestHeard = signal<number | null>(null);

  protected heardTempo(bpm: number | null): void {
    if (bpm !== null) this.fastestHeard.update((best) => Math.max(best ?? 0, bpm));
  }

  protected refresh(): void {
    this.version.update((v) => v + 1);
  }
}
