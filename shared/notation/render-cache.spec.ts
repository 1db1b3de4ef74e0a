/**
 * The engraving cache and the engraving in steps must never change the drawing: every pass with
 * a cache is compared with a pass without one (the oracle), for edits that change nothing in the
 * bars, one bar, or all of them; and the cache must actually spare the systems an edit leaves.
 */
import { createRequire } from 'node:module';
import { createCanvas, GlobalFonts } from '@napi-rs/canvas';
import { JSDOM } from 'jsdom';
import { Element as VexElement } from 'vexflow/bravura';
import { Stave } from 'vexflow/core';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Drill } from '../generator/drill';
import { generateDrill, parseRuleCard } from '../generator/index';
import { buildNotation, type NotationModel } from './notation-model';
import {
  EngravingCache,
  notationSteps,
  renderNotation,
  type RenderOptions,
} from './render-vexflow';

const require = createRequire(import.meta.url);
const dom = new JSDOM('<!doctype html><html><body></body></html>');
const global = globalThis as { document?: Document };
let previous: Document | undefined;

beforeAll(() => {
  GlobalFonts.registerFromPath(require.resolve('@vexflow-fonts/bravura/bravura.otf'), 'Bravura');
  GlobalFonts.registerFromPath(
    require.resolve('@vexflow-fonts/academico/academico.otf'),
    'Academico',
  );
  VexElement.setTextMeasurementCanvas(createCanvas(400, 200) as unknown as HTMLCanvasElement);
  previous = global.document;
  // VexFlow's SVG context creates its elements through the global `document`.
  global.document = dom.window.document;
});

afterAll(() => {
  if (previous === undefined) delete global.document;
  else global.document = previous;
});

/** A heavy card of every rule kind (invented for this test). */
const CARD = {
  meter: { beats: 4, unit: 4 },
  bars: 8,
  subdivision: 4,
  tempo: 96,
  voices: ['kick', 'snare', 'hihat', 'tomHigh'],
  ostinato: { voice: 'hihat', slots: [2], dynamic: 'normal' },
  density: 0.3,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4 },
    { kind: 'phrase', every: 4, fillBeats: 2, voices: ['snare', 'tomHigh'] },
    { kind: 'fillHoles', voices: ['snare'], ghost: 0.5, accent: 0 },
    { kind: 'linear', maxOverlaps: 12 },
    { kind: 'polyrhythm', voices: ['tomHigh'], against: 4, span: 3 },
    { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, rotation: 1 },
  ],
};

function drillOf(seed: string, tempo = 96): Drill {
  return generateDrill(parseRuleCard({ ...CARD, tempo }), seed);
}

function container(): HTMLElement {
  return dom.window.document.createElement('div');
}

/** The drawing as text, without VexFlow's running element numbers (they count every pass). */
function text(svg: SVGSVGElement): string {
  return svg.outerHTML.replace(/ id="vf-[^"]*"/g, '');
}

/** `drill` with one bar (the first that differs) taken from `other`. */
/** The bars (numbers) that share a system with `bar` when `drill` is drawn without a cache. */
function barsOfChangedSystem(drill: Drill, bar: number, options: RenderOptions): number[] {
  const { bars } = renderNotation(container(), buildNotation(drill), options);
  const system = bars.find((box) => box.bar === bar)?.system;
  expect(system).toBeDefined();
  return bars.filter((box) => box.system === system).map((box) => box.bar);
}

function withOneBarOf(drill: Drill, other: Drill): { drill: Drill; bar: number } {
  const index = drill.bars.findIndex(
    (bar, i) => JSON.stringify(bar.hits) !== JSON.stringify(other.bars[i]!.hits),
  );
  expect(index).toBeGreaterThanOrEqual(0);
  const bars = drill.bars.map((bar, i) =>
    i === index ? { ...other.bars[i]!, bar: bar.bar } : bar,
  );
  return { drill: { ...drill, bars }, bar: drill.bars[index]!.bar };
}

