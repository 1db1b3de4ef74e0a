/**
 * Engraves a notation model with VexFlow 5 into an SVG, in the browser or in Node (with a DOM
 * such as jsdom), and reports where every bar and beat landed so a host can draw a playback
 * cursor and the tension plots under the bars.
 *
 * Only `vexflow/core` is imported: the host makes VexFlow's default faces, Bravura and Academico,
 * available before drawing (the browser loads them as font files, the server registers them with
 * its canvas, test pages import the `vexflow/bravura` entry that embeds them).
 */
import {
  BarlineType,
  Stave,
  StaveModifierPosition,
  TimeSignature,
  type SVGContext,
  type Tuplet,
} from 'vexflow/core';
import {
  drawBeatTexts,
  layoutCounts,
  LETTER_GAP,
  LETTER_WIDTH,
  STICKING_LINE,
  stickingPitch,
  type CountLayout,
} from './beat-texts';
import { SYLLABLE_SIZE, syllableRowWidth } from './count-positions';
import { countPositions } from './count-positions';
import { EngravingContext, fastEngravingPass, withFastEngraving } from './engraving-context';
import { drawHeaderMarks, layoutHeaderMarks } from './header-marks';
import { drawLegend, legendHeight, legendLineWidth } from './legend';
import { svgText } from './svg-text';
import { drawPolyrhythmBrackets, type InstantBox, type SystemBand } from './polyrhythm-brackets';
import {
  colourSyncopations,
  drawTensionLegend,
  drawTensionMarks,
  TENSION_INK,
  TENSION_LEGEND_HEIGHT,
} from './tension-marks';
import { groupingLabel, type NotationBar, type NotationModel } from './notation-model';
import { planSystems, type SystemPlan } from './system-layout';
import {
  barFormatter,
  engraveBar,
  formattedVoices,
  GridVoices,
  minimumBarWidth,
  noteExtents,
  type EngravedBar,
  type EngravedNote,
} from './vexflow-bar';

export interface RenderOptions {
  /** Width of the drawing, in CSS pixels. */
  readonly width: number;
  readonly showSticking?: boolean;
  readonly showCounts?: boolean;
  /** Draw the voice key to the left of the first system (default true). */
  readonly showLegend?: boolean;
  /** Room left free under every system for the host (e.g. tension plots), in pixels. */
  readonly gapBelowSystem?: number;
  readonly maxBarsPerSystem?: number;
  /**
   * Least room per written note and per counted slot, in pixels (defaults 22 and 16, a
   * screen's; print sets them closer, see `PRINT_LAYOUT`).
   */
  readonly noteRoom?: number;
  readonly countRoom?: number;
  /** Room beyond VexFlow's tightest setting of a bar, as a factor (default 1.2). */
  readonly air?: number;
  /**
   * The smallest the sticking letters and counting syllables may be set, in pixels (default 10,
   * a screen's). When given, every bar is also set wide enough for its text rows at this size,
   * so paper can promise a readable size.
   */
  readonly leastTextSize?: number;
  /** Colour of everything drawn (default black; `currentColor` follows the page's text colour). */
  readonly ink?: string;
  /**
   * Draw the metronome mark (and the swing marking when the drill swings) above the first
   * system, in a band of its own (default true).
   */
  readonly showMarks?: boolean;
  /** The drill's title, above the first system (default none: a page shows its own heading). */
  readonly title?: string | null;
  /**
   * Mark the notes that make each bar tense, in colour and with a small triangle, with a key
   * above the first system (default false, as for print; the drill page turns it on).
   */
  readonly showTension?: boolean;
  /**
   * Write an uneven grouping ("2+2+3" in 7/8) over the time signature (default true). Even
   * groupings (6/8, 12/8) go without: the meter says them.
   */
  readonly showGrouping?: boolean;
  /**
   * Systems drawn by earlier passes with the same cache, reused where a system's bars, place and
   * settings are the same (see `EngravingCache`); none by default.
   */
  readonly cache?: EngravingCache;
  /**
   * With a cache and its last drawing on the page: how many systems drawn afresh go onto the page
   * at once; each later one waits in the place of the system it replaces until
   * `EngravingCache.showMore` (a host spreads a whole new score over frames, so no frame styles
   * and lays out every system). All at once by default.
   */
  readonly systemsAtOnce?: number;
  /**
   * With `systemsAtOnce`: how many of a score drawn all afresh go onto the page before the rest
   * is drawn (see `EngravingCache.showEarly`); `systemsAtOnce` by default.
   */
  readonly systemsFirst?: number;
}

/** @internal What an earlier pass of the same score settled for the next (see engrave). */
interface PassSettled {
  /** The counting's size. */
  readonly countSize?: number;
  /** Every bar measured before any system is drawn. */
  readonly measureFirst?: boolean;
}

/** What `engrave` ends with: the drawing, or what to draw it again with. */
type Engraved = NotationLayout | { readonly again: PassSettled };

export interface BeatBox {
  readonly beat: number;
  /** Left edge of the beat's area, in SVG pixels. */
  readonly x: number;
  readonly width: number;
}

export interface BarBox {
  readonly bar: number;
  readonly system: number;
  /**
   * The stave's left edge and width: a system's first bar includes its clef, and the drill's
   * first bar also the time signature.
   */
  readonly x: number;
  readonly width: number;
  /** y of the top and bottom stave lines. */
  readonly topLineY: number;
  readonly bottomLineY: number;
  /**
   * The system's band: from its top to the start of the free gap under it (the first system
   * starts under the band of tempo and swing marks).
   */
  readonly systemTop: number;
  readonly systemBottom: number;
  readonly beats: readonly BeatBox[];
}

export interface NotationLayout {
  /** Width of the drawing: the width asked for, or more where a lone bar cannot fit its line. */
  readonly width: number;
  readonly height: number;
  readonly bars: readonly BarBox[];
  readonly svg: SVGSVGElement;
}

/**
 * Each system's drawing (its bars and their marks) is one group of this class, a direct child of
 * the SVG in system order; what spans systems, the polyrhythm brackets, is one group of
 * BRACKETS_CLASS after them. Title, marks and keys above the first system stay outside both.
 */
export const SYSTEM_CLASS = 'tensile-system';
/** The class of every drawing's root. */
const NOTATION_CLASS = 'tensile-notation';
export const BRACKETS_CLASS = 'tensile-polyrhythms';

/** Pixels between stave lines (VexFlow's default). */
export const STAVE_SPACE = 10;
const MARGIN_X = 12;
const STICKING_ROW = 20;
/** Room above the top line for hi-hat and crash stems, accents and tuplet brackets. */
const HEADROOM = 96;
/** Room under the bottom line for feet stems, their brackets and accents. */
const FOOTROOM = 78;
const COUNTS_ROW = 22;
/** Least room per counted slot, so every syllable of the subdivision fits under the bar. */
const COUNT_SLOT_ROOM = 16;
/** VexFlow places the top line this far below the stave's y. */
const STAVE_TOP_OFFSET = 4 * STAVE_SPACE;

