import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatListModule } from '@angular/material/list';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTabsModule } from '@angular/material/tabs';
import { map, switchMap } from 'rxjs';
import { toLoadState, loadStateSignal } from '../core/load-state';
import { apiErrorMessage } from '../core/api-error-message';
import { CuratedPresetsApi, type PresetView } from '../presets/presets-api';
import { debounced } from '../rule-cards/debounced';
import { inputText } from '../rule-cards/input-text';
import { freshSeedWord } from '../rule-cards/seed-word';
import { SavedDrillsApi, type SavedDrillSummary } from '../saved-drills/saved-drills-api';
import type { ItemSource } from './worksheets-api';

/** What the picker answers: the chosen drill, with what the editor shows of it. */
export interface PickedItem {
  readonly source: ItemSource;
  readonly title: string;
  readonly tempo: number;
}

const FALLBACK_TEMPO = 90;

/** Adds a drill to a worksheet: one of the teacher's saved drills, or a preset at a seed. */
@Component({
  selector: 'tensile-item-picker',
  imports: [
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatListModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTabsModule,
  ],
  templateUrl: './item-picker.html',
  styles: `
    .pane {
      display: grid;
      gap: 8px;
      padding-top: 12px;
      min-width: min(480px, 80vw);
    }
    .choices {
      max-height: 320px;
      overflow-y: auto;
    }
    .seed-row {
      display: flex;
      gap: 8px;
      align-items: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ItemPicker {
  private readonly ref = inject<MatDialogRef<ItemPicker, PickedItem>>(MatDialogRef);
  private readonly drillsApi = inject(SavedDrillsApi);
  private readonly presetsApi = inject(CuratedPresetsApi);

  protected readonly q = signal('');
  private readonly typedQ = debounced(this.q, 200);
  protected readonly drills = toSignal(
    toObservable(this.typedQ).pipe(
      switchMap((q) =>
        toLoadState(this.drillsApi.list({ q: q.trim(), pageSize: 50, sort: 'updatedAt' })),
      ),
    ),
    { initialValue: { status: 'loading' } },
  );
  protected readonly drillRows = computed(() => {
    const state = this.drills();
    return state.status === 'ready' ? state.value.items : [];
  });
  protected readonly presets = loadStateSignal(this.presetsApi.list({}));
  protected readonly presetRows = computed(() => {
    const state = this.presets();
    return state.status === 'ready' ? state.value : [];
  });
  protected readonly presetId = signal('');
  protected readonly seed = signal(freshSeedWord());
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);

  protected readonly inputText = inputText;

  /** A saved drill's tempo lives in its snapshot, which the list leaves out: read it first. */
  protected pickDrill(drill: SavedDrillSummary): void {
    this.busy.set(true);
    this.drillsApi
      .get(drill.id)
      .pipe(map((saved) => saved.snapshot.card.tempo))
      .subscribe({
        next: (tempo) =>
          this.ref.close({
            source: { kind: 'saved', drillId: Number(drill.id) },
            title: drill.title,
            tempo,
          }),
        error: (error: unknown) => {
          this.busy.set(false);
          this.problem.set(apiErrorMessage(error));
        },
      });
  }

  protected pickPreset(): void {
    const preset = this.presetRows().find((p) => p.id === this.presetId());
    const seed = this.seed().trim();
    if (!preset || !seed) return;
    this.ref.close({
      source: { kind: 'preset', presetId: preset.id, seed },
      title: `${preset.title} (seed ${seed})`,
      tempo: tempoOf(preset),
    });
  }

  protected newSeed(): void {
    this.seed.set(freshSeedWord());
  }
}

function tempoOf(preset: PresetView): number {
  const tempo = (preset.card as { tempo?: unknown } | null)?.tempo;
  return typeof tempo === 'number' ? tempo : FALLBACK_TEMPO;
}
