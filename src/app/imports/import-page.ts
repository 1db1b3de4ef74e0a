import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { Subscription } from 'rxjs';
import type { MidiImport } from '../../../shared/formats/midi-import/index';
import { apiErrorMessage } from '../core/api-error-message';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { tensionWord } from '../drills/tension-words';
import { TeacherCardsApi } from '../rule-cards/rule-cards-api';
import { ImportsApi, type UploadState } from './imports-api';
import { beatResidualWords, residualSummary, subdivisionWords, worstBeats } from './residual-words';

/** The title a file suggests: its name without the extension, or a plain default. */
function titleOf(name: string): string {
  const bare = name
    .replace(/\.(mid|midi|smf)$/i, '')
    .replace(/[_-]+/g, ' ')
    .trim();
  return (bare || 'Imported groove').slice(0, 120);
}

/**
 * `/imports`: a teacher uploads a Standard MIDI File; the server reads its drum part as a drill
 * and infers a rule card. The page draws the drill with playback, says how far the playing lay
 * from the grid, and saves it as a drill or turns the card into a rule card for the editor.
 */
@Component({
  selector: 'tensile-import-page',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
    DrillScore,
    PlaybackPanel,
  ],
  templateUrl: './import-page.html',
  styleUrl: './import-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportPage {
  private readonly api = inject(ImportsApi);
  private readonly cards = inject(TeacherCardsApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly file = signal<File | null>(null);
  /** The track the teacher chose; null reads every channel-10 track. */
  protected readonly track = signal<number | null>(null);
  protected readonly upload = signal<UploadState<MidiImport> | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly title = signal('');
  protected readonly dragging = signal(false);
  protected readonly busy = signal<'saving' | 'card' | null>(null);
  protected readonly saved = signal<{ id: number | string; title: string } | null>(null);
  protected readonly cursor = signal<ScorePosition | null>(null);
  private request: Subscription | null = null;

  protected readonly groove = computed(() => {
    const state = this.upload();
    return state?.phase === 'done' ? state.value : null;
  });
  protected readonly working = computed(() => {
    const state = this.upload();
    return state && state.phase !== 'done' ? state : null;
  });
  protected readonly facts = computed(() => {
    const groove = this.groove();
    if (!groove) return null;
    const { meter, tempo, bars, subdivision } = groove.card;
    const grid =
      typeof subdivision === 'number'
        ? subdivisionWords(subdivision, meter.unit)
        : `${subdivision.join('+')} slots`;
    return `${meter.beats}/${meter.unit}, ${tempo} beats a minute, ${bars} bar${bars === 1 ? '' : 's'}; card grid: ${grid}.`;
  });
  protected readonly residualLine = computed(() => {
    const groove = this.groove();
    return groove ? residualSummary(groove.residuals) : '';
  });
  protected readonly worst = computed(() => {
    const groove = this.groove();
    if (!groove) return [];
    return worstBeats(groove.residuals).map((r) => beatResidualWords(r, groove.card.meter.unit));
  });
  protected readonly tensionLines = computed(() =>
    (this.groove()?.tensions ?? []).map(
      (t, i) => `Bar ${i + 1}: ${tensionWord(t)} (${t.toFixed(2)})`,
    ),
  );

  protected choose(input: HTMLInputElement): void {
    const file = input.files?.[0];
    input.value = '';
    if (file) this.start(file, null);
  }

  protected drop(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files[0];
    if (file) this.start(file, null);
  }

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(true);
  }

  protected chooseTrack(track: number | null): void {
    const file = this.file();
    if (file) this.start(file, track);
  }

  protected cancel(): void {
    this.request?.unsubscribe();
    this.request = null;
    this.upload.set(null);
  }

  protected save(): void {
    const file = this.file();
    const title = this.title().trim();
    if (!file || !title) return;
    this.busy.set('saving');
    this.api.save(file, this.track(), title).subscribe({
      next: (drill) => {
        this.busy.set(null);
        this.saved.set({ id: drill.id, title: drill.title });
        this.snackBar.open(`Saved "${drill.title}" to your drills.`, undefined, { duration: 3000 });
      },
      error: (error: unknown) => {
        this.busy.set(null);
        this.snackBar.open(apiErrorMessage(error), 'Dismiss');
      },
    });
  }

  /** Stores the inferred card as a rule card and opens it in the editor. */
  protected makeCard(): void {
    const groove = this.groove();
    const title = this.title().trim() || 'Imported groove';
    if (!groove) return;
    this.busy.set('card');
    this.cards.create({ title: `${title} (card)`, card: groove.card }).subscribe({
      next: (card) => {
        this.busy.set(null);
        void this.router.navigate(['/rule-cards', card.id]);
      },
      error: (error: unknown) => {
        this.busy.set(null);
        this.snackBar.open(apiErrorMessage(error), 'Dismiss');
      },
    });
  }

  private start(file: File, track: number | null): void {
    this.request?.unsubscribe();
    this.file.set(file);
    this.track.set(track);
    this.problem.set(null);
    this.saved.set(null);
    this.cursor.set(null);
    if (track === null) this.title.set(titleOf(file.name));
    this.upload.set({ phase: 'sending', share: null });
    this.request = this.api.preview(file, track).subscribe({
      next: (state) => this.upload.set(state),
      error: (error: unknown) => {
        this.upload.set(null);
        this.problem.set(apiErrorMessage(error));
      },
    });
  }
}