/** Engrave `model` into `container` (its previous drawing is replaced). */
export function renderNotation(
  container: HTMLElement,
  model: NotationModel,
  options: RenderOptions,
): NotationLayout {
  return withFastEngraving(() => {
    let steps = engrave(container, model, options);
    for (;;) {
      const step = steps.next();
      if (!step.done) continue;
      if ('svg' in step.value) return step.value;
      steps = engrave(container, model, { ...options, ...step.value.again });
    }
  });
}

/**
 * The same engraving in steps of about one bar or one system each, for a page that gives the
 * browser its main thread between steps (typing must never wait for a whole score): each
 * `step()` does one step and returns the layout once the drawing is done. The drawing is built
 * off the page and put into `container` by the last step, whole, as `renderNotation` does.
 */
export function notationSteps(
  container: HTMLElement,
  model: NotationModel,
  options: RenderOptions,
): { step(): NotationLayout | null } {
  const pass = fastEngravingPass();
  let steps = engrave(container, model, options);
  return {
    step: () =>
      pass(() => {
        const next = steps.next();
        if (!next.done) return null;
        if ('svg' in next.value) return next.value;
        // A later system needed smaller counting than the ones shown early (or the line breaks
        // differed from the first system's): again, with what this pass found.
        steps = engrave(container, model, { ...options, ...next.value.again });
        return null;
      }),
  };
}

/**
 * What one system's drawing came to, kept for the next pass: the system's group and everything
 * the rest of the engraving reads from its bars.
 */
interface DrawnSystem {
  readonly group: Element;
  /** The drawing state the system left (see `EngravingContext.drawingState`). */
  readonly after: string;
  /** The copy of `group` on the page, kept there while the system stays the same. */
  shown: Element | null;
  readonly boxes: readonly BarBox[];
  readonly instants: readonly (readonly [string, InstantBox])[];
  readonly band: SystemBand;
}

/**
 * Systems and bar measurements kept between passes of one score (the editor redraws its preview
 * on every edit, and most edits leave most bars as they were). A system is reused only when
 * everything it was drawn from is the same: its bars (the whole notation of each), its place on
 * the page, the settings that shape it and the counting's size; and a bar's measurement only
 * when the bar and the settings are. Only what the latest pass used is kept.
 */
export class EngravingCache {
  private tightest = new Map<string, number>();
  private countSizes = new Map<string, readonly number[]>();
  private systems = new Map<string, DrawnSystem>();
  private used = {
    tightest: new Map<string, number>(),
    countSizes: new Map<string, readonly number[]>(),
    systems: new Map<string, DrawnSystem>(),
  };

  /** @internal */
  get<K extends 'tightest' | 'countSizes' | 'systems'>(
    kind: K,
    key: string,
  ): EngravingCacheEntry[K] | undefined {
    const value = (this[kind] as Map<string, EngravingCacheEntry[K]>).get(key);
    if (value !== undefined)
      (this.used[kind] as Map<string, EngravingCacheEntry[K]>).set(key, value);
    return value;
  }

  /** @internal */
  set<K extends 'tightest' | 'countSizes' | 'systems'>(
    kind: K,
    key: string,
    value: EngravingCacheEntry[K],
  ): void {
    (this.used[kind] as Map<string, EngravingCacheEntry[K]>).set(key, value);
  }

  /**
   * @internal Bring the drawing on the page (the one engraving `container` holds, whichever
   * pass or cache drew it: after a pass on a wider line a score's two caches take turns) up to
   * `next`, whose kept systems are stand-ins (the keys of `reused`), by changing only what
   * differs: systems kept from that pass and parts drawn the
   * same stay as they are, so the browser restyles and lays out only what changed. Returns the
   * drawing now on the page, or `next` when there is none to update (the caller puts it there).
   */
  update(
    container: HTMLElement,
    next: SVGSVGElement,
    reused: ReadonlyMap<Element, DrawnSystem>,
    atOnce = Infinity,
  ): SVGSVGElement {
    const page = drawingIn(container);
    const early = this.early;
    this.waiting = [];
    this.waitingBrackets = null;
    this.early = new Map();
    this.shownEarly = 0;
    const copy = (system: DrawnSystem): Element => {
      system.shown = system.group.cloneNode(true) as Element;
      return system.shown;
    };
    if (!page) {
      for (const [stand, system] of reused) stand.replaceWith(copy(system));
      // (The page was redrawn meanwhile, as for print: the early systems go back in.)
      for (const [stand, part] of early) stand.replaceWith(part);
      return next;
    }
    const oldSystems = [...page.children].filter((part) => part.classList.contains(SYSTEM_CLASS));
    const keptShown = new Set([...reused.values()].map((kept) => kept.shown));
    let system = -1;
    let placed = 0;
    const wanted = [...next.children].map((part, i) => {
      // A system put up before the rest was drawn (see showEarly) stays where it is.
      const shownBefore = early.get(part);
      if (shownBefore) {
        system++;
        placed++;
        return shownBefore;
      }
      const kept = reused.get(part);
      if (kept) {
        system++;
        return kept.shown?.parentNode === page ? kept.shown : copy(kept);
      }
      if (part.classList.contains(SYSTEM_CLASS)) {
        system++;
        // A new system past the first few waits in the place of the one it replaces, which
        // stays on the page meanwhile (so nothing below it moves), unless that one is kept.
        const old = oldSystems[system];
        if (old && placed >= atOnce && !keptShown.has(old)) {
          this.waiting.push([old, part, system]);
          return old;
        }
        placed++;
        return part;
      }
      // Parts drawn anew (title, marks, key, brackets) stay when drawn the same; the host's
      // names for them (ids) carry over, as the host gives them again.
      const old = page.children[i];
      if (old?.id && !part.id) part.id = old.id;
      if (old?.isEqualNode(part)) return old;
      // New brackets over systems still waiting go up last, in a frame of their own: every
      // strip of a host copies them.
      if (
        this.waiting.length > 0 &&
        part.classList.contains(BRACKETS_CLASS) &&
        old?.classList.contains(BRACKETS_CLASS) &&
        old.hasChildNodes() &&
        part.hasChildNodes()
      ) {
        this.waitingBrackets = [old, part];
        return old;
      }
      return part;
    });
    for (const name of next.getAttributeNames()) {
      const value = next.getAttribute(name)!;
      if (page.getAttribute(name) !== value) page.setAttribute(name, value);
    }
    // The parts going first, so no kept part is moved: a move restyles and lays it out again,
    // and rebuilds every strip's copy of it.
    const keep = new Set(wanted);
    for (const part of [...page.children]) if (!keep.has(part)) part.remove();
    wanted.forEach((part, i) => {
      const at = page.children[i];
      if (at !== part) page.insertBefore(part, at ?? null);
    });
    return page;
  }

  /** Systems of the last update still to go onto the page, each with the one it replaces. */
  private waiting: [old: Element, next: Element, system: number][] = [];
  /** Systems put up early this pass, by the stand-in left in their place in the new drawing. */
  private early = new Map<Element, Element>();
  /**
   * How many of this pass's first systems are on the page already, before the rest is drawn
   * (see showEarly); 0 once the pass is done.
   */
  shownEarly = 0;

