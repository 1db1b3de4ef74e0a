/**
 * The drill page's notation in a real browser: a teacher opens the quintuplet, the triplet shuffle
 * and the 4:3 polyrhythm presets and the engraved SVG must hold one notehead per hit in the right
 * voice, the tuplet numbers the beats need (and no others), every notehead on the line or space
 * the drum-set convention gives its instrument, one time signature, and a counting syllable under
 * every slot. Expected values come from the drill itself, generated here in Node with
 * the same card and seed (the engine is deterministic across Node and browser).
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isHandVoice } from '../../shared/generator/drill';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { recordForeignRequests, signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_STUDENTS, DEMO_TEACHERS } from '../support/demo-accounts';
import { STEP_PX, WEINBERG_STEPS } from '../support/drumset-staff';

const SEED = 'lesson-12';

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
      const below = await lastBar.evaluate((g) => g.getBoundingClientRect().top > innerHeight);
      expect(below, 'the last bar starts off screen').toBe(true);
      await score.evaluate((el) => (el as HTMLElement).focus({ preventScroll: true }));
      const cursorOnScreen = () =>
        score.locator('.cursor').evaluate((el) => {
          const rect = el.getBoundingClientRect();
          return rect.top >= 0 && rect.bottom <= innerHeight;
        });
      const beats = drill.bars.reduce((n, bar) => n + bar.beats.length, 0);
      for (let i = 0; i < beats; i++) {
        await shortPage.keyboard.press('ArrowRight');
        await expect.poll(cursorOnScreen, { message: `beat ${i + 1} on screen` }).toBe(true);
      }
      expect(await lastBar.evaluate((g) => g.getBoundingClientRect().top < innerHeight)).toBe(true);
    } finally {
      await short.close();
    }
  });

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
