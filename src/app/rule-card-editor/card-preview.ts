import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { PlaybackPanel } from '../drills/playback/playback-panel';
import { DrillScore } from '../drills/score/drill-score';
import type { ScorePosition } from '../drills/score/score-layout';
import { freshSeed } from '../drills/seed-words';
import { CardEditorStore } from './card-editor-store';
import { unplacedIssues } from './card-preview-outcome';

/** Fields the form shows messages beside; anything else is listed above the preview. */
const PLACED = [
  'meter.beats',
  'bars',
  'tempo',
  'subdivision',
  'voices',
  'density',
  'swing',
  'ostinato',
  'rules',
];

/**
 * The live preview beside the form: the drill in notation with its tension against the target,
 * and playback. While the card is invalid the last good drill stays, marked out of date.
 */
@Component({
  selector: 'tensile-card-preview',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, DrillScore, PlaybackPanel],
  templateUrl: './card-preview.html',
  styleUrl: './card-preview.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CardPreview {
  protected readonly store = inject(CardEditorStore);
  protected readonly cursor = signal<ScorePosition | null>(null);
  protected readonly outcome = this.store.outcome;
  protected readonly drill = this.store.lastGood;
  protected readonly stale = this.store.stale;
  protected readonly headline = computed(() => {
    const outcome = this.outcome();
    switch (outcome?.status) {
      case 'invalid':
        return 'The card needs a change: see the messages beside the fields.';
      case 'conflict':
        return `These rules cannot all hold at once. ${outcome.message}`;
      case 'failed':
        return outcome.message;
      default:
        return null;
    }
  });
  protected readonly otherIssues = computed(() => unplacedIssues(this.outcome(), PLACED));

  protected readonly barNumbers = computed(() => this.drill()?.bars.map((bar) => bar.bar) ?? []);

  /** A new seed for every bar that is not pinned. */
  protected newSeed(): void {
    this.cursor.set(null);
    this.store.seed.set(freshSeed());
  }
}