  /** The systems (by index) still showing the drawing before the last update's. */
  waitingSystems(): number[] {
    return this.waiting.map(([, , system]) => system);
  }

  /**
   * @internal A pass's first systems drawn afresh (from system `first` on, every one above them
   * kept as it is on the page) go onto the page (the drawing in `container`) before the rest is
   * drawn, each in the place and under the host's name of the system it replaces; a stand-in
   * takes its place in the new drawing until `update`. Nothing happens when there is no such
   * drawing or it has fewer systems.
   */
  showEarly(container: HTMLElement, parts: readonly Element[], first = 0): void {
    const page = drawingIn(container);
    if (!page) return;
    const old = [...page.children].filter((part) => part.classList.contains(SYSTEM_CLASS));
    if (old.length < first + parts.length) return;
    parts.forEach((part, i) => {
      const replaced = old[first + i]!;
      const stand = part.ownerDocument.createElementNS(part.namespaceURI, 'g');
      part.replaceWith(stand);
      this.early.set(stand, part);
      if (replaced.id && !part.id) part.id = replaced.id;
      replaced.replaceWith(part);
    });
    this.shownEarly = first + parts.length;
  }

  /** @internal Whether `system`, as kept, is the `index`th system of the drawing on the page. */
  showsAt(container: HTMLElement, system: DrawnSystem, index: number): boolean {
    const page = drawingIn(container);
    if (!page || system.shown?.parentNode !== page) return false;
    let at = -1;
    for (const part of page.children)
      if (part.classList.contains(SYSTEM_CLASS) && ++at === index) return part === system.shown;
    return false;
  }
  /** The last update's brackets, waiting for its systems (see update). */
  private waitingBrackets: [old: Element, next: Element] | null = null;

  /**
   * Put up to `count` more of the last update's waiting systems onto the page, in order, each in
   * the place (and under the host's name) of the system it replaces; once none wait, the
   * brackets over them, alone. False once nothing waits.
   */
  showMore(count = 1): boolean {
    const swap = ([old, next]: [Element, Element, number?]) => {
      if (old.id && !next.id) next.id = old.id;
      old.replaceWith(next);
    };
    if (count > 0 && this.waiting.length === 0 && this.waitingBrackets) {
      swap(this.waitingBrackets);
      this.waitingBrackets = null;
    }
    this.waiting.splice(0, count).forEach(swap);
    return this.waiting.length > 0 || this.waitingBrackets !== null;
  }

  /** @internal A pass is done: keep what it used or made, drop the rest. */
  settle(): void {
    this.tightest = this.used.tightest;
    this.countSizes = this.used.countSizes;
    this.systems = this.used.systems;
    this.used = { tightest: new Map(), countSizes: new Map(), systems: new Map() };
  }
}

/** The engraving `container` holds alone, if any. */
function drawingIn(container: HTMLElement): SVGSVGElement | null {
  const only = container.childNodes.length === 1 ? container.firstElementChild : null;
  return only?.classList.contains(NOTATION_CLASS) ? (only as SVGSVGElement) : null;
}

interface EngravingCacheEntry {
  tightest: number;
  countSizes: readonly number[];
  systems: DrawnSystem;
}

