/**
 * The six drills a teacher prints to hand out (a displaced backbeat, a quintuplet drill with
 * holes, 6/8, 7/8, a 4:3 and a 16-bar drill), printed from the browser on a desktop and a phone,
 * on A4 and US Letter (Chromium's own print to PDF, as Ctrl+P does). Every page is rasterised
 * with pdftoppm and checked: not blank, nothing past the printable width, title and tempo mark
 * on paper, no system split across pages, and no two symbols of the drawn score overlapping.
 *
 * The plain pages are kept as PNGs in /tmp/engraving-review/ (or TENSILE_REVIEW_DIR) to be
 * looked at; the checks never read a picture as a whole, only counted pixels and boxes.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { PRINT_LAYOUT } from '../../shared/notation/print-layout';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { servePresetWithBars } from '../support/preset-bars';
import { DEMO_TEACHERS } from '../support/demo-accounts';
import { collisions, crowded, overlaps, readScore } from './notation.geometry';

const REVIEW_DIR = process.env['TENSILE_REVIEW_DIR'] ?? '/tmp/engraving-review';
const SEED = 'handout-1';

/**
 * The acceptance drills: preset, bars when the card's own count is changed, and the least bars
 * the fullest printed system holds at a part's staff size (7-7.5 mm): four of a compound or odd
 * meter's eighths, three of a 4:3, two of sixteenths with accents and ghost notes (a four-bar
 * drill prints as two even systems) and of quintuplets (twenty notes and syllables a bar).
 */
const DRILLS = [
  { id: 'early-backbeat', bars: null, perSystem: 2 },
  { id: 'quintuplets-hihat-1-3-4', bars: null, perSystem: 2 },
  { id: 'six-eight-groove', bars: null, perSystem: 4 },
  { id: 'seven-eight-two-two-three', bars: null, perSystem: 4 },
  { id: 'four-over-three', bars: null, perSystem: 3 },
  { id: 'tension-and-release', bars: 16, perSystem: 3 },
] as const;

const VIEWPORTS = [
  { name: 'desktop', width: 1280, height: 900 },
  { name: 'phone', width: 390, height: 844 },
] as const;

/** Paper sizes and their printable width at 96 dpi inside the 12 mm margins. */
const PAPERS = [
  { format: 'A4', widthMm: 210 },
  { format: 'Letter', widthMm: 215.9 },
] as const;
const MARGIN_MM = 12;
const DPI = 96;
const mmToPx = (mm: number) => (mm / 25.4) * DPI;

interface Raster {
  readonly width: number;
  readonly height: number;
  readonly pixels: Buffer;
}

/** A binary PPM (P6, 8 bits) as pdftoppm writes it. */
function readPpm(file: string): Raster {
  const data = readFileSync(file);
  const header = /^P6\s+(\d+)\s+(\d+)\s+255\s/.exec(data.subarray(0, 64).toString('latin1'));
  if (!header) throw new Error(`${file} is not an 8-bit binary PPM`);
  const [whole, width, height] = header;
  return { width: Number(width), height: Number(height), pixels: data.subarray(whole!.length) };
}

/** Dark pixels of a page, and the columns of the leftmost and rightmost one. */
function ink(raster: Raster): { dark: number; left: number; right: number } {
  let dark = 0;
  let left = raster.width;
  let right = -1;
  for (let y = 0; y < raster.height; y++) {
    for (let x = 0; x < raster.width; x++) {
      const i = (y * raster.width + x) * 3;
      if (raster.pixels[i]! + raster.pixels[i + 1]! + raster.pixels[i + 2]! < 3 * 128) {
        dark++;
        left = Math.min(left, x);
        right = Math.max(right, x);
      }
    }
  }
  return { dark, left, right };
}

/** Rows mostly one marker colour, merged into rules, top to bottom ('R' or 'B'). */
function markerRules(raster: Raster): string {
  let rules = '';
  let last = '';
  for (let y = 0; y < raster.height; y++) {
    let red = 0;
    let blue = 0;
    for (let x = 0; x < raster.width; x++) {
      const i = (y * raster.width + x) * 3;
      const [r, g, b] = [raster.pixels[i]!, raster.pixels[i + 1]!, raster.pixels[i + 2]!];
      if (r > 180 && g < 90 && b < 90) red++;
      if (b > 180 && r < 90 && g < 90) blue++;
    }
    const row = red > raster.width * 0.3 ? 'R' : blue > raster.width * 0.3 ? 'B' : '';
    if (row !== '' && row !== last) rules += row;
    last = row;
  }
  return rules;
}

/** Rasterise `pdf` at 96 dpi into `dir`; the pages' files in order. */
function rasterise(pdf: string, dir: string, prefix: string, png = false): string[] {
  execFileSync('pdftoppm', [...(png ? ['-png'] : []), '-r', String(DPI), pdf, join(dir, prefix)]);
  return readdirSync(dir)
    .filter((f) => f.startsWith(`${prefix}-`) && f.endsWith(png ? '.png' : '.ppm'))
    .sort();
}

