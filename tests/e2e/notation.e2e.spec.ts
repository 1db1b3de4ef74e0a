/**
 * The drill page's notation in a real browser: a teacher opens the quintuplet, the triplet shuffle
 * and the 4:3 polyrhythm presets and the engraved SVG must hold one notehead per hit in the right
 * voice, the tuplet numbers the beats need (and no others), every notehead on the line or space
 * the drum-set convention gives its instrument, one time signature, and a counting syllable under
 * every slot. Expected values come from the drill itself, generated here in Node with
 * the same card and seed (the engine is deterministic across Node and browser).
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isHandVoice } from '../../shared/generator/drill';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { PRINT_LAYOUT, printedMm, printedPt } from '../../shared/notation/print-layout';
import { buildNotation, type NotationSource } from '../../shared/notation/notation-model';
import type { RenderOptions as AllRenderOptions } from '../../shared/notation/render-vexflow';
import {
  bundleForBrowser,
  launchChromium,
  recordForeignRequests,
  signIn,
} from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_STUDENTS, DEMO_TEACHERS } from '../support/demo-accounts';
import { STEP_PX, WEINBERG_STEPS } from '../support/drumset-staff';
import { collisions, crowded, overlaps, readScore, type ScoreGeometry } from './notation.geometry';

const SEED = 'lesson-12';
/** How long a page may take to show a state it was asked for, on a busy machine. */
const SETTLE_MS = 20_000;

type RawCard = Record<string, unknown>;
const QUINTUPLET = BUILT_IN_PRESETS.find((p) => {
  const sub = (p.card as RawCard)['subdivision'];
  return sub === 5 || (Array.isArray(sub) && sub.includes(5));
});
/** Triplet shuffle: hi-hat on slots 0 and 2 of every beat in three, so every beat is bracketed. */
const SHUFFLE = BUILT_IN_PRESETS.find((p) => p.id === 'shuffle-kick-upbeats');
const FOUR_OVER_THREE = BUILT_IN_PRESETS.find((p) =>
  (
    (p.card as RawCard)['rules'] as { kind: string; against?: number; span?: number }[] | undefined
  )?.some((r) => r.kind === 'polyrhythm' && r.against === 4 && r.span === 3),
);

/** Beats of prime size `n` where a layer plays off the beat: each needs an `n` bracket. */
function bracketsDue(drill: Drill, n: number, hands: boolean): number {
  return drill.bars.reduce(
    (count, bar) =>
      count +
      bar.beats.filter(
        (slots, i) =>
          slots === n &&
          bar.hits.some((h) => h.beat === i + 1 && h.slot !== 0 && isHandVoice(h.voice) === hands),
      ).length,
    0,
  );
}

/**
 * Every beat of the drill in one tuplet (five, seven): its numbers give way to "sim.". Triplets
 * keep every number (a shuffle's quarter and eighth reads straight without it; common practice).
 */
function inOneTupletThroughout(drill: Drill, n: number): boolean {
  return n !== 3 && drill.bars.every((bar) => bar.beats.every((slots) => slots === n));
}

interface Engraving {
  heads: Record<'hands' | 'feet', number>;
  tuplets: Record<'hands' | 'feet', string[]>;
  /** Each notehead's centre minus where its voice belongs, in pixels. */
  misplaced: { voice: string; off: number }[];
  placed: number;
  timeSignatures: number;
  counts: number;
}

/** Reads the score's SVG geometry as the browser laid it out (bounding boxes, not attributes). */
async function readEngraving(page: Page): Promise<Engraving> {
  return page.locator('tensile-drill-score svg.tensile-notation').evaluate(
    (svg, { steps, stepPx }) => {
      const result: Engraving = {
        heads: { hands: 0, feet: 0 },
        tuplets: { hands: [], feet: [] },
        misplaced: [],
        placed: 0,
        timeSignatures: svg.querySelectorAll('.tensile-bar .vf-timesignature').length,
        counts: svg.querySelectorAll('.tensile-count').length,
      };
      for (const layer of ['hands', 'feet'] as const) {
        result.heads[layer] = svg.querySelectorAll(
          `[data-voice="${layer}"] .tensile-note .vf-notehead`,
        ).length;
        result.tuplets[layer] = [
          ...svg.querySelectorAll(`[data-voice="${layer}"] [data-tuplet]`),
        ].map((t) => t.getAttribute('data-tuplet') ?? '');
      }
      for (const bar of svg.querySelectorAll('.tensile-bar')) {
        const lines = [...bar.querySelectorAll(':scope > .vf-stave path')].map(
          (p) => (p as SVGGraphicsElement).getBBox().y,
        );
        const topLine = Math.min(...lines);
        for (const note of bar.querySelectorAll('.tensile-note')) {
          const voices = (note.getAttribute('data-instruments') ?? '').split(' ');
          note.querySelectorAll('.vf-notehead').forEach((head, i) => {
            const glyph = head.querySelector('text') as SVGGraphicsElement;
            const box = glyph.getBBox();
            const voice = voices[i] ?? '';
            const expected = topLine + (4 - (steps as Record<string, number>)[voice]!) * stepPx;
            result.placed++;
            const off = box.y + box.height / 2 - expected;
            if (Math.abs(off) > 1.5) result.misplaced.push({ voice, off });
          });
        }
      }
      return result;
    },
    { steps: WEINBERG_STEPS, stepPx: STEP_PX },
  );
}