function* engrave(
  container: HTMLElement,
  model: NotationModel,
  options: RenderOptions & PassSettled,
): Generator<void, Engraved> {
  // Drawn off the page and attached once, so the page's style and layout are touched once.
  const ctx = new EngravingContext(container.ownerDocument.createElement('div'));
  // No invisible hit areas: nothing here is clicked, and a ghost note's parenthesis gives its
  // area a bounding box that spans the system's start.
  ctx.hitAreas = false;
  const svg = ctx.svg as SVGSVGElement;
  const ink = options.ink ?? 'black';
  ctx.setFillStyle(ink).setStrokeStyle(ink);
  svg.setAttribute('fill', ink);
  svg.setAttribute('stroke', ink);
  svg.setAttribute('role', 'img');
  svg.classList.add(NOTATION_CLASS);
  const showLegend = options.showLegend ?? true;
  const showCounts = options.showCounts ?? false;
  const cache = options.cache;
  // What every bar's drawing depends on besides the bar itself and its place.
  const settings = JSON.stringify([
    model.meter,
    model.layers,
    model.voices,
    model.bars.length,
    model.polyrhythms.some((g) => !g.below),
    options.showSticking ?? false,
    showCounts,
    options.showTension ?? false,
    options.showGrouping ?? true,
    options.ink ?? 'black',
    options.leastTextSize ?? 0,
  ]);
  const barKeys = cache ? model.bars.map((bar) => `${settings}${JSON.stringify(bar)}`) : [];
  // Engraved once, when first needed: measured for line breaking (VexFlow formats the bar to
  // measure it), then formatted to its stave and drawn. A bar whose system comes whole from the
  // cache is never engraved.
  const engravedBars: EngravedBar[] = [];
  const measured: number[] = [];
  const engraved = (barIndex: number): EngravedBar => {
    let bar = engravedBars[barIndex];
    if (bar === undefined) {
      bar = engraveBar(model.bars[barIndex]!, model);
      measured[barIndex] = minimumBarWidth(bar);
      engravedBars[barIndex] = bar;
    }
    return bar;
  };
  const tightest: number[] = [];
  /** Measures the bars up to `end` (not yet measured). */
  function* measureUpTo(end: number): Generator<void, void> {
    for (let i = tightest.length; i < end; i++) {
      const known = cache?.get('tightest', barKeys[i]!);
      if (known !== undefined) {
        tightest.push(known);
        continue;
      }
      engraved(i);
      tightest.push(measured[i]!);
      cache?.set('tightest', barKeys[i]!, measured[i]!);
      yield;
    }
  }
  // A host that puts a new score up a system or two at a time sees its first new ones before the
  // rest is drawn, when every system above them is kept as it is on the page (see
  // EngravingCache.showEarly).
  const early = options.systemsAtOnce ? (options.systemsFirst ?? options.systemsAtOnce) : 0;
  // Where the first two bars cannot share a line (a narrow preview, a bar a system) the first
  // system is the first bar whatever the others measure: it is drawn, and may go up, before
  // they are measured. The full line breaks must then agree, else the pass starts again.
  const firstAlone = cache !== undefined && early > 0 && !options.measureFirst;
  yield* measureUpTo(firstAlone ? Math.min(2, model.bars.length) : model.bars.length);
  const room = {
    note: options.noteRoom ?? NOTE_ROOM,
    count: showCounts ? (options.countRoom ?? COUNT_SLOT_ROOM) : 0,
    air: options.air ?? 1.2,
    text: options.leastTextSize ?? null,
    sticking: options.showSticking ?? false,
    counts: showCounts,
  };
  const systemStartWidth = systemStartWidths(model);
  // The key has a band of its own above the first system (see legend.ts), so every system,
  // the first too, gives its whole width to the bars.
  const planMeasured = () =>
    planSystems({
      barWidths: tightest.map((w, i) => naturalBarWidth(model.bars[i]!, w, model, room)),
      minBarWidths: tightest.map((w, i) => leastBarWidth(model.bars[i]!, w, model, showCounts)),
      systemStartWidth,
      lineWidth: () => options.width - 2 * MARGIN_X,
      maxBarsPerSystem: options.maxBarsPerSystem ?? 4,
    });
  let plans = planMeasured();
  // Only the first system is known yet (see firstAlone).
  let provisional = tightest.length < model.bars.length;
  if (provisional && plans[0]!.bars.length > 1) {
    yield* measureUpTo(model.bars.length);
    plans = planMeasured();
    provisional = false;
  } else if (provisional) plans = plans.slice(0, 1);
  // Two hands at once stack their letters: a second line of sticking where the drill has them.
  const stacked = model.bars.some((bar) =>
    bar.beats.some((beat) => beat.sticking.some((s) => s.hands.length > 1)),
  );
  const sticking = options.showSticking ? STICKING_ROW + (stacked ? STICKING_LINE : 0) : 0;
  const counts = options.showCounts ? COUNTS_ROW : 0;
  const systemHeight = sticking + HEADROOM + 4 * STAVE_SPACE + FOOTROOM + counts;
  const gap = options.gapBelowSystem ?? 0;
  // Air between one system's counting and the next one's sticking, so each reads with its own.
  const separation = options.showSticking ? SYSTEM_SEPARATION : 0;
  // The marks start at the margin, over the first bar; a line too narrow for them all puts the
  // swing marking on a line of its own.
  const shown = (options.showMarks ?? true) ? model.marks : { tempo: null, swing: null };
  const marksX = MARGIN_X;
  const marks = layoutHeaderMarks(shown, options.width - 2 * MARGIN_X);
  const boxes: BarBox[] = [];
  const title = drawTitle(ctx, options.title ?? null, options.width);
  drawHeaderMarks(ctx, shown, marks, marksX, title);
  const showTension = options.showTension ?? false;
  const tensionKey = showTension ? TENSION_LEGEND_HEIGHT : 0;
  if (showTension)
    drawTensionLegend(ctx, marksX, title + marks.height + tensionKey - 8, TENSION_INK);
  // The key stands at the right of the marks' line where both fit (as a part's key sits at the
  // top right of its page; from memory), else in a band of its own under the marks.
  const line = options.width - 2 * MARGIN_X;
  const keyLine = showLegend ? legendLineWidth(model) : 0;
  const keyBesideMarks = showLegend && !showTension && marks.width + KEY_GAP_X + keyLine <= line;
  // One line of key when beside the marks (it fits the line), as many as it needs under them.
  const keyHeight = showLegend ? legendHeight(model, line) : 0;
  const keyBand = !showLegend
    ? 0
    : keyBesideMarks
      ? Math.max(0, keyHeight - marks.height)
      : keyHeight + KEY_GAP;
  const head = title + marks.height + tensionKey + keyBand;
  if (keyBesideMarks) drawLegend(ctx, model, options.width - MARGIN_X - keyLine, title, line, ink);
  else if (showLegend) drawLegend(ctx, model, MARGIN_X, head - keyBand, line, ink);
  const instants = new Map<string, InstantBox>();
  const bands: SystemBand[] = [];
  const hasPolyrhythmAbove = model.polyrhythms.some((g) => !g.below);
  const systemTopOf = (systemIndex: number) =>
    head + systemIndex * (systemHeight + gap + separation);
  // Everything a system's drawing is made from besides the counting's size (see EngravingCache).
  const keysOf = (of: readonly SystemPlan[]) =>
    cache
      ? of.map((plan, systemIndex) =>
          JSON.stringify([
            systemIndex,
            systemTopOf(systemIndex),
            systemHeight,
            plan.widths,
            plan.bars.map((barIndex) => barKeys[barIndex]),
          ]),
        )
      : [];
  let systemKeys = keysOf(plans);
  // Every system is formatted before anything is drawn, so the whole score's counting can be set
  // in one size (the smallest its bars need); a system is formatted when first needed.
  const grids = new GridVoices(model.meter);
  const systemStaves: Stave[][] = [];
  /** Systems taken from the cache, by the copy put into this drawing. */
  const reused = new Map<Element, DrawnSystem>();
  const formatted = (systemIndex: number): Stave[] => {
    const known = systemStaves[systemIndex];
    if (known) return known;
    const plan = plans[systemIndex]!;
    const topLineY = systemTopOf(systemIndex) + sticking + HEADROOM;
    // The system's bars are formatted first, so its tuplet brackets can share one line and its
    // sticking can sit just over its highest mark, close to its own staff.
    let staveX = MARGIN_X;
    const staves = plan.bars.map((barIndex, i) => {
      const bar = model.bars[barIndex]!;
      const width = plan.widths[i]!;
      const stave = staveFor(
        bar,
        model,
        staveX,
        topLineY - STAVE_TOP_OFFSET,
        width,
        i === 0,
        barIndex,
      );
      staveX += width;
      // Full-strength lines (VexFlow's default is grey) so the staff reads from a music stand.
      stave.setStyle({ strokeStyle: ink, fillStyle: ink });
      stave.setDefaultLedgerLineStyle({ strokeStyle: ink, lineWidth: 2 });
      formatBar(engraved(barIndex), stave, grids);
      reachTuplets(engraved(barIndex), stave);
      return stave;
    });
    levelTuplets(plan.bars.map((barIndex) => engraved(barIndex)));
    systemStaves[systemIndex] = staves;
    return staves;
  };
  // Each bar's count placed once: its size sets the score's, and it is drawn as placed.
  const countLayouts = new Map<number, CountLayout>();
  const countLayout = (barIndex: number, stave: Stave): CountLayout => {
    let layout = countLayouts.get(barIndex);
    if (!layout) {
      layout = layoutCounts(
        model.bars[barIndex]!,
        engraved(barIndex),
        stave,
        options.leastTextSize,
      );
      countLayouts.set(barIndex, layout);
    }
    return layout;
  };
  let syllableSize = Math.max(SYLLABLE_SIZE, options.leastTextSize ?? 0);
  /** The counting size each system's bars need (formatting them when the cache does not know). */
  function* countSizes(systemIndex: number): Generator<void, readonly number[]> {
    const plan = plans[systemIndex]!;
    const known = showCounts ? cache?.get('countSizes', systemKeys[systemIndex]!) : [];
    // Without a cache every system is formatted here, before any is drawn, as it always was.
    if (known !== undefined && cache) return known;
    const staves = formatted(systemIndex);
    const sizes = showCounts
      ? plan.bars.map((barIndex, i) => countLayout(barIndex, staves[i]!).size)
      : [];
    if (showCounts) cache?.set('countSizes', systemKeys[systemIndex]!, sizes);
    yield;
    return sizes;
  }
  // The whole score's counting is set in one size, the smallest its bars need. Where the first
  // systems go up early, the later ones are sized once those are up; should one need smaller
  // counting, the pass starts again in that size (the formatting stays cached).
  let sizedLater = options.countSize === undefined && cache && early > 0;
  if (options.countSize !== undefined) syllableSize = options.countSize;
  else
    for (const systemIndex of plans.keys())
      if (!sizedLater || systemIndex < early || cache?.get('countSizes', systemKeys[systemIndex]!))
        syllableSize = Math.min(syllableSize, ...(yield* countSizes(systemIndex)));
  // Every system starts from the same drawing state, so what one system leaves behind (a font,
  // a pen) never makes the next one's cached drawing unusable.
  const systemStart = ctx.drawingState();
  const fresh: Element[] = [];
  /** The first system of those to show early: every one above it is kept, on the page. */
  let freshFrom = 0;
  let showingEarly = cache !== undefined && early > 0;
  /** The counting size the systems not yet sized need, once the early ones are up. */
  function* leastLater(): Generator<void, number> {
    sizedLater = false;
    let least = syllableSize;
    for (let later = 0; later < plans.length; later++)
      least = Math.min(least, ...(yield* countSizes(later)));
    return least;
  }
  for (let systemIndex = 0; systemIndex < plans.length || provisional; systemIndex++) {
    if (provisional && systemIndex > 0) {
      // The first system is drawn (and up, where it could go early): now the line breaks.
      yield* measureUpTo(model.bars.length);
      const full = planMeasured();
      const [first, was] = [full[0]!, plans[0]!];
      if (JSON.stringify([first.bars, first.widths]) !== JSON.stringify([was.bars, was.widths]))
        return { again: { measureFirst: true, countSize: options.countSize } };
      plans = full;
      systemKeys = keysOf(plans);
      provisional = false;
      if (systemIndex >= plans.length) break;
    }
    const plan = plans[systemIndex]!;
    if (sizedLater && !showingEarly) {
      const least = yield* leastLater();
      if (least < syllableSize)
        return { again: { countSize: least, measureFirst: options.measureFirst } };
    }
    ctx.setDrawingState(systemStart);
    const drawKey = cache ? `${syllableSize}${systemStart}${systemKeys[systemIndex]}` : '';
    const known = cache?.get('systems', drawKey);
    if (known) {
      // A stand-in, swapped at the end for the system on the page or, where it is not on the
      // page, a copy (see EngravingCache.update): copying every kept system cost more than
      // drawing the parts an edit changed.
      const stand = svg.ownerDocument.createElementNS(svg.namespaceURI, 'g');
      reused.set(stand, known);
      if (showingEarly && fresh.length === 0 && cache!.showsAt(container, known, systemIndex))
        freshFrom = systemIndex + 1;
      else showingEarly = false;
      svg.append(stand);
      ctx.setDrawingState(known.after);
      boxes.push(...known.boxes);
      for (const [key, box] of known.instants) instants.set(key, box);
      bands.push(known.band);
      yield;
      continue;
    }
    const systemTop = systemTopOf(systemIndex);
    const topLineY = systemTop + sticking + HEADROOM;
    let x = MARGIN_X;
    const staves = formatted(systemIndex);
    const systemBars = plan.bars.map((barIndex) => engraved(barIndex));
    const ceiling = Math.min(
      highestMark(systemBars, topLineY),
      hasPolyrhythmAbove ? topLineY - POLYRHYTHM_ABOVE - POLYRHYTHM_LABEL : Infinity,
    );
    const stickingY = Math.max(topLineY - HEADROOM - 2, ceiling - STICKING_CLEARANCE);
    const systemBoxes: BarBox[] = [];
    const systemInstants = new Map<string, InstantBox>();
    // One group a system, so a host can show a system on its own (see SYSTEM_CLASS).
    const group = ctx.openGroup();
    group.setAttribute('class', SYSTEM_CLASS);
    plan.bars.forEach((barIndex, i) => {
      const bar = model.bars[barIndex]!;
      const width = plan.widths[i]!;
      const stave = staves[i]!;
      const engravedBar = engraved(barIndex);
      if (showTension) colourSyncopations(bar, engravedBar, TENSION_INK);
      drawBar(
        ctx,
        bar,
        engravedBar,
        stave,
        options,
        topLineY,
        stickingY,
        { size: syllableSize, layout: showCounts ? countLayout(barIndex, stave) : null },
        stacked,
      );
      if (showTension)
        drawTensionMarks(
          ctx,
          bar,
          engravedBar,
          topLineY + 4 * STAVE_SPACE + FOOTROOM - 10,
          TENSION_INK,
        );
      if (barIndex === 0 && (options.showGrouping ?? true))
        drawGrouping(ctx, model, stave, topLineY);
      systemBoxes.push({
        bar: bar.bar,
        system: systemIndex,
        x,
        width,
        topLineY,
        bottomLineY: topLineY + 4 * STAVE_SPACE,
        systemTop,
        systemBottom: systemTop + systemHeight,
        beats: beatBoxes(bar, engravedBar, stave),
      });
      recordInstants(systemInstants, bar.bar, engravedBar, systemIndex);
      x += width;
    });
    ctx.closeGroup();
    const band = {
      left: systemBoxes[0]!.x,
      right: x,
      aboveY: topLineY - POLYRHYTHM_ABOVE,
      belowY: topLineY + 4 * STAVE_SPACE + POLYRHYTHM_BELOW,
    };
    boxes.push(...systemBoxes);
    for (const [key, box] of systemInstants) instants.set(key, box);
    bands.push(band);
    // Kept only where a cache asks (the server's light document has no cloneNode).
    cache?.set('systems', drawKey, {
      group: group.cloneNode(true) as Element,
      after: ctx.drawingState(),
      shown: group,
      boxes: systemBoxes,
      instants: [...systemInstants],
      band,
    });
    if (showingEarly && fresh.push(group) === early) {
      showingEarly = false;
      if (provisional || systemIndex < plans.length - 1)
        cache!.showEarly(container, fresh, freshFrom);
    }
    yield;
  }
  if (sizedLater) {
    // (Every system was kept: none went up early.)
    const least = yield* leastLater();
    if (least < syllableSize)
      return { again: { countSize: least, measureFirst: options.measureFirst } };
  }
  ctx.openGroup().setAttribute('class', BRACKETS_CLASS);
  drawPolyrhythmBrackets(ctx, model.polyrhythms, instants, beatEnds(boxes), bands);
  ctx.closeGroup();
  const height = head + plans.length * (systemHeight + gap + separation) - separation;
  // A bar alone on a line too narrow even for its tightest setting (a dense bar on a phone)
  // widens the drawing rather than running off it; the host scrolls or scales it.
  const right = Math.max(0, ...boxes.map((b) => b.x + b.width));
  // (Bars that fit end on the line's edge up to float rounding.)
  const width =
    right + MARGIN_X > options.width + 0.5 ? Math.ceil(right + MARGIN_X) : options.width;
  ctx.resize(width, height);
  svg.setAttribute('viewBox', `0 0 ${width} ${height}`);
  const onPage = cache?.update(container, svg, reused, options.systemsAtOnce) ?? svg;
  if (onPage === svg) container.replaceChildren(svg);
  cache?.settle();
  return { width, height, bars: boxes, svg: onPage };
}

