import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  Injector,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { Router } from '@angular/router';
import { switchMap } from 'rxjs';
import { AuthSession } from '../core/auth-session';
import { toLoadState, type LoadState } from '../core/load-state';
import type { Drill } from '../../../shared/generator/index';
import { generateFromCard } from './drill-result';
import { DrillsApi, type PresetDetail } from './drills-api';
import { ExportMenu } from '../exports/export-menu';
import { PlaybackPanel } from './playback/playback-panel';
import { isTypingTarget } from './playback/playback-keys';
import { RecentDrills } from './recent-drills';
import { SaveDrillButton } from '../saved-drills/save-drill-button';
import { DrillScore } from './score/drill-score';
import type { ScorePosition } from './score/score-layout';
import { MAX_SEED_LENGTH, seedErrorState, seedProblem } from './seed-problem';
import { freshSeed } from './seed-words';
import { asksForShortcuts } from './shortcuts/shortcut-list';
import { tensionScaleText } from './tension-words';

const SHORTCUTS_DIALOG = 'tensile-drill-shortcuts';

/**
 * `/drills/:cardId?seed=SEED`: one preset card's drill, generated in the browser, in notation with
 * its tension under every bar and the playback panel. The seed lives in the URL, so a reload or a
 * shared link reproduces the same drill.
 */
@Component({
  selector: 'tensile-drill-page',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSlideToggleModule,
    DrillScore,
    PlaybackPanel,
    SaveDrillButton,
    ExportMenu,
  ],
  templateUrl: './drill-page.html',
  styleUrl: './drill-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { '(document:keydown)': 'openShortcutsByKey($event)' },
})
export class DrillPage {
  /** Route parameter. */
  readonly cardId = input.required<string>();
  /** Query parameter `?seed=`. */
  readonly seed = input<string>();

  private readonly api = inject(DrillsApi);
  private readonly router = inject(Router);
  private readonly session = inject(AuthSession);
  private readonly recentDrills = inject(RecentDrills);
  private readonly injector = inject(Injector);
  private shortcutsOpening = false;

  protected readonly preset = toSignal(
    toObservable(this.cardId).pipe(switchMap((id) => toLoadState(this.api.preset(id)))),
    { initialValue: { status: 'loading' } as LoadState<PresetDetail> },
  );
  /** Teachers (and admins) pick seeds; students practise the drill they were given. */
  protected readonly canChooseSeed = computed(() => {
    const role = this.session.role();
    return role === 'teacher' || role === 'admin';
  });
  protected readonly activeSeed = computed(
    () => this.seed()?.trim().slice(0, MAX_SEED_LENGTH) || null,
  );
  protected readonly seedDraft = linkedSignal(() => this.activeSeed() ?? '');
  protected readonly seedProblem = computed(() => seedProblem(this.seedDraft()));
  protected readonly seedErrors = seedErrorState(this.seedProblem);
  protected readonly result = computed(() => {
    const preset = this.preset();
    const seed = this.activeSeed();
    if (preset.status !== 'ready' || seed === null) return null;
    return generateFromCard(preset.value.card, seed);
  });
  protected readonly drill = computed(() => {
    const result = this.result();
    return result?.status === 'ready' ? result.drill : null;
  });
  /** The beat picked on the score (click, tap or arrow keys): Play starts there. */
  protected readonly picked = signal<ScorePosition | null>(null);
  /** The beat being heard while playing. */
  protected readonly heard = signal<ScorePosition | null>(null);
  /** The score's highlight: what is heard while playing, else the picked beat. */
  protected readonly cursor = computed(() => this.heard() ?? this.picked());
  /** The tempo heard now, or that Play would start at, as the playback panel reports it. */
  protected readonly tempoInUse = signal<number | null>(null);
  protected readonly tensionScale = tensionScaleText();
  protected readonly showSticking = signal(true);
  protected readonly showCounts = signal(true);

  constructor() {
    // A link without a seed gets one at once, written into the URL so a reload keeps the drill.
    effect(() => {
      if (this.seed() === undefined || this.activeSeed() === null) this.useSeed(freshSeed(), true);
    });
    // Every drill actually shown goes to the top of this browser's recent drills (see /drills).
    effect(() => {
      const preset = this.preset();
      const drill = this.drill();
      const seed = this.activeSeed();
      if (preset.status !== 'ready' || drill === null || seed === null) return;
      const { id: cardId, title } = preset.value;
      untracked(() => this.recentDrills.record({ cardId, title, seed }));
    });
  }

  /** Whether the card sets a tension curve (its targets are drawn under the bars). */
  protected hasTarget(drill: Drill): boolean {
    return drill.card.rules.some((rule) => rule.kind === 'tension');
  }

  /** Generate again with the seed typed in the field. */
  protected regenerate(): void {
    const seed = this.seedDraft().trim();
    if (seedProblem(seed) === null) this.useSeed(seed);
  }

  /** Draw a new random seed and generate its drill. */
  protected newSeed(): void {
    this.useSeed(freshSeed());
  }

  /** The dialog code loads on first use: the score's path does not need it. */
  protected async openShortcuts(): Promise<void> {
    if (this.shortcutsOpening) return;
    this.shortcutsOpening = true;
    try {
      const [{ MatDialog }, { ShortcutHelp }] = await Promise.all([
        import('@angular/material/dialog'),
        import('./shortcuts/shortcut-help'),
      ]);
      const dialog = this.injector.get(MatDialog);
      if (dialog.getDialogById(SHORTCUTS_DIALOG)) return;
      dialog.open(ShortcutHelp, { id: SHORTCUTS_DIALOG, autoFocus: 'dialog', maxWidth: '36rem' });
    } finally {
      this.shortcutsOpening = false;
    }
  }

  protected openShortcutsByKey(event: KeyboardEvent): void {
    if (!asksForShortcuts(event) || isTypingTarget(event.target)) return;
    event.preventDefault();
    void this.openShortcuts();
  }

  private useSeed(seed: string, replaceUrl = false): void {
    this.picked.set(null);
    void this.router.navigate([], {
      queryParams: { seed },
      queryParamsHandling: 'merge',
      replaceUrl,
    });
  }
}
