import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  afterNextRender,
  afterRenderEffect,
  computed,
  effect,
  inject,
  input,
  model,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { Drill } from '../../../../shared/generator/index';
import {
  buildNotation,
  groupingLabel,
  type NotationModel,
} from '../../../../shared/notation/notation-model';
import { onCardScale, targetTension } from '../drill-result';
import { TensionPlot } from '../tension-plot/tension-plot';
import {
  cursorBox,
  fitToWidth,
  stepPosition,
  type ScoreLayout,
  type ScorePosition,
} from './score-layout';

/** Room under each system for the tension plots, in pixels. */
const PLOT_ROOM = 52;
const RESIZE_DEBOUNCE_MS = 150;

/**
 * The drill in drum-set notation. VexFlow is loaded on first use (dynamic import), so it stays out
 * of the initial bundle; the score re-flows into systems whenever its width changes.
 */
@Component({
  selector: 'tensile-drill-score',
  imports: [MatSlideToggleModule, TensionPlot],
  templateUrl: './drill-score.html',
  styleUrl: './drill-score.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    tabindex: '0',
    role: 'group',
    '[attr.aria-label]': 'label()',
    '(keydown)': 'moveCursor($event)',
  },
})
export class DrillScore {
  readonly drill = input.required<Drill>();
  readonly cursor = input<ScorePosition | null>(null);
  readonly showSticking = input(true);
  readonly showCounts = input(true);
  /** Mark the notes that make each bar tense (on by default on screen; print leaves it out). */
  readonly showTension = model(true);
  /** A beat picked on the score with the arrow keys (a reading cursor while not playing). */
  readonly cursorMoved = output<ScorePosition | null>();

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly canvas = viewChild.required<ElementRef<HTMLDivElement>>('canvas');
  private readonly width = signal(0);
  private renderToken = 0;

  protected readonly layout = signal<ScoreLayout | null>(null);
  /** The engraving's full width and the factor that fits it into the host (1 when it fits). */
  protected readonly fit = signal({ contentWidth: 0, scale: 1 });
  protected readonly failure = signal<string | null>(null);
  protected readonly model = computed(() => buildNotation(this.drill()));
  protected readonly highlight = computed(() => {
    const layout = this.layout();
    return layout ? cursorBox(layout, this.cursor()) : null;
  });
  protected readonly plots = computed(() => {
    const layout = this.layout();
    if (!layout) return [];
    const drill = this.drill();
    return layout.bars.map((box) => ({
      bar: box.bar,
      x: box.x,
      y: box.systemBottom,
      width: box.width,
      tension: drill.bars.find((b) => b.bar === box.bar)?.tension ?? 0,
      onScale: onCardScale(drill, drill.bars.find((b) => b.bar === box.bar)?.tension ?? 0),
      target: targetTension(drill, box.bar),
    }));
  });
  protected readonly label = computed(() => {
    const model = this.model();
    const { meter, bars } = model;
    // An uneven grouping is read out as it is printed over the time signature ("2+2+3").
    const grouping = groupingLabel(model);
    const signature = `${meter.beats}/${meter.unit}${grouping ? ` (${grouping})` : ''}`;
    return `Drum notation: ${bars.length} bars of ${signature}. Left and right arrows step through the beats.`;
  });
  protected readonly plotRoom = PLOT_ROOM;
  /** The system (line) the cursor is on: changes only when the cursor moves to another line. */
  private readonly cursorSystem = computed(() => {
    const layout = this.layout();
    const at = this.cursor();
    return (layout && at && layout.bars.find((b) => b.bar === at.bar)?.system) ?? null;
  });

  constructor() {
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      let timer: ReturnType<typeof setTimeout> | undefined;
      const observer = new ResizeObserver((entries) => {
        const width = Math.floor(entries[0]?.contentRect.width ?? 0);
        clearTimeout(timer);
        // The first measurement draws at once; later ones wait until resizing settles.
        if (this.width() === 0) this.width.set(width);
        else timer = setTimeout(() => this.width.set(width), RESIZE_DEBOUNCE_MS);
      });
      observer.observe(this.host.nativeElement);
      destroyRef.onDestroy(() => {
        clearTimeout(timer);
        observer.disconnect();
      });
    });
    effect(() => {
      const model = this.model();
      const width = this.width();
      const showSticking = this.showSticking();
      const showCounts = this.showCounts();
      const showTension = this.showTension();
      if (width > 0) void this.render(model, width, { showSticking, showCounts, showTension });
    });
    afterRenderEffect(() => {
      if (this.cursorSystem() !== null) this.revealCursor();
    });
  }

  /** Bring the cursor's line on screen when it is off it, smoothly unless motion is reduced. */
  private revealCursor(): void {
    const box = this.host.nativeElement.querySelector<HTMLElement>('.cursor');
    const rect = box?.getBoundingClientRect();
    if (!box || !rect || (rect.top >= 0 && rect.bottom <= window.innerHeight)) return;
    const still = window.matchMedia?.('(prefers-reduced-motion: reduce)').matches ?? false;
    box.scrollIntoView?.({ block: 'center', behavior: still ? 'auto' : 'smooth' });
  }

  /** Arrow keys step the highlighted beat; Escape clears it. */
  protected moveCursor(event: KeyboardEvent): void {
    const layout = this.layout();
    if (!layout) return;
    const by = { ArrowRight: 1, ArrowLeft: -1 }[event.key];
    if (by !== undefined) {
      event.preventDefault();
      this.cursorMoved.emit(stepPosition(layout.bars, this.cursor(), by));
    } else if (event.key === 'Escape') {
      this.cursorMoved.emit(null);
    }
  }

  private async render(
    model: NotationModel,
    width: number,
    shown: { showSticking: boolean; showCounts: boolean; showTension: boolean },
  ): Promise<void> {
    const token = ++this.renderToken;
    try {
      const { renderNotation } = await import('../../../../shared/notation/render-vexflow');
      await document.fonts?.ready;
      if (token !== this.renderToken) return;
      const engrave = (lineWidth: number) =>
        renderNotation(this.canvas().nativeElement, model, {
          width: lineWidth,
          ...shown,
          gapBelowSystem: PLOT_ROOM,
          ink: 'currentColor',
        });
      let { svg, ...layout } = engrave(width);
      const fit = fitToWidth(layout, width);
      if (fit.contentWidth > width) {
        // A bar ran past the line: engrave again on a line that holds it, so every system fills
        // the same wider sheet, which the template scales down to the host as one.
        ({ svg, ...layout } = engrave(fit.contentWidth));
      }
      svg.setAttribute('aria-hidden', 'true');
      this.fit.set(fit);
      this.layout.set(layout);
      this.failure.set(null);
    } catch (error) {
      if (token !== this.renderToken) return;
      this.failure.set(error instanceof Error ? error.message : String(error));
    }
  }
}