/** The polyrhythm brackets' lines: over the hands' stems and accents, under the feet's stems. */
const POLYRHYTHM_ABOVE = 66;
/** Height of a polyrhythm label over its line. */
const POLYRHYTHM_LABEL = 10;
/** Space between systems when sticking is shown. */
const SYSTEM_SEPARATION = 24;
/** Gap between the sticking's baseline and the highest mark of its system. */
const STICKING_CLEARANCE = 8;
/** Height of a tuplet number over its bracket line, and of an accent over a stem's tip. */
const TUPLET_NUMBER = 12;
const ACCENT_HEIGHT = 14;
/** The baseline of a hands' bracket's number below its line, where "sim." stands too. */
const SIMILE_BASELINE = 4;
/** Room before "sim.", after its group's last note or its bracket's end. */
const SIMILE_GAP = 6;

/**
 * Every shown tuplet bracket of a system on one line: the hands' at the highest, the feet's at
 * the lowest, so the brackets do not step up and down with the accents (common practice).
 */
function levelTuplets(bars: readonly EngravedBar[]): void {
  for (const layer of ['hands', 'feet'] as const) {
    const shown = bars.flatMap((b) => b.tuplets.filter((t) => t.shown && t.layer === layer));
    if (shown.length === 0) continue;
    const ys = shown.map((t) => t.tuplet.getYPosition());
    const line = layer === 'hands' ? Math.min(...ys) : Math.max(...ys);
    for (const t of shown) t.tuplet.moveTo(line);
  }
}