const SCREENS: readonly RenderOptions[] = [
  // The editor's narrow preview (a bar a system) and a wide page (several bars a system).
  { width: 420, showSticking: true, showCounts: true, showTension: true, ink: 'currentColor' },
  { width: 1100, showSticking: true, showCounts: true },
  { width: 1100, showSticking: false, showCounts: false },
];

// Several full engravings a test: generous for a busy machine.
describe('the engraving cache', { timeout: 120_000 }, () => {
  for (const options of SCREENS) {
    it(`draws what a pass without it draws, at ${options.width} px, counts ${options.showCounts}`, () => {
      const cache = new EngravingCache();
      const first = drillOf('amber-fox');
      // Same bars at another tempo (only the mark above the first system changes).
      const tempo = drillOf('amber-fox', 80);
      const other = drillOf('quiet-river');
      const oneBar = withOneBarOf(first, other).drill;
      expect(JSON.stringify(tempo.bars)).toBe(JSON.stringify(first.bars));
      // One page for the cached passes, so each updates the last one's drawing in place.
      const page = container();
      const before = renderNotation(page, buildNotation(first), { ...options, cache });
      expect(text(before.svg)).toBe(
        text(renderNotation(container(), buildNotation(first), options).svg),
      );
      for (const drill of [tempo, oneBar, other, first]) {
        const model: NotationModel = buildNotation(drill);
        const cached = renderNotation(page, model, { ...options, cache });
        expect(page.childNodes.length === 1 && page.firstChild === cached.svg).toBe(true);
        const fresh = renderNotation(container(), model, options);
        expect(text(cached.svg)).toBe(text(fresh.svg));
        const { svg: _cachedSvg, ...cachedLayout } = cached;
        const { svg: _freshSvg, ...freshLayout } = fresh;
        expect(cachedLayout).toEqual(freshLayout);
      }
    });
  }

  it('engraves afresh only the bars of systems an edit changed', () => {
    const options = SCREENS[0]!;
    const cache = new EngravingCache();
    const first = drillOf('amber-fox');
    const other = drillOf('quiet-river');
    // Every bar engraved gets its stave numbered; a bar taken whole from the cache does not.
    const numbered = vi.spyOn(Stave.prototype, 'setMeasure');
    const engravedBars = (drill: Drill) => {
      numbered.mockClear();
      renderNotation(container(), buildNotation(drill), { ...options, cache });
      return numbered.mock.calls.map(([bar]) => bar);
    };
    try {
      expect(engravedBars(first)).toEqual(first.bars.map((bar) => bar.bar));
      // The tempo leaves every bar as it was.
      expect(engravedBars(drillOf('amber-fox', 80))).toEqual([]);
      const oneBar = withOneBarOf(first, other);
      // On this narrow line only the changed bar's system is new (these bars keep the counting's
      // size, which would otherwise change every system); the other systems come whole.
      const changed = barsOfChangedSystem(oneBar.drill, oneBar.bar, options);
      expect(changed.length).toBeLessThan(first.bars.length);
      expect(engravedBars(oneBar.drill)).toEqual(changed);
    } finally {
      numbered.mockRestore();
    }
  });
});