describe('drill page notation (Chromium)', () => {
  const suite = useServerAndBrowser();
  let context: BrowserContext;
  let page: Page;
  let foreign: string[];

  beforeAll(async () => {
    expect(QUINTUPLET, 'a built-in quintuplet preset').toBeDefined();
    expect(SHUFFLE, 'the built-in triplet shuffle preset').toBeDefined();
    expect(FOUR_OVER_THREE, 'a built-in 4:3 polyrhythm preset').toBeDefined();
    context = await suite.browser.newContext({ viewport: { width: 1366, height: 1000 } });
    page = await context.newPage();
    foreign = recordForeignRequests(page);
    const teacher = DEMO_TEACHERS[0]!;
    await signIn(page, suite.server.url, teacher.email, teacher.password);
  });

  afterAll(async () => {
    await context?.close();
  });

  // `tuplet`: the bracket number the preset must show, or null when it must show none (4:3 is
  // written in plain sixteenths across three quarter-note beats).
  for (const [name, preset, tuplet] of [
    ['quintuplet', QUINTUPLET, 5],
    ['triplet shuffle', SHUFFLE, 3],
    ['4:3 polyrhythm', FOUR_OVER_THREE, null],
  ] as const) {
    it(`engraves the ${name} preset as the convention writes it`, async () => {
      const drill = generateDrill(parseRuleCard(preset!.card), SEED);
      await page.goto(`${suite.server.url}/drills/${encodeURIComponent(preset!.id)}?seed=${SEED}`);
      await page.getByRole('heading', { level: 1, name: preset!.title }).waitFor();
      await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
      const engraving = await readEngraving(page);

      for (const layer of ['hands', 'feet'] as const) {
        const hits = drill.bars
          .flatMap((bar) => bar.hits)
          .filter((h) => isHandVoice(h.voice) === (layer === 'hands'));
        expect(engraving.heads[layer], `${layer} noteheads`).toBe(hits.length);
        for (const n of [3, 5, 7]) {
          // A drill in one tuplet throughout may write "sim." after a number (checked below).
          if (inOneTupletThroughout(drill, n)) continue;
          const due = bracketsDue(drill, n, layer === 'hands');
          expect(
            engraving.tuplets[layer].filter((t) => t === String(n)).length,
            `${layer} ${n}-brackets`,
          ).toBe(due);
        }
      }
      expect(engraving.placed).toBe(drill.bars.reduce((n, bar) => n + bar.hits.length, 0));
      expect(engraving.misplaced).toEqual([]);
      const bracketed = [...engraving.tuplets.hands, ...engraving.tuplets.feet];
      if (tuplet === null) {
        expect(bracketed).toEqual([]);
      } else if (inOneTupletThroughout(drill, tuplet)) {
        // E. Gould, "Behind Bars", ch. "Tuplets" (from memory): once the pattern is set in a
        // part, its numbers give way to "sim." where that is unambiguous; each voice with
        // tuplets is such a part, and a group with a rest or written in fewer values than its
        // tuplet keeps its number (checked on the model in engraving-rules.spec.ts), so a part
        // may have no group after which "sim." is unambiguous.
        const parts = [engraving.tuplets.hands, engraving.tuplets.feet].filter(
          (_, i) => bracketsDue(drill, tuplet, i === 0) > 0,
        ).length;
        expect(parts).toBeGreaterThan(0);
        expect(bracketed.length).toBeGreaterThanOrEqual(parts);
        expect(bracketed.every((t) => t === String(tuplet))).toBe(true);
        const similes = await page.locator('tensile-drill-score svg .tensile-simile').count();
        expect(similes).toBeLessThanOrEqual(parts);
      } else {
        // One bracket per beat with a voice layer on the tuplet grid, counted from the drill.
        const due = bracketsDue(drill, tuplet, true) + bracketsDue(drill, tuplet, false);
        expect(due, `beats in ${tuplet} with off-beat notes`).toBeGreaterThan(0);
        expect(bracketed.filter((t) => t === String(tuplet))).toHaveLength(due);
      }
      // Time signature once, at the start; a syllable under every slot of every beat.
      expect(engraving.timeSignatures).toBe(1);
      expect(engraving.counts).toBe(
        drill.bars.reduce((n, bar) => n + bar.beats.reduce((a, b) => a + b, 0), 0),
      );
    });
  }

  it("scrolls the cursor's line into view when it moves to a line off screen", async () => {
    // A short window, so the drill's later lines start below the fold; reduced motion makes the
    // scroll immediate (the score must honour prefers-reduced-motion).
    const short = await suite.browser.newContext({
      viewport: { width: 1024, height: 520 },
      reducedMotion: 'reduce',
    });
    try {
      const shortPage = await short.newPage();
      const teacher = DEMO_TEACHERS[0]!;
      await signIn(shortPage, suite.server.url, teacher.email, teacher.password);
      const preset = QUINTUPLET!;
      const drill = generateDrill(parseRuleCard(preset.card), SEED);
      await shortPage.goto(
        `${suite.server.url}/drills/${encodeURIComponent(preset.id)}?seed=${SEED}`,
      );
      const score = shortPage.locator('tensile-drill-score');
      await score.locator('svg .tensile-bar').first().waitFor();
      // The stave's lines: a bar's group also holds invisible full-height hit areas.
      const lastBar = score.locator(
        `svg .tensile-bar[data-bar="${drill.bars.length}"] > .vf-stave`,
      );
      // The playback panel loads once the page is idle and lengthens it, and the score re-flows
      // once a scroll bar takes its width: measure the page once it has settled.
      await shortPage.locator('tensile-playback-panel').waitFor();
      await expect
        .poll(() => lastBar.evaluate((g) => g.getBoundingClientRect().top > innerHeight), {
          timeout: SETTLE_MS,
          message: 'the last bar starts off screen',
        })
        .toBe(true);
      await score.evaluate((el) => (el as HTMLElement).focus({ preventScroll: true }));
      const cursorOnScreen = () =>
        score.locator('.cursor').evaluate((el) => {
          const rect = el.getBoundingClientRect();
          return rect.top >= 0 && rect.bottom <= innerHeight;
        });
      const spoken = score.locator('[aria-live="polite"]');
      const beats = drill.bars.flatMap((bar) =>
        bar.beats.map((_, i) => `Bar ${bar.bar}, beat ${i + 1}`),
      );
      for (const beat of beats) {
        await shortPage.keyboard.press('ArrowRight');
        // Wait for the states checked, not for a time (a busy machine can take seconds): the
        // cursor has reached this beat, then its line is on screen.
        await expect
          .poll(async () => (await spoken.textContent())?.trim(), {
            timeout: SETTLE_MS,
            message: `cursor at ${beat}`,
          })
          .toBe(beat);
        await expect
          .poll(cursorOnScreen, { timeout: SETTLE_MS, message: `${beat} on screen` })
          .toBe(true);
      }
      expect(await lastBar.evaluate((g) => g.getBoundingClientRect().top < innerHeight)).toBe(true);
    } finally {
      await short.close();
    }
  }, 180_000);

  it('keeps the seed in the address, and a new seed redraws another drill', async () => {
    const preset = QUINTUPLET!;
    await page.goto(`${suite.server.url}/drills/${encodeURIComponent(preset.id)}?seed=${SEED}`);
    await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
    await expect.poll(() => page.getByLabel('Seed').inputValue()).toBe(SEED);
    await page.reload();
    await page.locator('tensile-drill-score svg .tensile-bar').first().waitFor();
    expect(new URL(page.url()).searchParams.get('seed')).toBe(SEED);

    await page.getByRole('button', { name: 'New seed' }).click();
    await page.waitForURL((url) => url.searchParams.get('seed') !== SEED);
    const fresh = new URL(page.url()).searchParams.get('seed')!;
    const drill = generateDrill(parseRuleCard(preset.card), fresh);
    await expect
      .poll(async () => (await readEngraving(page)).heads.hands)
      .toBe(drill.bars.flatMap((b) => b.hits).filter((h) => isHandVoice(h.voice)).length);
    expect(foreign).toEqual([]);
  });

  it('gives a seedless link a seed, and shows students the seed without letting them change it', async () => {
    const studentContext = await suite.browser.newContext({
      viewport: { width: 1024, height: 900 },
    });
    try {
      const studentPage = await studentContext.newPage();
      const student = DEMO_STUDENTS[0]!;
      await signIn(studentPage, suite.server.url, student.email, student.password);
      await studentPage.goto(`${suite.server.url}/drills/${encodeURIComponent(QUINTUPLET!.id)}`);
      await studentPage.waitForURL((url) => (url.searchParams.get('seed') ?? '') !== '');
      const seed = new URL(studentPage.url()).searchParams.get('seed')!;
      await studentPage
        .locator('tensile-drill-score svg.tensile-notation .tensile-bar')
        .first()
        .waitFor();
      await expect.poll(() => studentPage.locator('.seed-readonly').innerText()).toContain(seed);
      expect(await studentPage.getByRole('button', { name: 'New seed' }).count()).toBe(0);
      expect(await studentPage.getByLabel('Seed').count()).toBe(0);
    } finally {
      await studentContext.close();
    }
  });
});