/** The highest y any mark of the system's bars reaches over the staff (stems, accents, "5"s). */
function highestMark(bars: readonly EngravedBar[], topLineY: number): number {
  let top = topLineY;
  for (const bar of bars) {
    for (const { note, layer } of bar.notes) {
      if (layer !== 'hands') continue;
      const accented = note.getModifiers().some((m) => m.getCategory() === 'Articulation');
      const tip = note.hasStem() ? note.getStemExtents().topY : note.getYs()[0]! - STAVE_SPACE;
      top = Math.min(top, tip - (accented ? ACCENT_HEIGHT : 0));
    }
    for (const t of bar.tuplets)
      if (t.shown && t.layer === 'hands')
        top = Math.min(top, t.tuplet.getYPosition() - TUPLET_NUMBER);
  }
  return top;
}
const POLYRHYTHM_BELOW = 52;

/** The horizontal extent of the notes at each instant of a drawn bar. */
/** Where each beat's area ends, keyed `${bar}:${beat}`: a bar's last beat at its bar line. */
function beatEnds(boxes: readonly BarBox[]): Map<string, InstantBox> {
  const ends = new Map<string, InstantBox>();
  for (const box of boxes)
    box.beats.forEach((beat, i) => {
      const right = i === box.beats.length - 1 ? box.x + box.width : beat.x + beat.width;
      ends.set(`${box.bar}:${beat.beat}`, { left: beat.x, right, system: box.system });
    });
  return ends;
}

function recordInstants(
  into: Map<string, InstantBox>,
  bar: number,
  engraved: EngravedBar,
  system: number,
): void {
  const extents = noteExtents(engraved);
  for (const [i, { beat, event }] of engraved.notes.entries()) {
    if (event.kind !== 'note') continue;
    const key = `${bar}:${beat}:${event.slot}`;
    const left = extents[i]!.left;
    const right = left + extents[i]!.width;
    const known = into.get(key);
    into.set(key, {
      left: Math.min(left, known?.left ?? left),
      right: Math.max(right, known?.right ?? right),
      system,
    });
  }
}

/** Height of the title's band. */
const TITLE_HEIGHT = 36;
const TITLE_SIZE = 20;

/**
 * The title centred over the score, set smaller (down to 13 px) when it would not fit the line;
 * returns the height it takes (0 without a title).
 */
function drawTitle(ctx: SVGContext, title: string | null, width: number): number {
  if (!title) return 0;
  const room = width - 2 * MARGIN_X;
  // Bold Academico averages under 0.6 of its size per character (a safe over-estimate).
  const size = Math.max(13, Math.min(TITLE_SIZE, Math.floor(room / (title.length * 0.6))));
  svgText(ctx, title, width / 2, TITLE_HEIGHT - 10, 'tensile-title', { size, weight: 'bold' });
  return TITLE_HEIGHT;
}

function naturalBarWidth(
  bar: NotationBar,
  measured: number,
  model: NotationModel,
  room: {
    readonly note: number;
    readonly count: number;
    readonly air: number;
    /** The text rows' least size when the bar must hold them at it (print), else null. */
    readonly text: number | null;
    readonly sticking: boolean;
    readonly counts: boolean;
  },
): number {
  // Room to breathe beyond the tightest setting, never under the least room a note, and room
  // for the count.
  return (
    Math.max(
      measured * room.air,
      densestWidth(bar, room),
      // Some room per quarter note of time even where a beat holds one note (40 px on a screen,
      // closer on paper, in step with the least room per note): a 12/8 bar's twelve eighths
      // are six quarters' time, not twelve beats'.
      ((model.meter.beats * 4) / model.meter.unit) * 40 * (room.note / NOTE_ROOM),
      textRowsWidth(bar, room),
    ) + 20
  );
}

/**
 * The room the bar needs where its written instants, sticking letters or counting syllables
 * stand closest in time: the grid voice gives equal time equal room across the bar, so the
 * densest spot sets the whole bar's width (E. Gould, "Behind Bars", Faber Music 2011, ch.
 * "Horizontal spacing": space in proportion to duration; from memory). Summing notes over the bar
 * instead leaves a bar of eighths with one beat of sixteenths squeezed in that beat.
 */
function densestWidth(
  bar: NotationBar,
  room: {
    readonly note: number;
    readonly count: number;
    readonly text: number | null;
    readonly sticking: boolean;
  },
): number {
  const beats = bar.beats.length;
  const timeOf = (beat: number, slot: number) =>
    beat - 1 + slot / (bar.beats[beat - 1]?.subdivision ?? 1);
  const written = bar.layers.flatMap((layer) => layer.events.map((e) => timeOf(e.beat, e.slot)));
  let need = (room.note * beats) / closest(written, beats);
  if (room.count > 0)
    need = Math.max(need, room.count * Math.max(...bar.beats.map((b) => b.subdivision)) * beats);
  if (room.sticking) {
    const struck = bar.beats.flatMap((b) => b.sticking.map((s) => timeOf(b.beat, s.slot)));
    // A screen keeps its letters' full size and gap; paper, set closer, lets crowded letters
    // move apart about their middle (see `drawSticking`) as long as each keeps its width.
    const pitch = room.text === null ? stickingPitch() : room.text * LETTER_WIDTH + LETTER_GAP;
    if (struck.length > 0) need = Math.max(need, (pitch * beats) / closest(struck, beats));
  }
  return need;
}