describe('the drawing on the page', () => {
  it('is updated in place: the systems an edit left stay the same elements', () => {
    const options = SCREENS[0]!;
    const cache = new EngravingCache();
    const page = container();
    const systems = (svg: SVGSVGElement) => [...svg.querySelectorAll(':scope > .tensile-system')];
    const first = drillOf('amber-fox');
    const shown = renderNotation(page, buildNotation(first), { ...options, cache }).svg;
    const before = systems(shown);
    const moved = new dom.window.MutationObserver(() => undefined);
    moved.observe(shown, { childList: true });
    const tempo = renderNotation(page, buildNotation(drillOf('amber-fox', 80)), {
      ...options,
      cache,
    });
    expect(tempo.svg).toBe(shown);
    expect(systems(tempo.svg).every((group, i) => group === before[i])).toBe(true);
    // Nor is a kept system taken out and put back (a move costs the browser as much as a new one).
    const touched = moved.takeRecords().flatMap((r) => [...r.addedNodes, ...r.removedNodes]);
    moved.disconnect();
    expect(touched.filter((node) => before.includes(node as Element))).toEqual([]);
    // (The marks were replaced, so the watch did see the change.)
    expect(touched.length).toBeGreaterThan(0);
    expect(tempo.svg.querySelector('.tensile-marks')?.getAttribute('aria-label')).toContain('80');
    const oneBar = withOneBarOf(first, drillOf('quiet-river'));
    const after = systems(
      renderNotation(page, buildNotation(oneBar.drill), { ...options, cache }).svg,
    );
    // The changed bar's system alone is a new element.
    const changed = barsOfChangedSystem(oneBar.drill, oneBar.bar, options);
    const layout = renderNotation(container(), buildNotation(oneBar.drill), options);
    const systemOf = new Map(layout.bars.map((box) => [box.bar, box.system]));
    const newSystem = systemOf.get(changed[0]!);
    expect(after.length).toBeGreaterThan(1);
    expect(after.map((group, i) => group === before[i])).toEqual(
      after.map((_, i) => i !== newSystem),
    );
    // Drawn into another container, the kept systems are copies: the page keeps its own, and
    // the copy draws what a pass without the cache draws.
    const model = buildNotation(oneBar.drill);
    const elsewhere = renderNotation(container(), model, { ...options, cache }).svg;
    expect(systems(elsewhere).some((group) => after.includes(group))).toBe(false);
    expect(after.every((group) => group.parentNode === page.firstChild)).toBe(true);
    expect(text(elsewhere)).toBe(text(renderNotation(container(), model, options).svg));
  });
});