/** A built-in preset's drill, optionally lengthened. */
/** Least clear space between two syllables that meet at a bar line, in pixels. */
const MIN_COUNT_GAP = 6;

function presetDrill(id: string, seed: string, bars?: number): Drill {
  const preset = BUILT_IN_PRESETS.find((p) => p.id === id);
  if (!preset) throw new Error(`no preset ${id}`);
  const card = bars ? { ...(preset.card as object), bars } : preset.card;
  return generateDrill(parseRuleCard(card), seed);
}

/**
 * Engraving rules as geometry: each drill is engraved in Chromium by the shared renderer (no app
 * around it), and every rule is checked on the drawn SVG's boxes, never on a picture.
 */
describe('engraving rules on the drawn score (Chromium)', () => {
  let browser: Browser;
  let page: Page;

  beforeAll(async () => {
    const code = await bundleForBrowser('tests/e2e/notation.entry.ts');
    browser = await launchChromium();
    page = await browser.newPage({ viewport: { width: 1200, height: 900 } });
    await page.setContent('<!doctype html><title>engraving</title><div id="score"></div>');
    await page.addScriptTag({ content: code });
    await page.evaluate(() => (window as unknown as Entry).__bundle.fontsReady());
  });

  afterAll(async () => {
    await browser?.close();
  });

  // Options cross into the page as plain data: the cache (live DOM) stays out, and keeping it out
  // of the type spares the compiler from unboxing the whole DOM through page.evaluate.
  type RenderOptions = Omit<AllRenderOptions, 'cache'>;

  type Entry = {
    __bundle: {
      fontsReady(): Promise<void>;
      engrave(drill: NotationSource, options: RenderOptions): { height: number };
    };
  };

  async function engrave(drill: NotationSource, options: RenderOptions): Promise<ScoreGeometry> {
    await page.evaluate(
      ({ drill, options }) => (window as unknown as Entry).__bundle.engrave(drill, options),
      { drill, options },
    );
    return readScore(page, '#score');
  }

  const FULL: Omit<RenderOptions, 'width'> = { showSticking: true, showCounts: true };

  /** Sticking letters closer to the counting row above them than to their own staff's marks. */
  function strayStickings(score: ScoreGeometry): string[] {
    const stray: string[] = [];
    for (const letter of score.sticking) {
      // A stack (R over L) reads as one: its lowest letter is the one nearest the staff.
      const stacked = score.sticking.some(
        (o) =>
          o !== letter &&
          Math.abs(o.left - letter.left) < 3 &&
          o.top > letter.bottom &&
          o.top - letter.bottom < 20,
      );
      if (stacked) continue;
      const above = score.counts.filter((c) => c.bottom <= letter.top);
      if (above.length === 0) continue;
      const countsBottom = Math.max(...above.map((c) => c.bottom));
      const ownTop = Math.min(
        ...score.bars.map((b) => b.topLineY).filter((y) => y > letter.bottom),
      );
      const marks = [...score.stems, ...score.tupletBoxes, ...score.accents]
        .filter((m) => m.top >= letter.bottom - 1 && m.top < ownTop)
        .map((m) => m.top);
      const nearest = Math.min(ownTop, ...marks) - letter.bottom;
      if (letter.top - countsBottom <= nearest)
        stray.push(`${letter.text}@${Math.round(letter.left)},${Math.round(letter.top)}`);
    }
    return stray;
  }

  /**
   * The rules every engraving keeps, at a page's width and a phone's: accents clear of beams and
   * stems, sticking letters and counting syllables never overlapping each other.
   */
  async function expectClean(drill: Drill, label: string): Promise<void> {
    for (const width of [1100, 390]) {
      const score = await engrave(drill, { width, ...FULL });
      const what = `${label} at ${width} px`;
      // E. Gould, "Behind Bars", Faber Music 2011, ch. "Articulation" (from memory): an
      // articulation is never hidden under or inside a beam; on a shared staff it goes at the
      // stem end, outside the beam.
      const hidden = score.accents.filter((accent) =>
        [...score.beamLines, ...score.stems].some((line) => overlaps(accent, line)),
      );
      expect(hidden, `${what}: accents touching a beam or stem`).toEqual([]);
      // Sticking and counts are read letter by letter: no two may overlap (common practice).
      // "sim." counts as one more word on the sticking's level: neither may cover the other.
      expect(collisions([...score.sticking, ...score.simileBoxes]), `${what}: sticking`).toEqual(
        [],
      );
      // Each sticking row reads with its own system: nearer the marks of its staff than the
      // counting row of the system above (common practice: text belongs to the nearest staff).
      expect(strayStickings(score), `${what}: sticking nearer the system above`).toEqual([]);
      expect(collisions(score.counts), `${what}: counting syllables`).toEqual([]);
      // Silent syllables too get their slot's room and the same type as the sounding ones
      // (common practice: the count is read as one line of even syllables).
      expect(crowded(score.counts, 2), `${what}: counting syllables touching`).toEqual([]);
      expect(
        score.counts.some((c) => c.silent),
        `${what}: silent syllables drawn`,
      ).toBe(true);
      // A phone's tight bar may set its whole count smaller, never one syllable alone.
      const sizes = new Set(score.counts.map((c) => c.size));
      if (width > 390) expect([...sizes], `${what}: one type size`).toHaveLength(1);
      expect(Math.min(...sizes), `${what}: smallest syllable`).toBeGreaterThanOrEqual(10);
    }
  }

  it('draws every accent of a displaced backbeat clear of beams and stems', async () => {
    const drill = presetDrill('early-backbeat', 'harbor-spark-21');
    const accented = drill.bars.flatMap((b) => b.hits).filter((h) => h.dynamic === 'accent');
    expect(accented.length).toBeGreaterThan(0);
    const score = await engrave(drill, { width: 1100, ...FULL });
    // One accent per accented instant of a voice layer (a chord carries one).
    const instants = new Set(
      drill.bars.flatMap((b) =>
        b.hits
          .filter((h) => h.dynamic === 'accent')
          .map((h) => `${b.bar}:${h.beat}:${h.slot}:${isHandVoice(h.voice)}`),
      ),
    );
    expect(score.accents).toHaveLength(instants.size);
    await expectClean(drill, 'early-backbeat');
  });

  for (const [id, seed] of [
    ['quintuplets-hihat-1-3-4', 'lesson-12'],
    ['quintuplets-hihat-1-3-5', 'lesson-12'],
    ['shuffle-kick-upbeats', 'lesson-12'],
    ['linear-sixteenths', 'lesson-12'],
    ['four-over-three', 'lesson-12'],
    ['seven-eight-two-two-three', 'lesson-12'],
  ] as const) {
    it(`keeps ${id} free of collisions at page and phone widths`, async () => {
      await expectClean(presetDrill(id, seed), id);
    });
  }

  it('spells each quintuplet beat in sixteenths under its 5, its holes in combined rests', async () => {
    for (const id of ['quintuplets-hihat-1-3-4', 'quintuplets-hihat-1-3-5']) {
      const drill = presetDrill(id, 'lesson-12');
      const score = await engrave(drill, { width: 1100, ...FULL });
      let checked = 0;
      for (const bar of score.bars) {
        const hits = drill.bars.find((b) => b.bar === bar.bar)!.hits;
        for (const layer of ['hands', 'feet'] as const) {
          for (const beat of [1, 2, 3, 4]) {
            // E. Gould, "Behind Bars", ch. "Tuplets" (from memory): a tuplet is written in its
            // own note value; neighbouring rests combine inside its inner groups (2+3, or 3+2
            // where a note on the fourth value and none on the third starts the second), but
            // only up to an eighth: a quarter rest under the 5 reads as a whole beat's rest
            // (common practice). Every
            // beat with an off-beat note is a quintuplet, its number shown or under "sim.".
            const events = bar.layers[layer].events.filter((e) => e.beat === beat);
            const struck = new Set(
              hits
                .filter((h) => h.beat === beat && isHandVoice(h.voice) === (layer === 'hands'))
                .map((h) => h.slot),
            );
            if (![...struck].some((slot) => slot !== 0)) continue;
            const what = `${id} bar ${bar.bar} ${layer} beat ${beat}`;
            const length = (e: (typeof events)[number]) => 16 / Number(e.duration);
            const split = struck.has(3) && !struck.has(2) ? 3 : 2;
            const group = (slot: number) => (slot < split ? 0 : 1);
            let at = 0;
            for (const [k, e] of events.entries()) {
              expect(e.slot, what).toBe(at);
              if (e.kind === 'note') {
                expect(e.duration, what).toBe('16');
                expect(struck.has(at), what).toBe(true);
              } else {
                expect(['16', '8'], what).toContain(e.duration);
                expect(group(at + length(e) - 1), `${what}: rest across the groups`).toBe(
                  group(at),
                );
                for (let s = at; s < at + length(e); s++) expect(struck.has(s), what).toBe(false);
                const next = events[k + 1];
                if (next?.kind === 'rest' && next.duration === e.duration && e.duration === '16')
                  expect(group(at + 1), `${what}: rests left uncombined`).not.toBe(group(at));
              }
              at += length(e);
            }
            expect(at, what).toBe(5);
            // Every value of each voice is drawn, its own rests too, so each voice under its "5"
            // adds up to the beat (common practice in two-voice parts: each voice complete).
            expect(
              events.filter((e) => e.box === null),
              `${id} bar ${bar.bar} ${layer}`,
            ).toEqual([]);
            // Drawn in time order, left to right.
            const xs = events.flatMap((e) => (e.box ? [e.box.left] : []));
            expect([...xs].sort((a, b) => a - b)).toEqual(xs);
            checked++;
          }
        }
      }
      expect(checked, `${id}: quintuplet beats`).toBeGreaterThan(0);
      // The brackets of a system sit on one line per voice, not stepping up over accented
      // beats (common practice: a level row of brackets reads as one grid).
      for (const layer of ['hands', 'feet'] as const) {
        for (const line of new Set(score.bars.map((b) => b.topLineY))) {
          const edges = score.bars
            .filter((b) => b.topLineY === line)
            .flatMap((b) => b.layers[layer].tuplets)
            .map((t) => (layer === 'hands' ? t.top : t.bottom));
          if (edges.length > 1)
            expect(Math.max(...edges) - Math.min(...edges), `${id} ${layer}`).toBeLessThan(1);
        }
      }
    }
  });

  it('keeps a shuffle\'s "3" on every group of each voice, with no "sim."', async () => {
    const drill = presetDrill('shuffle-kick-upbeats', 'lesson-12');
    const score = await engrave(drill, { width: 1100, ...FULL });
    // Common practice: a quarter and an eighth (or a rest and an eighth) under a "3" read as
    // straight eighths once the number is gone, so a shuffle part marks every group; E. Gould,
    // "Behind Bars", Faber Music 2011, ch. "Tuplets" (from memory): numbers are left out only
    // where the rhythm stays unambiguous.
    for (const layer of ['hands', 'feet'] as const) {
      const shown = score.bars.flatMap((b) => b.layers[layer].tuplets);
      const due = bracketsDue(drill, 3, layer === 'hands');
      expect(due, layer).toBeGreaterThan(0);
      expect(shown, `${layer}: a "3" on every group`).toHaveLength(due);
    }
    expect(score.simile).toBe(0);
  });

  it('shows one whole-bar rest, centred, where a voice is silent for a bar', async () => {
    for (const [id, beats] of [
      ['early-backbeat', 4],
      ['six-eight-groove', 6],
      ['seven-eight-two-two-three', 7],
    ] as const) {
      const drill = presetDrill(id, 'lesson-12');
      // Bar 2 without its feet: the feet voice is silent for the whole bar.
      const silent: Drill = {
        ...drill,
        bars: drill.bars.map((bar) =>
          bar.bar === 2 ? { ...bar, hits: bar.hits.filter((h) => isHandVoice(h.voice)) } : bar,
        ),
      };
      const score = await engrave(silent, { width: 1100, ...FULL });
      const bar = score.bars.find((b) => b.bar === 2)!;
      // E. Gould, "Behind Bars", ch. "Rests" (from memory): the whole (semibreve) rest fills a
      // silent bar in any meter, centred in the bar.
      expect(
        bar.layers.feet.events.map((e) => [e.kind, e.duration]),
        `${id}`,
      ).toEqual([['rest', '1']]);
      const rest = bar.layers.feet.events[0]!.box!;
      const centre = (rest.left + rest.right) / 2;
      const notes = bar.layers.hands.events.flatMap((e) => (e.box ? [e.box] : []));
      const first = Math.min(...notes.map((b) => b.left));
      const last = Math.max(...notes.map((b) => b.right));
      expect(Math.abs(centre - (first + last) / 2), `${id}: centred`).toBeLessThan(
        (last - first) / 4,
      );
      expect(beats).toBe(drill.card.meter.beats);
    }
  });

  it("beams by the meter's grouping in 6/8, 12/8 and 7/8 (2+2+3)", async () => {
    // The shuffle's time is a quarter and an eighth per group and its kick leaves the middle
    // triplet out, so it may have no beam at all; the other two must show their groups' beams.
    const mustBeam = new Set(['six-eight-groove', 'seven-eight-two-two-three']);
    for (const id of ['six-eight-groove', 'twelve-eight-shuffle', 'seven-eight-two-two-three']) {
      let spanning = 0;
      // Several seeds, so some beam joins the beats of a group whatever one seed draws.
      for (const seed of ['lesson-12', 'river-3', 'amber-40', 'quill-12']) {
        const drill = presetDrill(id, seed);
        const grouping = buildNotation(drill).meter.grouping!;
        const groupOf = (beat: number) => {
          let end = 0;
          return grouping.findIndex((g) => (end += g) >= beat);
        };
        const score = await engrave(drill, { width: 1100, ...FULL });
        for (const bar of score.bars) {
          for (const layer of ['hands', 'feet'] as const) {
            const { events, beams } = bar.layers[layer];
            for (const beam of beams) {
              // The notes under a beam: their heads sit between its first and last stem.
              const under = events.filter(
                (e) =>
                  e.kind === 'note' &&
                  e.box !== null &&
                  (e.box.left + e.box.right) / 2 > beam.left - 8 &&
                  (e.box.left + e.box.right) / 2 < beam.right + 8,
              );
              expect(under.length, `${id} bar ${bar.bar}: notes under a beam`).toBeGreaterThan(1);
              // Common practice (E. Gould, "Behind Bars", ch. "Beaming", from memory): a beam
              // never crosses a group of the meter, and joins the eighths of one group.
              expect(new Set(under.map((e) => groupOf(e.beat))).size, `${id} bar ${bar.bar}`).toBe(
                1,
              );
              if (new Set(under.map((e) => e.beat)).size > 1) spanning++;
            }
          }
        }
      }
      if (mustBeam.has(id))
        expect(spanning, `${id}: beams that join the beats of a group`).toBeGreaterThan(0);
    }
  });

  it('groups each 4:3 cycle under "4 vs 3", no ratio, from its first note to the bar line', async () => {
    const drill = presetDrill('four-over-three', 'lesson-12');
    const score = await engrave(drill, { width: 1100, ...FULL });
    const cycles = buildNotation(drill).polyrhythms;
    expect(score.polyrhythms).toHaveLength(cycles.length);
    expect(cycles.length).toBe(drill.bars.length);
    for (const [i, bracket] of score.polyrhythms.entries()) {
      const cycle = cycles[i]!;
      // The notes are spelled at their real values, so the mark carries no ratio: a "4:3"
      // bracket would tell the reader to play them as a tuplet (E. Gould, "Behind Bars", Faber
      // Music 2011, ch. "Tuplets", from memory). "4 vs 3" as a label: common practice.
      expect(bracket.label).toBe('4 vs 3');
      expect(bracket.label).not.toMatch(/\d\s*:\s*\d/);
      // The mark spans the cycle's notes' whole durations: it starts just outside the first
      // notehead and ends at the bar line where the fourth note's value ends (a bracket covers
      // the full length of its group; Gould, ch. "Tuplets", from memory).
      const head = (at: { bar: number; beat: number; slot: number }) => {
        const bar = score.bars.find((b) => b.bar === at.bar)!;
        return [...bar.layers.hands.events, ...bar.layers.feet.events].find(
          (e) => e.kind === 'note' && e.beat === at.beat && e.slot === at.slot,
        )!.box!;
      };
      const first = head(cycle.notes[0]!);
      const last = head(cycle.notes[3]!);
      const barLine = score.bars.find((b) => b.bar === cycle.lastBeat.bar)!.right;
      expect(bracket.left).toBeLessThanOrEqual(first.left);
      expect(first.left - bracket.left).toBeLessThan(8);
      expect(bracket.right).toBeGreaterThan(last.right + 8);
      expect(bracket.right).toBeLessThanOrEqual(barLine);
      expect(barLine - bracket.right).toBeLessThan(8);
    }
  });

  /** The written heads at each instant of the drawn score, keyed `bar:beat:slot`. */
  function headsAt(score: ScoreGeometry): Map<string, { left: number; right: number }> {
    const heads = new Map<string, { left: number; right: number }>();
    for (const bar of score.bars)
      for (const layer of ['hands', 'feet'] as const)
        for (const e of bar.layers[layer].events) {
          if (e.kind !== 'note' || e.box === null) continue;
          const key = `${bar.bar}:${e.beat}:${e.slot}`;
          const known = heads.get(key);
          heads.set(key, {
            left: Math.min(e.box.left, known?.left ?? Infinity),
            right: Math.max(e.box.right, known?.right ?? -Infinity),
          });
        }
    return heads;
  }

  for (const [id, seed] of [
    ['cuban-style-bass', 'lesson-12'],
    ['four-over-three', 'lesson-12'],
    ['early-backbeat', 'harbor-spark-21'],
    ['quintuplets-hihat-1-3-4', 'lesson-12'],
  ] as const) {
    it(`sets each counting syllable of ${id} under the note it counts, apart at bar lines`, async () => {
      const drill = presetDrill(id, seed);
      for (const width of [1100, 390]) {
        const score = await engrave(drill, { width, ...FULL });
        const heads = headsAt(score);
        // Common practice: the count is read as the rhythm's own words, each syllable under
        // the note it names, so a sounding syllable's centre lies within its notehead.
        const astray = score.counts.flatMap((c) => {
          const head = heads.get(`${c.bar}:${c.beat}:${c.slot}`);
          if (!head) return [];
          const centre = (c.left + c.right) / 2;
          return centre >= head.left - 1 && centre <= head.right + 1
            ? []
            : [
                `${c.text} bar ${c.bar} beat ${c.beat} slot ${c.slot}: ${Math.round(centre)} vs ${Math.round(head.left)}..${Math.round(head.right)}`,
              ];
        });
        expect(astray, `${id} at ${width} px: syllables off their notes`).toEqual([]);
        // Across a bar line the last syllable of a bar and the first of the next keep a clear
        // gap, so "a" and "1" never read as one word "a1" (common practice).
        const tight: string[] = [];
        for (const bar of score.bars) {
          const next = score.bars.find((b) => b.bar === bar.bar + 1 && b.topLineY === bar.topLineY);
          if (!next) continue;
          const own = score.counts.filter((c) => c.bar === bar.bar);
          const theirs = score.counts.filter((c) => c.bar === next.bar);
          const last = Math.max(...own.map((c) => c.right));
          const first = Math.min(...theirs.map((c) => c.left));
          if (first - last < MIN_COUNT_GAP)
            tight.push(`bars ${bar.bar}|${next.bar}: ${(first - last).toFixed(1)} px`);
        }
        expect(tight, `${id} at ${width} px: syllables run together at a bar line`).toEqual([]);
      }
    });
  }

  /**
   * Within each beat, the x distances between neighbouring slots whose ratio (widest over
   * narrowest) exceeds `most`, as "bar b beat n: gaps" for a readable failure. A slot's x is the
   * centre of the heads struck on it (either voice), else of its counting syllable.
   */
  function unevenBeats(score: ScoreGeometry, most: number): string[] {
    const heads = headsAt(score);
    const uneven: string[] = [];
    for (const bar of score.bars) {
      const beats = new Set(score.counts.filter((c) => c.bar === bar.bar).map((c) => c.beat));
      for (const beat of beats) {
        const slots = score.counts
          .filter((c) => c.bar === bar.bar && c.beat === beat)
          .sort((a, b) => a.slot - b.slot)
          .map((c) => {
            const head = heads.get(`${bar.bar}:${beat}:${c.slot}`);
            const box = head ?? c;
            return (box.left + box.right) / 2;
          });
        if (slots.length < 3) continue;
        const gaps = slots.slice(1).map((x, i) => x - slots[i]!);
        if (Math.max(...gaps) > most * Math.min(...gaps))
          uneven.push(`bar ${bar.bar} beat ${beat}: ${gaps.map((g) => g.toFixed(0)).join(' ')}`);
      }
    }
    return uneven;
  }

  it('gives equal slots of a beat nearly equal room, whichever voice plays them', async () => {
    // Both voices share one rhythmic grid: space follows duration, not which voice sounds
    // (E. Gould, "Behind Bars", Faber Music 2011, ch. "Horizontal spacing"; from memory).
    for (const [id, seed] of [
      ['groove-and-fill', 'harbor-9'],
      ['tension-and-release', 'lesson-3'],
      ['late-backbeat', 'harbor-9'],
      ['early-backbeat', 'harbor-9'],
      ['three-off-land-on-four', 'harbor-9'],
      ['four-over-three', 'lesson-12'],
      ['four-over-three', 'harbor-9'],
      ['quintuplets-hihat-1-3-4', 'lesson-3'],
    ] as const) {
      for (const width of [1100, 390]) {
        const score = await engrave(presetDrill(id, seed), { width, ...FULL });
        expect(unevenBeats(score, 1.5), `${id} ${seed} at ${width} px: uneven slots`).toEqual([]);
      }
    }
  });

  it('sets the voice key apart from the music: a "Key" heading, no staff of its own', async () => {
    for (const [id, seed] of [
      ['early-backbeat', 'harbor-spark-21'],
      ['quintuplets-hihat-1-3-4', 'lesson-12'],
      ['four-over-three', 'lesson-12'],
    ] as const) {
      const drill = presetDrill(id, seed);
      for (const width of [1100, 390]) {
        const score = await engrave(drill, { width, ...FULL });
        const review = process.env['TENSILE_REVIEW_DIR'];
        if (review)
          await page.locator('#score').screenshot({ path: `${review}/${id}-${width}.png` });
        const what = `${id} at ${width} px`;
        const key = score.legend;
        expect(key, what).not.toBeNull();
        // Common practice: an instrument key is labelled as one and set apart from the bars,
        // never as a bar of notes on a staff beside the first system, which reads as music.
        expect(key!.heading, what).toBe('Key');
        expect(key!.staffLines, `${what}: staff lines as long as a bar's`).toBe(0);
        const firstTop = Math.min(...score.bars.map((b) => b.topLineY));
        expect(key!.bottom, `${what}: the key above the first system`).toBeLessThan(firstTop);
        expect(key!.right, what).toBeLessThanOrEqual(width);
        // The first system keeps the whole line for its bars.
        const firstLeft = Math.min(...score.bars.map((b) => b.left));
        expect(firstLeft, what).toBeLessThan(20);
      }
    }
  });

  it('sets bars of sixteenths on printed systems of a part-sized staff, justified, none squeezed, text at 7 pt', async () => {
    const drill = presetDrill('early-backbeat', 'harbor-spark-21', 24);
    const score = await engrave(drill, { ...PRINT_LAYOUT, ...FULL });
    const { width } = PRINT_LAYOUT;
    const review = process.env['TENSILE_REVIEW_DIR'];
    if (review) await page.locator('#score').screenshot({ path: `${review}/print-24-bars.png` });
    const systems = [...new Set(score.bars.map((b) => b.topLineY))].map((y) =>
      score.bars.filter((b) => b.topLineY === y),
    );
    // At a part's staff size (7-7.5 mm: E. Gould, "Behind Bars", Faber Music 2011, ch. "Staff
    // sizes"; from memory) the notes of this drill, accented and ghosted, take three bars a line
    // of A4 (VexFlow's tightest setting of each is about 22-30 staff spaces); every line alike.
    // Four spaces of VexFlow's default 10 px, as every stave here is drawn.
    const staffMm = printedMm(40);
    expect(staffMm).toBeGreaterThanOrEqual(7);
    expect(staffMm).toBeLessThanOrEqual(7.5);
    expect(systems.map((s) => s.length)).toEqual([3, 3, 3, 3, 3, 3, 3, 3]);
    // Sticking and counting print at 7 pt or more (read from a music stand; common practice).
    const sizes = await page.$$eval(
      '#score .tensile-count-row, #score .tensile-sticking-row',
      (rows) => rows.map((row) => Number(row.getAttribute('font-size'))),
    );
    expect(sizes.length).toBeGreaterThan(0);
    for (const size of sizes) expect(printedPt(size)).toBeGreaterThanOrEqual(7);
    // Systems fill the line alike: every one ends at the same right edge, inside the page.
    const rights = systems.map((s) => Math.max(...s.map((b) => b.right)));
    expect(Math.max(...rights) - Math.min(...rights)).toBeLessThan(1);
    expect(Math.max(...rights)).toBeLessThanOrEqual(width);
    expect(Math.max(...rights)).toBeGreaterThan(width - 40);
    // Nothing squeezed: the heads of one voice keep clear air between them (each bar is widened
    // from its natural width in proportion to its content, never narrowed).
    for (const bar of score.bars) {
      for (const layer of ['hands', 'feet'] as const) {
        const boxes = bar.layers[layer].events
          .flatMap((e) => (e.box ? [e.box] : []))
          .sort((a, b) => a.left - b.left);
        for (let i = 1; i < boxes.length; i++)
          expect(boxes[i]!.left - boxes[i - 1]!.right, `bar ${bar.bar} ${layer}`).toBeGreaterThan(
            2,
          );
      }
    }
    expect(collisions(score.counts)).toEqual([]);
    expect(crowded(score.counts, 2)).toEqual([]);
    expect(collisions(score.sticking)).toEqual([]);
    // A four-bar drill prints on two even systems, whatever its seed (never three and one).
    for (const seed of ['handout-1', 'lesson-12', 'harbor-spark-21', 'print-check']) {
      const short = await engrave(presetDrill('early-backbeat', seed), {
        ...PRINT_LAYOUT,
        ...FULL,
      });
      const lines = [...new Set(short.bars.map((b) => b.topLineY))];
      expect(
        lines.map((y) => short.bars.filter((b) => b.topLineY === y).length),
        seed,
      ).toEqual([2, 2]);
    }
    // Bars of eighths (6/8) still go four to a printed system.
    const compound = await engrave(presetDrill('six-eight-groove', 'handout-1'), {
      ...PRINT_LAYOUT,
      ...FULL,
    });
    expect(new Set(compound.bars.map((b) => b.topLineY)).size).toBe(1);
  });

  it('prints the title and the tempo mark above the first system of a 16-bar drill', async () => {
    const drill = presetDrill('tension-and-release', 'lesson-12', 16);
    for (const width of [1100, 390]) {
      const score = await engrave(drill, { width, ...FULL, title: 'Tension and release' });
      const firstTop = Math.min(...score.bars.map((b) => b.topLineY));
      expect(score.title?.text).toBe('Tension and release');
      expect(score.title!.bottom).toBeLessThan(firstTop);
      expect(score.title!.left).toBeGreaterThanOrEqual(0);
      expect(score.title!.right).toBeLessThanOrEqual(width);
      // Common practice: the metronome mark over the first system ("♩ = 92").
      expect(score.tempo?.text.replace(/\u00a0/g, ' ')).toContain(`= ${drill.card.tempo}`);
      expect(score.tempo!.bottom).toBeLessThan(firstTop);
      // Nothing runs past the drawing's right edge. The drawing is the width asked for, unless a
      // bar alone on its line needs more (a dense bar on a phone), and then only that bar does.
      expect(Math.max(...score.bars.map((b) => b.right))).toBeLessThanOrEqual(score.width);
      for (const bar of score.bars.filter((b) => b.right > width)) {
        const sameLine = score.bars.filter((b) => b.topLineY === bar.topLineY);
        expect(sameLine, `bar ${bar.bar} runs past ${width} px beside other bars`).toHaveLength(1);
      }
      if (width === 1100) expect(score.width).toBe(width);
      expect(score.bars).toHaveLength(16);
    }
  });

  it('marks the notes that make each bar tense only when asked, with a key', async () => {
    const drill = presetDrill('early-backbeat', 'harbor-spark-21');
    const plain = await engrave(drill, { width: 1100, ...FULL });
    expect(plain.tensionMarks).toEqual([]);
    expect(plain.tensionLegend).toBe(false);
    const shown = await engrave(drill, { width: 1100, ...FULL, showTension: true });
    const expected = buildNotation(drill).bars.flatMap((bar) =>
      bar.syncopated.map((at) => ({ bar: bar.bar, ...at })),
    );
    expect(expected.length).toBeGreaterThan(0);
    expect(shown.tensionMarks).toEqual(expected);
    expect(shown.tensionLegend).toBe(true);
  });
});