/** The least time, in beats, between neighbouring `times` of a bar of `beats` (the last to its end). */
function closest(times: readonly number[], beats: number): number {
  const sorted = [...new Set(times)].sort((a, b) => a - b);
  let least = sorted.length > 0 ? beats - sorted[sorted.length - 1]! : beats;
  for (let i = 1; i < sorted.length; i++) least = Math.min(least, sorted[i]! - sorted[i - 1]!);
  return Math.max(least, 1e-3);
}

/**
 * Room the bar's text rows take at their least size, where the host asks for one (print): every
 * counting syllable with its gap, and a sticking letter with its gap over every struck instant.
 */
function textRowsWidth(
  bar: NotationBar,
  room: { readonly text: number | null; readonly sticking: boolean; readonly counts: boolean },
): number {
  if (room.text === null) return 0;
  const size = room.text;
  const counts = room.counts
    ? syllableRowWidth(
        bar.beats.flatMap((beat) => beat.counts.map((c) => c.text)),
        size,
      )
    : 0;
  const struck = bar.beats.reduce((n, beat) => n + beat.sticking.length, 0);
  const sticking = room.sticking ? struck * (size * LETTER_WIDTH + LETTER_GAP) : 0;
  return Math.max(counts, sticking);
}

/** Least room per written note on a screen, in pixels. */
const NOTE_ROOM = 22;

/**
 * The least a bar may be set in when a line holds only it and it would not fit otherwise: its
 * notes at VexFlow's tightest setting with a little air, and room for every counting syllable at
 * the smallest size (the text rows shrink their letters to fit, never below 10 px).
 */
function leastBarWidth(
  bar: NotationBar,
  measured: number,
  model: NotationModel,
  showCounts: boolean,
): number {
  const counted = showCounts ? bar.beats.reduce((n, beat) => n + beat.subdivision, 0) : 0;
  return Math.max(measured * 1.1, counted * LEAST_COUNT_ROOM, model.meter.beats * 28) + 16;
}

/** Least room per counted slot: a two-letter syllable at 10 px with a gap. */
const LEAST_COUNT_ROOM = 14;

/** Space between the key's band and the first system's band, and between the marks and the key. */
const KEY_GAP = 8;
const KEY_GAP_X = 24;

/** Room for what opens a system: the clef on every system, the time signature on the first. */
function systemStartWidths(model: NotationModel): (systemIndex: number) => number {
  // One stave measured as its modifiers go on (each one re-formats it): a stave costs more to
  // build than to measure.
  const stave = new Stave(0, 0, 400);
  const plain = stave.getNoteStartX();
  const clef = stave.addClef('percussion').getNoteStartX() - plain;
  const clefAndTime = stave.addTimeSignature(timeSignatureOf(model)).getNoteStartX() - plain;
  return (systemIndex) => (systemIndex === 0 ? clefAndTime : clef);
}

function timeSignatureOf(model: NotationModel): string {
  return `${model.meter.beats}/${model.meter.unit}`;
}

/**
 * The grouping of an odd meter written over its time signature, which stays the meter itself
 * ("2+2+3" over 7/8): the usual way to show how the bar divides without changing the signature
 * (common practice; E. Gould, "Behind Bars", Faber Music 2011, ch. "Time signatures", from
 * memory). The beams show the same groups in every bar.
 */
function drawGrouping(ctx: SVGContext, model: NotationModel, stave: Stave, topLineY: number): void {
  const label = groupingLabel(model);
  const signature = stave.getModifiers(StaveModifierPosition.BEGIN, TimeSignature.CATEGORY)[0];
  if (!label || !signature) return;
  const x = signature.getX() + signature.getWidth() / 2;
  svgText(ctx, label, x, topLineY - 8, 'tensile-grouping', { size: 13, weight: 'bold' });
}

/**
 * The stave of one bar. The clef opens every system, but the time signature is written once, at
 * the start of the drill: it is only restated where the meter changes (E. Gould, "Behind Bars",
 * Faber Music 2011, ch. "Time signatures"; from memory), and a drill keeps one meter throughout.
 */
function staveFor(
  bar: NotationBar,
  model: NotationModel,
  x: number,
  y: number,
  width: number,
  opensSystem: boolean,
  barIndex: number,
): Stave {
  const stave = new Stave(x, y, width);
  if (opensSystem) stave.addClef('percussion');
  if (barIndex === 0) stave.addTimeSignature(timeSignatureOf(model));
  stave.setMeasure(bar.bar);
  // A drill is a loop: repeat signs around the whole drill say so in the trade's own terms.
  if (barIndex === 0) stave.setBegBarType(BarlineType.REPEAT_BEGIN);
  if (barIndex === model.bars.length - 1) stave.setEndBarType(BarlineType.REPEAT_END);
  return stave;
}

function formatBar(engraved: EngravedBar, stave: Stave, grids: GridVoices): void {
  const voices = formattedVoices(engraved, grids);
  barFormatter().joinVoices(voices).formatToStave(voices, stave);
  // Every voice keeps its own rests (hands' high, feet's low, as two-voice parts are written), so
  // each voice's values add up to its beat; VexFlow would draw one rest for two voices resting
  // together, leaving the feet's tuplet a value short.
  for (const { note, event } of engraved.notes)
    if (event.kind === 'rest') note.renderOptions.draw = true;
  // Stems reach their beams before anything hangs on them: VexFlow places an accent at the stem's
  // tip when the note is drawn, and a beam fixed its stems' length when the bar was first
  // measured (before the notes had a stave), so without this the accent of a beamed note lands
  // inside the beam.
  for (const { note } of engraved.notes) note.setStave(stave);
  for (const { beam } of engraved.beams) {
    beam.postFormatted = false;
    beam.postFormat();
  }
}

function drawBar(
  ctx: SVGContext,
  bar: NotationBar,
  engraved: EngravedBar,
  stave: Stave,
  options: RenderOptions,
  topLineY: number,
  stickingY: number,
  counts: { readonly size: number; readonly layout: CountLayout | null },
  stacked: boolean,
): void {
  const group = ctx.openGroup();
  group.setAttribute('class', 'tensile-bar');
  group.setAttribute('data-bar', String(bar.bar));
  stave.setContext(ctx).draw();
  for (const { layer } of engraved.voices) {
    const layerGroup = ctx.openGroup();
    layerGroup.setAttribute('class', 'tensile-voice');
    layerGroup.setAttribute('data-voice', layer);
    for (const engravedNote of engraved.notes.filter((n) => n.layer === layer)) {
      drawNote(ctx, engravedNote);
    }
    for (const { beam } of engraved.beams.filter((b) => b.layer === layer))
      beam.setContext(ctx).draw();
    for (const t of engraved.tuplets.filter((t) => t.layer === layer && t.shown)) {
      const tupletGroup = ctx.openGroup();
      tupletGroup.setAttribute('class', 'tensile-tuplet');
      tupletGroup.setAttribute('data-tuplet', String(t.numNotes));
      tupletGroup.setAttribute('data-beat', String(t.beat));
      t.tuplet.setContext(ctx).draw();
      if (t.simile) drawSimile(ctx, t.tuplet, layer);
      ctx.closeGroup();
    }
    ctx.closeGroup();
  }
  if (bar.carried) {
    // Over the system's top row of letters (a stack elsewhere in the bar would meet the word).
    const top = options.showSticking ? stickingY - (stacked ? STICKING_LINE : 0) : null;
    drawCarried(ctx, bar, engraved, top, topLineY);
  }
  drawBeatTexts(ctx, bar, engraved, stave, {
    stickingY: options.showSticking ? stickingY : null,
    countsY: options.showCounts ? topLineY + 4 * STAVE_SPACE + FOOTROOM + 16 : null,
    countSize: counts.size,
    counts: counts.layout,
    ...(options.leastTextSize === undefined ? {} : { leastSize: options.leastTextSize }),
  });
  ctx.closeGroup();
}

