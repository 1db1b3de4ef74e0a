import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Title } from '@angular/platform-browser';
import { catchError, map, of, startWith, switchMap, tap } from 'rxjs';
import { apiErrorMessage } from '../core/api-error-message';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { SeedLinkApi, type SharedDrill } from './seed-link-api';

type LinkState =
  | { readonly status: 'loading' }
  | { readonly status: 'ready'; readonly drill: SharedDrill }
  | { readonly status: 'withdrawn' }
  | { readonly status: 'missing' }
  | { readonly status: 'error'; readonly message: string };

/**
 * `/s/:code`, outside the signed-in shell: a shared drill's notation (with its tension plot) and
 * playback, its title and the teacher's display name, nothing else of the teacher's.
 */
@Component({
  selector: 'tensile-seed-link-page',
  imports: [MatProgressBarModule, DrillScore, PlaybackPanel],
  templateUrl: './seed-link-page.html',
  styleUrl: './seed-link-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeedLinkPage {
  readonly code = input.required<string>();

  private readonly api = inject(SeedLinkApi);
  private readonly pageTitle = inject(Title);
  protected readonly cursor = signal<ScorePosition | null>(null);
  protected readonly state = toSignal(
    toObservable(this.code).pipe(
      switchMap((code) =>
        this.api.open(code).pipe(
          tap((drill) => this.pageTitle.setTitle(`Tensile · ${drill.title}`)),
          map((drill): LinkState => ({ status: 'ready', drill })),
          startWith<LinkState>({ status: 'loading' }),
          catchError((error: unknown) => of(failure(error))),
        ),
      ),
    ),
    { initialValue: { status: 'loading' } as LinkState },
  );
}

function failure(error: unknown): LinkState {
  if (error instanceof HttpErrorResponse && error.status === 410) return { status: 'withdrawn' };
  if (error instanceof HttpErrorResponse && error.status === 404) return { status: 'missing' };
  return { status: 'error', message: apiErrorMessage(error) };
}