describe.each(VIEWPORTS)(
  'handing out the six acceptance drills, printed from the $name',
  (view) => {
    const suite = useServerAndBrowser();

    for (const drill of DRILLS) {
      it(
        `prints ${drill.id} on A4 and US Letter as a teacher would hand it out`,
        {
          timeout: 240_000,
        },
        async () => {
          const preset = BUILT_IN_PRESETS.find((p) => p.id === drill.id)!;
          const card = preset.card as {
            bars: number;
            tempo: number;
            meter: { beats: number; unit: number };
          };
          // The card's tempo counts the meter's unit; a compound meter's mark counts its dotted
          // quarter, three eighths (common practice: "♩. = 44" for 132 eighths a minute in 6/8).
          const compound =
            card.meter.unit === 8 && card.meter.beats % 3 === 0 && card.meter.beats > 3;
          const markBpm = compound ? card.tempo / 3 : card.tempo;
          const bars = drill.bars ?? card.bars;
          const context = await suite.browser.newContext({
            viewport: { width: view.width, height: view.height },
          });
          const dir = mkdtempSync(join(tmpdir(), 'tensile-handout-'));
          mkdirSync(REVIEW_DIR, { recursive: true });
          try {
            const page = await context.newPage();
            const teacher = DEMO_TEACHERS[0]!;
            await signIn(page, suite.server.url, teacher.email, teacher.password);
            if (drill.bars) await servePresetWithBars(page, drill.id, drill.bars);
            await page.goto(`${suite.server.url}/drills/${drill.id}?seed=${SEED}`);
            const heading = page.getByRole('heading', { level: 1 });
            await heading.waitFor();
            const title = (await heading.textContent())!.trim();
            const drawn = page.locator('tensile-drill-score svg.tensile-notation .tensile-bar');
            await expect.poll(() => drawn.count(), { timeout: 90_000 }).toBe(bars);
            await page.emulateMedia({ media: 'print' });
            const sheet = page.locator('tensile-drill-score svg.tensile-notation');
            await expect
              .poll(() => sheet.evaluate((svg) => Number(svg.getAttribute('width'))), {
                timeout: 30_000,
              })
              .toBeGreaterThanOrEqual(PRINT_LAYOUT.width);

            // The drawn score as printed: no two symbols overlapping, every bar inside its line.
            const score = await readScore(page, 'tensile-drill-score');
            const what = `${drill.id} (${view.name})`;
            // E. Gould, "Behind Bars", Faber Music 2011, ch. "Articulation" (from memory): an
            // accent is never hidden in a beam or stem.
            const hidden = score.accents.filter((a) =>
              [...score.beamLines, ...score.stems].some((line) => overlaps(a, line)),
            );
            expect(hidden, `${what}: accents in beams or stems`).toEqual([]);
            // Common practice: text rows are read letter by letter, so nothing in them touches.
            expect(collisions([...score.sticking, ...score.simileBoxes]), what).toEqual([]);
            expect(collisions(score.counts), what).toEqual([]);
            expect(crowded(score.counts, 2), what).toEqual([]);
            expect(score.bars).toHaveLength(bars);
            expect(Math.max(...score.bars.map((b) => b.right))).toBeLessThanOrEqual(
              PRINT_LAYOUT.width,
            );
            // Systems that fill the page, never a phone's one or two bars a line.
            const perSystem = [...new Set(score.bars.map((b) => b.topLineY))].map(
              (y) => score.bars.filter((b) => b.topLineY === y).length,
            );
            expect(
              Math.max(...perSystem),
              `${what}: bars on the fullest system`,
            ).toBeGreaterThanOrEqual(Math.min(drill.perSystem, bars));

            for (const paper of PAPERS) {
              const label = `${drill.id}-${view.name}-${paper.format}`;
              const plain = join(dir, `${label}.pdf`);
              writeFileSync(
                plain,
                await page.pdf({ format: paper.format, preferCSSPageSize: true }),
              );
              const text = execFileSync('pdftotext', ['-layout', plain, '-'], { encoding: 'utf8' });
              expect(text, `${label}: title`).toContain(title);
              // The metronome mark over the first system (common practice: "♩ = 92").
              expect(text.replace(/\u00a0/g, ' '), `${label}: tempo mark`).toMatch(
                new RegExp(`=\\s*${markBpm}\\b`),
              );
              // The pages as PNGs to look at.
              expect(rasterise(plain, REVIEW_DIR, label, true).length).toBeGreaterThan(0);
              const pages = rasterise(plain, dir, `${label}-page`);
              expect(pages.length, label).toBeGreaterThan(0);
              const printable = mmToPx(paper.widthMm - MARGIN_MM);
              for (const [i, file] of pages.entries()) {
                const raster = readPpm(join(dir, file));
                const { dark, right } = ink(raster);
                // Not blank: even a last page with only the notes under the score carries a
                // few lines of text (over 0.1 % ink); an empty one has none.
                expect(
                  dark / (raster.width * raster.height),
                  `${label} page ${i + 1}`,
                ).toBeGreaterThan(0.001);
                // Nothing runs into the right margin.
                expect(
                  right,
                  `${label} page ${i + 1}: ink past the printable width`,
                ).toBeLessThanOrEqual(printable + 1);
              }
              // The pages as PNGs to look at.
              for (const png of rasterise(plain, REVIEW_DIR, label, true)) expect(png).toBeTruthy();
            }

            // Each system's strip outlined (red on top, blue under it): on paper every red rule is
            // followed by its blue one on the same page, so no bar is split across pages.
            await page.addStyleTag({
              content:
                'tensile-drill-score .band { border-top: 8px solid #f00; border-bottom: 8px solid #00f; }',
            });
            for (const paper of PAPERS) {
              const label = `${drill.id}-${view.name}-${paper.format}-marked`;
              const marked = join(dir, `${label}.pdf`);
              writeFileSync(
                marked,
                await page.pdf({ format: paper.format, preferCSSPageSize: true }),
              );
              const perPage = rasterise(marked, dir, label).map((f) =>
                markerRules(readPpm(join(dir, f))),
              );
              for (const [i, rules] of perPage.entries())
                expect(rules, `${label} page ${i + 1}`).toMatch(/^(RB)*$/);
              expect(perPage.join('').length / 2, `${label}: every system on paper`).toBe(
                perSystem.length,
              );
            }
          } finally {
            await context.close();
            rmSync(dir, { recursive: true, force: true });
          }
        },
      );
    }
  },
);
