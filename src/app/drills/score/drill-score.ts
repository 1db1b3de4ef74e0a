import { PRINT_LAYOUT, PRINT_PAGE_WIDTH } from '../../../../shared/notation/print-layout';
import {
  ChangeDetectionStrategy,
  ChangeDetectorRef,
  Component,
  DestroyRef,
  ElementRef,
  Injector,
  afterNextRender,
  afterRenderEffect,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  model,
  output,
  signal,
  viewChild,
  viewChildren,
} from '@angular/core';
import { NgTemplateOutlet } from '@angular/common';
import { MatSlideToggle } from '@angular/material/slide-toggle';
import type { Drill } from '../../../../shared/generator/index';
import {
  buildNotation,
  groupingLabel,
  type NotationModel,
} from '../../../../shared/notation/notation-model';
import type {
  EngravingCache,
  NotationLayout,
  RenderOptions,
} from '../../../../shared/notation/render-vexflow';
import { onCardScale, targetTension } from '../drill-scale';
import { TensionPlot } from '../tension-plot/tension-plot';
import { loadMusicFonts } from './music-fonts';
import {
  cursorBox,
  fitToWidth,
  positionAtPoint,
  stepPosition,
  systemBands,
  type ScoreLayout,
  type ScorePosition,
  type SystemBand,
} from './score-layout';

/** Room under each system for the tension plots, in pixels. */
const PLOT_ROOM = 52;
/** On paper: up to three lines of larger labels under the meter (see tension-plot.scss). */
const PRINT_PLOT_ROOM = 78;
const RESIZE_DEBOUNCE_MS = 150;
/** The printable width of A4 or US Letter, in CSS pixels (see PRINT_PAGE_WIDTH). */
export const PRINT_WIDTH = PRINT_PAGE_WIDTH;
/**
 * The line the score is engraved on for print, whatever the screen, zoomed to PRINT_WIDTH on
 * paper: four bars of sixteenths a system (see PRINT_LAYOUT). A phone prints the same systems as
 * a desktop instead of its one bar a line.
 */
export const PRINT_ENGRAVING_WIDTH = PRINT_LAYOUT.width;
let scoreIds = 0;
/** The drawing's attributes that are its own, not ink its copies should inherit. */
const OWN_ATTRIBUTES = new Set(['id', 'class', 'role', 'width', 'height', 'viewBox', 'style']);

/**
 * The drill in drum-set notation. VexFlow is loaded on first use (dynamic import), so it stays out
 * of the initial bundle; the score re-flows into systems whenever its width changes.
 */