describe('a new score put on the page a few systems at a time', () => {
  const options = { ...SCREENS[0]!, systemsAtOnce: 2 };
  const systems = (svg: SVGSVGElement) => [...svg.querySelectorAll(':scope > .tensile-system')];

  it('keeps the old systems in place until shown, then draws what a full redraw draws', () => {
    // The same passes all at once say which systems the new drill keeps.
    const wholeCache = new EngravingCache();
    const wholePage = container();
    const wholeBefore = systems(
      renderNotation(wholePage, buildNotation(drillOf('amber-fox')), {
        ...SCREENS[0]!,
        cache: wholeCache,
      }).svg,
    );
    const model = buildNotation(drillOf('quiet-river'));
    const kept = systems(
      renderNotation(wholePage, model, { ...SCREENS[0]!, cache: wholeCache }).svg,
    ).map((group, i) => group === wholeBefore[i]);
    const fresh = kept.flatMap((isKept, i) => (isKept ? [] : [i]));
    // (These two drills share a system or two, but most are new.)
    expect(fresh.length).toBeGreaterThan(3);
    const cache = new EngravingCache();
    const page = container();
    const shown = renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    const before = systems(shown.svg);
    // The host's names, which the later systems must take over.
    before.forEach((group, i) => (group.id = `score-system-${i}`));
    const brackets = (svg: SVGSVGElement) => svg.querySelector(':scope > .tensile-polyrhythms');
    const oldBrackets = brackets(shown.svg);
    expect(oldBrackets?.hasChildNodes()).toBe(true);
    const next = renderNotation(page, model, { ...options, cache });
    expect(next.svg).toBe(shown.svg);
    const during = systems(next.svg);
    expect(during).toHaveLength(before.length);
    // The first two new systems at once; the other new ones still the old elements, in place.
    expect(during.map((group, i) => group === before[i])).toEqual(
      kept.map((isKept, i) => isKept || fresh.indexOf(i) >= 2),
    );
    let more = 0;
    while (cache.showMore()) {
      more++;
      // The brackets (which every strip of the page copies) go up after the last system, alone.
      expect(brackets(next.svg)).toBe(oldBrackets);
    }
    // One system at a time, then the brackets alone: false with the last.
    expect(more).toBe(fresh.length - 2);
    expect(brackets(next.svg)).not.toBe(oldBrackets);
    const after = systems(next.svg);
    expect(after.map((group, i) => group === before[i])).toEqual(kept);
    // The waiting ones took their names over, and so did the first two when they went up early
    // (next to each other under kept systems); else the host names the two it was given at once.
    const wentUpEarly = fresh[1] === fresh[0]! + 1;
    const atOnce = new Set(wentUpEarly ? [] : fresh.slice(0, 2));
    expect(after.map((group) => group.id)).toEqual(
      before.map((group, i) => (atOnce.has(i) ? '' : group.id)),
    );
    after.forEach((group) => group.removeAttribute('id'));
    const full = renderNotation(container(), model, SCREENS[0]!);
    expect(text(next.svg)).toBe(text(full.svg));
    // A tempo typed in then redraws no system: nothing waits.
    renderNotation(page, buildNotation(drillOf('quiet-river', 80)), { ...options, cache });
    expect(cache.showMore()).toBe(false);
  });

  /** A system's drawing without any element's id (VexFlow's running numbers, the host's names). */
  const part = (group: Element) => group.outerHTML.replace(/ id="[^"]*"/g, '');

  /**
   * Steps `model` onto `page` (holding `shown`, its systems named by the host) up to the moment
   * its first systems are on the page, checks them there, then runs `meanwhile` and the rest.
   */
  const stepEarly = (
    page: HTMLElement,
    shown: SVGSVGElement,
    model: NotationModel,
    cache: EngravingCache,
    meanwhile = () => {},
  ) => {
    const before = systems(shown);
    before.forEach((group, i) => (group.id = `score-system-${i}`));
    const full = systems(renderNotation(container(), model, SCREENS[0]!).svg);
    const steps = notationSteps(page, model, { ...options, cache });
    let layout = steps.step();
    let early = false;
    while (layout === null) {
      if (!early && cache.shownEarly > 0) {
        early = true;
        expect(cache.shownEarly).toBe(2);
        const now = systems(shown);
        expect(page.firstChild).toBe(shown);
        // The new drill's first two systems, as a full redraw draws them, under the names of
        // the ones they replace; the rest still the old drawing's, in place.
        expect(now.slice(0, 2).map(part)).toEqual(full.slice(0, 2).map(part));
        expect(now.slice(0, 2).map((group) => group.id)).toEqual([
          'score-system-0',
          'score-system-1',
        ]);
        expect(now.slice(2)).toEqual(before.slice(2));
        meanwhile();
      }
      layout = steps.step();
    }
    expect(early).toBe(true);
    return layout;
  };

  it('puts its first new systems up before the rest is drawn, then ends as a full redraw', () => {
    const cache = new EngravingCache();
    const page = container();
    const shown = renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    const model = buildNotation(drillOf('copper-wren'));
    const early = new Set(systems(shown.svg).slice(0, 2));
    const layout = stepEarly(page, shown.svg, model, cache);
    expect(layout.svg).toBe(shown.svg);
    // The systems put up early stay the same elements; the others wait for showMore.
    expect(
      systems(layout.svg)
        .slice(0, 2)
        .some((group) => early.has(group)),
    ).toBe(false);
    const first = systems(layout.svg).slice(0, 2);
    // (Some later systems may be the same in both drills: those are kept, not waiting.)
    expect(cache.waitingSystems().length).toBeGreaterThan(0);
    expect(cache.waitingSystems().every((system) => system >= 2)).toBe(true);
    while (cache.showMore());
    expect(cache.waitingSystems()).toEqual([]);
    expect(systems(layout.svg).slice(0, 2)).toEqual(first);
    systems(layout.svg).forEach((group) => group.removeAttribute('id'));
    expect(text(layout.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
  });

  it('draws the same when the page is redrawn or a newer pass comes after the early systems', () => {
    const cache = new EngravingCache();
    const page = container();
    const shown = renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    const model = buildNotation(drillOf('copper-wren'));
    // Redrawn meanwhile without the cache (as print does): the pass updates that drawing.
    const layout = stepEarly(page, shown.svg, model, cache, () => {
      renderNotation(page, buildNotation(drillOf('quiet-river')), SCREENS[0]!);
    });
    expect(page.childNodes.length === 1 && page.firstChild === layout.svg).toBe(true);
    while (cache.showMore());
    systems(layout.svg).forEach((group) => group.removeAttribute('id'));
    expect(text(layout.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
    // A newer pass once the early systems are up, before the rest: it draws as a full redraw.
    const again = renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    let last = again;
    stepEarly(page, again.svg, buildNotation(drillOf('copper-wren', 80)), cache, () => {
      last = renderNotation(page, buildNotation(drillOf('quiet-river')), { ...options, cache });
    });
    const newer = buildNotation(drillOf('quiet-river'));
    last = renderNotation(page, newer, { ...options, cache });
    while (cache.showMore());
    expect(page.childNodes.length === 1 && page.firstChild === last.svg).toBe(true);
    systems(last.svg).forEach((group) => group.removeAttribute('id'));
    expect(text(last.svg)).toBe(text(renderNotation(container(), newer, SCREENS[0]!).svg));
  });

  it('updates the drawing on the page whichever cache drew it (a wider line has its own)', () => {
    const [one, other] = [new EngravingCache(), new EngravingCache()];
    const page = container();
    const shown = renderNotation(page, buildNotation(drillOf('amber-fox')), {
      ...options,
      cache: one,
    }).svg;
    const model = buildNotation(drillOf('copper-wren'));
    const next = renderNotation(page, model, { ...options, cache: other });
    // The other cache's pass updated the same drawing in place, a few systems at a time.
    expect(next.svg).toBe(shown);
    expect(other.showMore()).toBe(true);
    while (other.showMore());
    expect(text(next.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
  });

  it('draws the same when a newer pass comes before every system was shown', () => {
    const cache = new EngravingCache();
    const page = container();
    renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    renderNotation(page, buildNotation(drillOf('quiet-river')), { ...options, cache });
    expect(cache.showMore()).toBe(true);
    // Back to the first drill half-way: its systems come from the cache or afresh.
    const model = buildNotation(drillOf('amber-fox', 80));
    const last = renderNotation(page, model, { ...options, cache });
    while (cache.showMore());
    expect(page.childNodes.length === 1 && page.firstChild === last.svg).toBe(true);
    expect(text(last.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
  });
  it('puts its first new system up early below systems it keeps as they are', () => {
    const cache = new EngravingCache();
    const page = container();
    const shown = renderNotation(page, buildNotation(drillOf('amber-fox')), { ...options, cache });
    const before = systems(shown.svg);
    const model = buildNotation(drillOf('quiet-river'));
    const full = systems(renderNotation(container(), model, SCREENS[0]!).svg);
    // (These two drills share their first system, which stays as it is.)
    const first = full.findIndex((group, i) => part(group) !== part(before[i]!));
    expect(first).toBeGreaterThan(0);
    const steps = notationSteps(page, model, { ...options, systemsFirst: 1, cache });
    let layout = steps.step();
    let early = false;
    while (layout === null) {
      if (!early && cache.shownEarly > 0) {
        early = true;
        expect(cache.shownEarly).toBe(first + 1);
        const now = systems(shown.svg);
        expect(now.slice(0, first)).toEqual(before.slice(0, first));
        expect(part(now[first]!)).toBe(part(full[first]!));
        expect(now.slice(first + 1)).toEqual(before.slice(first + 1));
      }
      layout = steps.step();
    }
    expect(early).toBe(true);
    while (cache.showMore());
    expect(text(layout.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
  });

  it("puts a bar-a-line score's first system up before its other bars are measured", () => {
    const cache = new EngravingCache();
    const page = container();
    const model = buildNotation(drillOf('copper-wren'));
    // The drill before has another first bar, so the first system is new.
    const before = ['amber-fox', 'quiet-river', 'lesson-12', 'moss-21']
      .map((seed) => buildNotation(drillOf(seed)))
      .find((other) => JSON.stringify(other.bars[0]) !== JSON.stringify(model.bars[0]));
    renderNotation(page, before!, { ...options, cache });
    // (A bar a system on this narrow line.)
    const full = renderNotation(container(), model, SCREENS[0]!);
    expect(new Set(full.bars.map((box) => box.system)).size).toBe(model.bars.length);
    const steps = notationSteps(page, model, { ...options, systemsFirst: 1, cache });
    // Each bar measured is a step: the first system is up after fewer steps than there are bars.
    let taken = 1;
    let layout = steps.step();
    while (layout === null && cache.shownEarly === 0) {
      layout = steps.step();
      taken++;
    }
    expect(cache.shownEarly).toBe(1);
    expect(taken).toBeLessThan(model.bars.length);
    while (layout === null) layout = steps.step();
    while (cache.showMore());
    systems(layout.svg).forEach((group) => group.removeAttribute('id'));
    expect(text(layout.svg)).toBe(text(full.svg));
  });

  it("starts again in a later system's smaller counting, and ends as a full redraw", () => {
    // Sixteenths, then two bars of thirty-seconds, whose counting must be set smaller on a
    // narrow line: the first system goes up before the later ones are sized.
    const card = (subdivision: number) =>
      parseRuleCard({ ...CARD, bars: 8, subdivision, rules: [], ostinato: undefined });
    const sixteenths = buildNotation(generateDrill(card(4), 'amber-fox'));
    const thirtySeconds = buildNotation(generateDrill(card(8), 'copper-wren'));
    const model: NotationModel = {
      ...sixteenths,
      bars: sixteenths.bars.map((bar, i) =>
        i >= 6 ? { ...thirtySeconds.bars[i]!, bar: bar.bar } : bar,
      ),
    };
    const cache = new EngravingCache();
    const page = container();
    renderNotation(page, buildNotation(generateDrill(card(4), 'quiet-river')), {
      ...SCREENS[0]!,
      cache,
    });
    const early = vi.spyOn(cache, 'showEarly');
    const steps = notationSteps(page, model, { ...options, systemsFirst: 1, cache });
    let layout = steps.step();
    while (layout === null) layout = steps.step();
    // Shown early in the first size, then again in the smaller one.
    expect(early).toHaveBeenCalledTimes(2);
    while (cache.showMore());
    systems(layout.svg).forEach((group) => group.removeAttribute('id'));
    expect(text(layout.svg)).toBe(text(renderNotation(container(), model, SCREENS[0]!).svg));
  });
});

describe('the engraving in steps', () => {
  it('takes several steps, leaves the page alone until the last, and draws the same', () => {
    const options = SCREENS[0]!;
    const model = buildNotation(drillOf('amber-fox'));
    const target = container();
    const old = dom.window.document.createElement('p');
    target.append(old);
    const steps = notationSteps(target, model, options);
    let count = 0;
    let layout = steps.step();
    while (layout === null) {
      count++;
      expect(target.firstChild).toBe(old);
      layout = steps.step();
    }
    // At least a step a bar for measuring and a step a system for drawing.
    expect(count).toBeGreaterThanOrEqual(2 * model.bars.length);
    expect(target.firstChild).toBe(layout.svg);
    expect(text(layout.svg)).toBe(text(renderNotation(container(), model, options).svg));
  });
});