/**
 * Over each note bar 1 carries from the loop's last bar, a small italic word saying whose beat it
 * is ("late 4, from bar 8"), above its sticking letters (see `carriedIntoFirstBar`).
 */
function drawCarried(
  ctx: SVGContext,
  bar: NotationBar,
  engraved: EngravedBar,
  /** The top row of sticking letters' baseline, or null without sticking. */
  stickingY: number | null,
  topLineY: number,
): void {
  const extents = noteExtents(engraved);
  for (const carried of bar.carried ?? []) {
    const i = engraved.notes.findIndex(
      ({ beat, event }) =>
        beat === carried.beat &&
        event.slot === carried.slot &&
        event.heads.some((head) => head.voice === carried.voice),
    );
    if (i < 0) continue;
    // Clear of the letters' caps over the note, or, without sticking, where the letters would be.
    const y =
      stickingY === null
        ? Math.min(topLineY - STAVE_SPACE, highestMark([engraved], topLineY) - STICKING_CLEARANCE)
        : stickingY - CARRIED_ABOVE_LETTERS;
    const hint = svgText(
      ctx,
      `late ${carried.fromBeat}, from bar ${carried.fromBar}`,
      extents[i]!.left - 2,
      y,
      'tensile-carried',
      { size: CARRIED_SIZE, anchor: 'start' },
    );
    hint.setAttribute('font-style', 'italic');
    hint.setAttribute('data-beat', String(carried.beat));
    hint.setAttribute('data-slot', String(carried.slot));
  }
}
/** The carried note's word: smaller than the sticking (15 px), as a cue's text is. */
const CARRIED_SIZE = 11;
/** Baseline of the word over the top letter's baseline: the letter's cap height and a gap. */
const CARRIED_ABOVE_LETTERS = 15;

/**
 * A bracket whose group ends on a longer value runs on over that value's time, to just before the
 * next beat's first column, so its number has room and both its ends stand clear of the notes and
 * rests (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets": the bracket spans the whole
 * group; from memory. Running it over the last value's time is common practice in proportionally
 * spaced parts).
 */
function reachTuplets(engraved: EngravedBar, stave: Stave): void {
  const extents = noteExtents(engraved);
  for (const t of engraved.tuplets) {
    if (!t.shown || !t.endsLong) continue;
    let next = stave.getNoteEndX();
    engraved.notes.forEach(({ beat }, i) => {
      if (beat > t.beat) next = Math.min(next, extents[i]!.left);
    });
    t.tuplet.reachTo(next - BRACKET_CLEARANCE);
  }
}
/** Room left between a bracket run on and the next beat's first note or rest: the next bracket
 * starts 5 px before that note, so about as far apart as two brackets of a shuffle's hands. */
const BRACKET_CLEARANCE = 18;

/** "sim." after a tuplet bracket, on the bracket's line, italic as performance words are. */
function drawSimile(ctx: SVGContext, tuplet: Tuplet, layer: string): void {
  const notes = tuplet.getNotes();
  const first = notes[0];
  const last = notes[notes.length - 1];
  if (!first || !last) return;
  // On the line of the bracket's number, as the number's words (common practice), so it reads
  // with the brackets and not with the sticking above them; past a bracket's end hook.
  const y = tuplet.getYPosition() + (layer === 'hands' ? SIMILE_BASELINE : 16);
  const { bracketed } = (tuplet as unknown as { options: { bracketed?: boolean } }).options;
  const x = bracketed
    ? first.getTieLeftX() - 5 + tuplet.getWidth() + SIMILE_GAP
    : last.getTieRightX() + SIMILE_GAP;
  const label = svgText(ctx, 'sim.', x, y, 'tensile-simile', {
    size: 13,
    anchor: 'start',
  });
  label.setAttribute('font-style', 'italic');
}

function drawNote(ctx: SVGContext, engraved: EngravedNote): void {
  const { note, event, beat } = engraved;
  const group = ctx.openGroup();
  group.setAttribute('class', event.kind === 'rest' ? 'tensile-rest' : 'tensile-note');
  group.setAttribute('data-beat', String(beat));
  group.setAttribute('data-slot', String(event.slot));
  // The written value ("16", "8d", "1" for a whole-bar rest), so the spelling can be checked.
  group.setAttribute('data-duration', `${event.duration.value}${event.duration.dots ? 'd' : ''}`);
  if (event.kind === 'note') {
    group.setAttribute('data-instruments', event.heads.map((h) => h.voice).join(' '));
    group.setAttribute('data-positions', event.heads.map((h) => h.position).join(' '));
  }
  // (The note has its stave since the bar was formatted.) This drawing has no hit areas.
  note.setContext(ctx).drawWithoutHitArea();
  ctx.closeGroup();
}

/**
 * Beat areas: from just before each beat's first note or rest to just before the next beat's. A
 * beat where nothing starts (a dotted quarter of 6/8 covers three) gets the place its time gives
 * it between the written instants around it, as the counting syllables do.
 */
function beatBoxes(bar: NotationBar, engraved: EngravedBar, stave: Stave): BeatBox[] {
  const written = bar.beats.map(() => new Map<number, number>());
  const extents = noteExtents(engraved);
  for (const [i, { beat, event }] of engraved.notes.entries()) {
    const slots = written[beat - 1];
    if (!slots) continue;
    const x = extents[i]!.left;
    slots.set(event.slot, Math.min(slots.get(event.slot) ?? Infinity, x));
  }
  const anchors = bar.beats.map((beat, i) => ({
    subdivision: beat.subdivision,
    written: written[i]!,
  }));
  const starts = countPositions(anchors, stave.getNoteStartX(), stave.getNoteEndX()).map(
    (slots) => slots[0]!,
  );
  const lead = 6;
  return bar.beats.map((beat, i) => {
    const x = starts[i]! - lead;
    const next = starts[i + 1];
    const end = next === undefined ? stave.getNoteEndX() : next - lead;
    return { beat: beat.beat, x, width: end - x };
  });
}