@Component({
  selector: 'tensile-drill-score',
  imports: [MatSlideToggle, NgTemplateOutlet, TensionPlot],
  templateUrl: './drill-score.html',
  styleUrl: './drill-score.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    tabindex: '0',
    role: 'group',
    '[attr.aria-label]': 'label()',
    '(keydown)': 'moveCursor($event)',
    // Busy while a new score's later systems are still going up (see render).
    '[attr.aria-busy]': 'settling() || null',
    // The keyboard way to pick a beat is the arrow keys above; a click or tap picks it directly.
    '(click)': 'pickAt($event)',
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
  private readonly sheet = viewChild.required<ElementRef<HTMLDivElement>>('sheet');
  private readonly echoes = viewChildren<ElementRef<HTMLDivElement>>('echo');
  /** The drawing's id, which the later systems' strips point at. */
  private readonly svgId = `tensile-score-${++scoreIds}`;
  private readonly width = signal(0);
  /**
   * Strips known to be far from the screen, by system: left empty, since a strip's `<use>` copy
   * is rebuilt (styled and laid out) on every new drawing even out of view. A strip not yet
   * watched counts as near, so nothing is ever missing before the watcher has answered.
   */
  private readonly farStrips = signal<ReadonlySet<number>>(new Set());
  /** True while the page is laid out for print (see watchPrint). */
  private readonly printing = signal(false);
  private readonly changes = inject(ChangeDetectorRef);
  private readonly injector = inject(Injector);
  /** The engraver once loaded, so a print can re-flow the score without waiting. */
  private engraver: typeof import('../../../../shared/notation/render-vexflow') | null = null;
  private renderToken = 0;

  protected readonly layout = signal<ScoreLayout | null>(null);
  /**
   * Where the arrow keys step from: the cursor, or the beat just picked when keys come faster
   * than the page updates (key repeat), so no press is lost.
   */
  private readonly stepFrom = linkedSignal(() => this.cursor());
  /** The engraving's full width and the factor that fits it into the host (1 when it fits). */
  protected readonly fit = signal({ contentWidth: 0, scale: 1 });
  protected readonly failure = signal<string | null>(null);
  protected readonly settling = signal(false);
  /**
   * Systems whose strip still shows the drawing before the current drill's (a new score goes up
   * a few systems at a time): dimmed, so the page never passes a mix of two drills for one.
   */
  protected readonly staleSystems = signal<ReadonlySet<number>>(new Set());
  protected readonly model = computed(() => buildNotation(this.drill()));
  protected readonly highlight = computed(() => {
    const layout = this.layout();
    const at = this.cursor();
    const box = layout ? cursorBox(layout, at) : null;
    const system = layout?.bars.find((b) => b.bar === at?.bar)?.system;
    return box && system !== undefined ? { ...box, system } : null;
  });
  /** One strip per system, so print breaks between systems and never through one. */
  protected readonly bands = computed(() => {
    const layout = this.layout();
    return layout ? systemBands(layout) : [];
  });
  /** Whether even the smallest readable scale leaves the score wider than its box (phones). */
  protected readonly overflowing = computed(() => {
    const { contentWidth, scale } = this.fit();
    return this.layout() !== null && contentWidth * scale > this.width() + 1;
  });
  protected readonly firstBand = computed<SystemBand | null>(() => this.bands()[0] ?? null);
  protected readonly laterBands = computed(() => this.bands().slice(1));
  /** The zoom that fits the sheet into the printed page's width (never enlarged). */
  protected readonly printZoom = computed(() => {
    const width = this.fit().contentWidth;
    return width > PRINT_WIDTH ? PRINT_WIDTH / width : 1;
  });
  protected readonly plots = computed(() => {
    const layout = this.layout();
    if (!layout) return [];
    const drill = this.drill();
    return layout.bars.map((box) => ({
      bar: box.bar,
      system: box.system,
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
  protected readonly plotRoom = computed(() => (this.printing() ? PRINT_PLOT_ROOM : PLOT_ROOM));
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
      const unwatchPrint = this.watchPrint();
      const unwatchStrips = this.watchStrips();
      destroyRef.onDestroy(() => {
        clearTimeout(timer);
        observer.disconnect();
        unwatchPrint();
        unwatchStrips();
      });
    });
    effect(() => {
      const model = this.model();
      const width = this.printing() ? PRINT_ENGRAVING_WIDTH : this.width();
      const showSticking = this.showSticking();
      const showCounts = this.showCounts();
      // Paper goes without the tension marks (a screen aid): drawn without them, so no copy of
      // the drawing (the later strips' <use>) can carry their colour onto the page.
      const showTension = this.showTension() && !this.printing();
      if (width > 0) void this.render(model, width, { showSticking, showCounts, showTension });
    });
    afterRenderEffect(() => {
      if (this.cursorSystem() !== null) this.revealCursor();
    });
    afterRenderEffect(() =>
      this.drawEchoes(this.laterBands(), this.fit().contentWidth, this.farStrips()),
    );
  }

  /**
   * Keeps `farStrips` to the strips more than a screen's height away (a scroll fills the strips
   * it brings near before they show). Print fills every strip whatever this says.
   */
  private watchStrips(): () => void {
    if (typeof IntersectionObserver === 'undefined') return () => {};
    const far = new Set<number>();
    const watcher = new IntersectionObserver(
      (entries) => {
        for (const entry of entries) {
          const system = Number((entry.target as HTMLElement).dataset['system']);
          if (entry.isIntersecting) far.delete(system);
          else far.add(system);
        }
        this.farStrips.set(new Set(far));
      },
      { rootMargin: '100% 0px' },
    );
    const watched = new Set<HTMLElement>();
    const follow = effect(
      () => {
        const bands = this.echoes()
          .map((slot) => slot.nativeElement.parentElement)
          .filter((band): band is HTMLElement => band !== null);
        for (const band of bands) if (!watched.has(band)) watcher.observe(band);
        for (const band of watched) {
          if (bands.includes(band)) continue;
          watcher.unobserve(band);
          far.delete(Number(band.dataset['system']));
        }
        watched.clear();
        bands.forEach((band) => watched.add(band));
      },
      { injector: this.injector },
    );
    return () => {
      follow.destroy();
      watcher.disconnect();
    };
  }

  /** A click or tap on a beat picks it (Play starts there) and keeps the keys on the score. */
  protected pickAt(event: MouseEvent): void {
    const layout = this.layout();
    if (!layout) return;
    const rect = this.sheet().nativeElement.getBoundingClientRect();
    const scale = this.fit().scale;
    const at = positionAtPoint(
      layout,
      (event.clientX - rect.left) / scale,
      (event.clientY - rect.top) / scale,
    );
    if (at === null) return;
    this.cursorMoved.emit(at);
    this.host.nativeElement.focus({ preventScroll: true });
  }

  /**
   * Each later system's strip shows its system of the one drawing through `<use>`, so the notes
   * exist once in the page (for assistive technology, tests and memory) yet print breaks
   * between systems. A `<use>` copies what it points at into the page: pointing at the system's
   * own group (and the brackets) rather than the whole drawing keeps the page at two copies of
   * the score instead of one per system, which style and layout pay for on every redraw.
   */
  private drawEchoes(
    bands: readonly SystemBand[],
    width: number,
    far: ReadonlySet<number> = new Set(),
  ): void {
    const slots = this.echoes();
    const drawing = this.canvas().nativeElement.querySelector('svg');
    if (!drawing) return;
    const ns = 'http://www.w3.org/2000/svg';
    const brackets = drawing.querySelector(`[id="${this.svgId}-brackets"]`);
    bands.forEach((band, i) => {
      const slot = slots[i]?.nativeElement;
      if (!slot) return;
      if (far.has(band.system) && !this.printing()) {
        if (slot.hasChildNodes()) slot.replaceChildren();
        return;
      }
      const svg = document.createElementNS(ns, 'svg');
      // The copies inherit from this element, not from the drawing: give it the drawing's ink.
      for (const name of drawing.getAttributeNames()) {
        if (!OWN_ATTRIBUTES.has(name)) svg.setAttribute(name, drawing.getAttribute(name)!);
      }
      svg.setAttribute('width', String(width));
      svg.setAttribute('height', String(band.height));
      svg.setAttribute('viewBox', `0 ${band.top} ${width} ${band.height}`);
      svg.setAttribute('aria-hidden', 'true');
      const parts = [`${this.svgId}-system-${band.system}`];
      if (brackets?.hasChildNodes()) parts.push(brackets.id);
      for (const id of parts) {
        const use = document.createElementNS(ns, 'use');
        use.setAttribute('href', `#${id}`);
        svg.append(use);
      }
      // A strip that shows the same as before is left alone: the browser keeps its copy.
      if (!slot.firstElementChild?.isEqualNode(svg)) slot.replaceChildren(svg);
    });
  }

  /** Bring the cursor's line on screen when it is off it, smoothly unless motion is reduced. */
  private revealCursor(): void {
    const box = this.host.nativeElement.querySelector<HTMLElement>('.cursor');
    const rect = box?.getBoundingClientRect();
    const frame = this.host.nativeElement.getBoundingClientRect();
    const inView =
      rect !== undefined &&
      rect.top >= 0 &&
      rect.bottom <= window.innerHeight &&
      rect.left >= frame.left &&
      rect.right <= frame.right;
    if (!box || inView) return;
    const still = window.matchMedia?.('(prefers-reduced-motion: reduce)').matches ?? false;
    // Sideways too: on a phone the score scrolls inside its box.
    box.scrollIntoView?.({
      block: 'center',
      inline: 'nearest',
      behavior: still ? 'auto' : 'smooth',
    });
  }

  /** Arrow keys step the highlighted beat; Escape clears it. */
  protected moveCursor(event: KeyboardEvent): void {
    const layout = this.layout();
    if (!layout) return;
    const by = { ArrowRight: 1, ArrowLeft: -1 }[event.key];
    if (by !== undefined) {
      event.preventDefault();
      const next = stepPosition(layout.bars, this.stepFrom(), by);
      this.stepFrom.set(next);
      this.cursorMoved.emit(next);
    } else if (event.key === 'Escape') {
      this.stepFrom.set(null);
      this.cursorMoved.emit(null);
    }
  }

  /**
   * Print re-flows the score on the print line and back afterwards. The browser lays the page
   * out for print right after `beforeprint`, so that re-flow is done synchronously there (the
   * engraver and fonts are loaded by then); a print media query change (print preview, or a
   * test emulating print) goes the same way.
   */
  private watchPrint(): () => void {
    const start = (): void => {
      if (this.printing()) return;
      this.printing.set(true);
      this.staleSystems.set(new Set());
      const engraver = this.engraver;
      if (engraver === null || this.width() === 0) return;
      this.draw(engraver, this.model(), PRINT_ENGRAVING_WIDTH, this.shown());
      this.changes.detectChanges();
      // After-render hooks wait for the next frame; print does not.
      this.drawEchoes(this.laterBands(), this.fit().contentWidth);
    };
    const end = (): void => this.printing.set(false);
    const media = window.matchMedia?.('print');
    const onMedia = (event: MediaQueryListEvent): void => (event.matches ? start() : end());
    window.addEventListener('beforeprint', start);
    window.addEventListener('afterprint', end);
    media?.addEventListener?.('change', onMedia);
    return () => {
      window.removeEventListener('beforeprint', start);
      window.removeEventListener('afterprint', end);
      media?.removeEventListener?.('change', onMedia);
    };
  }

  private shown(): { showSticking: boolean; showCounts: boolean; showTension: boolean } {
    return {
      showSticking: this.showSticking(),
      showCounts: this.showCounts(),
      showTension: this.showTension() && !this.printing(),
    };
  }

  private async render(
    model: NotationModel,
    width: number,
    shown: { showSticking: boolean; showCounts: boolean; showTension: boolean },
  ): Promise<void> {
    const token = ++this.renderToken;
    try {
      // Only the score's own faces are waited for (not the page's text and icon fonts).
      const [engraver] = await Promise.all([
        import('../../../../shared/notation/render-vexflow'),
        loadMusicFonts(),
      ]);
      if (token !== this.renderToken) return;
      this.engraver = engraver;
      // A system at a time, the browser's turn between (typing never waits for a whole score);
      // the drawing shows once it is whole. A newer drill ends this pass at its next step.
      const current = () => token === this.renderToken && !this.printing();
      let cache: EngravingCache | undefined;
      // When the browser last drew a frame: yields between steps let a frame in once one is due
      // (a task alone lets input in, but Chromium can hold frames back behind such tasks).
      let painted = performance.now();
      const engrave = async (lineWidth: number) => {
        const own = (cache = this.cacheFor(engraver, lineWidth));
        const steps = engraver.notationSteps(this.canvas().nativeElement, model, {
          ...this.engravingOptions(lineWidth, shown, own),
          systemsAtOnce: SYSTEMS_A_FRAME,
          systemsFirst: SYSTEMS_FIRST,
        });
        let slice = performance.now();
        let earlyShown = false;
        for (;;) {
          const layout = steps.step();
          if (layout) return layout;
          const early = !earlyShown && own.shownEarly > 0;
          if (early) {
            earlyShown = true;
            this.settling.set(true);
            this.staleSystems.set(this.systemsFrom(own.shownEarly));
          }
          // The first systems are up before the rest is drawn: they are shown at once.
          if (!early && performance.now() - slice < SLICE_MS) continue;
          if (early || performance.now() - painted >= FRAME_MS) {
            await nextPaint();
            painted = performance.now();
            // What the frame queued (input, the page's own messages) goes before the next step.
            await nextTask();
          } else await nextTask();
          if (!current()) return null;
          slice = performance.now();
        }
      };
      let drawn = await engrave(width);
      if (!drawn) return;
      const fit = fitToWidth(drawn, width);
      // A bar ran past the line: engrave again on a line that holds it (see draw).
      if (fit.contentWidth > width) drawn = await engrave(fit.contentWidth);
      if (!drawn) return;
      this.publish(engraver, drawn, fit);
      // A score all new goes up a few systems a frame (the top first), so no single frame
      // styles and lays out every system and its strip's copy; a newer drill ends this.
      let waiting = cache?.showMore(0) ?? false;
      this.settling.set(waiting);
      this.markStale(cache);
      while (waiting) {
        await nextFrame();
        if (!current()) return;
        waiting = cache!.showMore(SYSTEMS_A_FRAME);
        this.markStale(cache);
      }
      this.settling.set(false);
    } catch (error) {
      if (token !== this.renderToken) return;
      this.failure.set(error instanceof Error ? error.message : String(error));
    }
  }

  /** Every system of the score on the page from `first` on. */
  private systemsFrom(first: number): ReadonlySet<number> {
    return new Set(this.bands().flatMap((band) => (band.system >= first ? [band.system] : [])));
  }

  /** Dim the systems still waiting to go up (none once they all are). */
  private markStale(cache: EngravingCache | undefined): void {
    const waiting = cache?.waitingSystems() ?? [];
    if (waiting.length || this.staleSystems().size) this.staleSystems.set(new Set(waiting));
  }

  /**
   * Systems kept from the last passes at each line width (two: the host's, and the wider line a
   * bar too wide for it asks for), so an edit redraws only the systems it changed.
   */
  private readonly caches = new Map<number, EngravingCache>();

  private cacheFor(
    engraver: typeof import('../../../../shared/notation/render-vexflow'),
    lineWidth: number,
  ): EngravingCache {
    let cache = this.caches.get(lineWidth);
    if (!cache) {
      cache = new engraver.EngravingCache();
      this.caches.set(lineWidth, cache);
      for (const width of [...this.caches.keys()].slice(0, -2)) this.caches.delete(width);
    }
    return cache;
  }

  private engravingOptions(
    lineWidth: number,
    shown: { showSticking: boolean; showCounts: boolean; showTension: boolean },
    cache?: EngravingCache,
  ): RenderOptions {
    // On paper the notes stand closer, as engraved parts set them (see PRINT_LAYOUT).
    const print = this.printing()
      ? {
          noteRoom: PRINT_LAYOUT.noteRoom,
          countRoom: PRINT_LAYOUT.countRoom,
          air: PRINT_LAYOUT.air,
          maxBarsPerSystem: PRINT_LAYOUT.maxBarsPerSystem,
          leastTextSize: PRINT_LAYOUT.leastTextSize,
        }
      : {};
    return {
      width: lineWidth,
      ...shown,
      ...print,
      gapBelowSystem: this.plotRoom(),
      ink: 'currentColor',
      ...(cache ? { cache } : {}),
    };
  }

  /** Engrave `model` on a line of `width` pixels and publish its layout (synchronous: print). */
  private draw(
    engraver: typeof import('../../../../shared/notation/render-vexflow'),
    model: NotationModel,
    width: number,
    shown: { showSticking: boolean; showCounts: boolean; showTension: boolean },
  ): void {
    const engrave = (lineWidth: number) =>
      engraver.renderNotation(
        this.canvas().nativeElement,
        model,
        this.engravingOptions(lineWidth, shown),
      );
    let drawn = engrave(width);
    const fit = fitToWidth(drawn, width);
    if (fit.contentWidth > width) {
      // A bar ran past the line: engrave again on a line that holds it, so every system fills
      // the same wider sheet, which the template scales down to the host as one.
      drawn = engrave(fit.contentWidth);
    }
    this.publish(engraver, drawn, fit);
  }

  /** Name the drawing's parts for the strips (see drawEchoes) and publish its layout. */
  private publish(
    { SYSTEM_CLASS, BRACKETS_CLASS }: typeof import('../../../../shared/notation/render-vexflow'),
    { svg, ...layout }: NotationLayout,
    fit: { contentWidth: number; scale: number },
  ): void {
    // Names set only where they differ: a drawing updated in place keeps its unchanged parts
    // untouched (see EngravingCache).
    const name = (part: Element, id: string) => {
      if (part.id !== id) part.id = id;
    };
    if (svg.getAttribute('aria-hidden') !== 'true') svg.setAttribute('aria-hidden', 'true');
    name(svg, this.svgId);
    // Named, so each later strip can show its own system (see drawEchoes).
    svg.querySelectorAll(`:scope > .${SYSTEM_CLASS}`).forEach((group, system) => {
      name(group, `${this.svgId}-system-${system}`);
    });
    const brackets = svg.querySelector(`:scope > .${BRACKETS_CLASS}`);
    if (brackets) name(brackets, `${this.svgId}-brackets`);
    this.fit.set(fit);
    this.layout.set(layout);
    this.failure.set(null);
  }
}

/** Longest run of engraving steps before the browser gets the main thread back, in ms. */
const SLICE_MS = 8;

/** Systems of a new score put on the page in one frame, once the first is up. */
const SYSTEMS_A_FRAME = 2;

/** Systems of a new score shown before the rest is drawn: the top one, up soonest. */
const SYSTEMS_FIRST = 1;

/** Resolves at the next animation frame, before that frame's style and layout. */
function nextFrame(): Promise<void> {
  return new Promise((resolve) => requestAnimationFrame(() => resolve()));
}

/** About one 60 Hz frame, in ms: engraving steps run at most this long between frames. */
const FRAME_MS = 16;

/** Resolves once the next frame is drawn (its style, layout and paint done). */
function nextPaint(): Promise<void> {
  return new Promise((resolve) =>
    requestAnimationFrame(() => {
      const channel = new MessageChannel();
      channel.port1.onmessage = () => resolve();
      channel.port2.postMessage(null);
    }),
  );
}

/**
 * Resolves in a later task, after the browser has had its turn (input, rendering) and after the
 * tasks already queued (not `scheduler.yield()`, whose continuation goes ahead of them: in a
 * trace Chromium then held frames back 80–120 ms while a new score was engraved).
 */
function nextTask(): Promise<void> {
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    channel.port1.onmessage = () => resolve();
    channel.port2.postMessage(null);
  });
}
