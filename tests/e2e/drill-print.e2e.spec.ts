/**
 * Printing one drill from the browser (Chromium's own print to PDF, as Ctrl+P does), from a
 * desktop and a phone: the app's frame and the controls stay off the paper, and pages break
 * between systems, never through one. Each system's strip is outlined in the test (a red rule on
 * top, a blue one under it); in the rendered pages every red rule must be followed by its blue
 * rule on the same page.
 */
import { execFileSync } from 'node:child_process';
import {
  copyFileSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { servePresetWithBars } from '../support/preset-bars';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const CARD = 'early-backbeat';
const SEED = 'print-check';

const SIZES = [
  // Four bars a line: 24 bars need a second page.
  { name: 'desktop', width: 1280, height: 900, bars: 24 },
  // One bar a line on screen; on paper the same systems as the desktop.
  { name: 'phone', width: 390, height: 844, bars: 24 },
] as const;

/** Bars per printed system, by screen size: print must not depend on the screen. */
const printedSystems = new Map<string, number[]>();

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

/**
 * Rows that are mostly one marker colour, merged into rules, top to bottom ('R' or 'B'), and
 * the row of the last one.
 */
function markerRules(raster: Raster): { rules: string; lastRow: number } {
  let rules = '';
  let last = '';
  let lastRow = -1;
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
    if (row !== '') lastRow = y;
    last = row;
  }
  return { rules, lastRow };
}

/** The top of the first word `word` on a PDF page, in pixels at `dpi`, or null. */
function wordTop(pdf: string, pageNumber: number, word: string, dpi: number): number | null {
  const page = String(pageNumber);
  const html = execFileSync('pdftotext', ['-bbox', '-f', page, '-l', page, pdf, '-'], {
    encoding: 'utf8',
  });
  const found = new RegExp(`<word xMin="[\\d.]+" yMin="([\\d.]+)"[^>]*>${word}</word>`).exec(html);
  return found ? (Number(found[1]) * dpi) / 72 : null;
}

describe.each(SIZES)('printing a drill from the $name ($width px)', (size) => {
  const suite = useServerAndBrowser();

  it(
    `prints ${size.bars} bars without the app's frame, breaking pages only between systems`,
    {
      // Generating and engraving a long drill (one system a bar on a phone's screen) takes a
      // while on a busy machine.
      timeout: 300_000,
    },
    async () => {
      const context = await suite.browser.newContext({
        viewport: { width: size.width, height: size.height },
      });
      const dir = mkdtempSync(join(tmpdir(), 'tensile-print-'));
      try {
        const page = await context.newPage();
        const teacher = DEMO_TEACHERS[0]!;
        await signIn(page, suite.server.url, teacher.email, teacher.password);
        await servePresetWithBars(page, CARD, size.bars);
        await page.goto(`${suite.server.url}/drills/${CARD}?seed=${SEED}`);
        await page.getByRole('heading', { level: 1, name: 'Early backbeat' }).waitFor();
        const bars = page.locator('tensile-drill-score svg.tensile-notation .tensile-bar');
        await expect.poll(() => bars.count(), { timeout: 90_000 }).toBe(size.bars);
        await page.getByRole('region', { name: 'Playback' }).waitFor();

        // Laid out for print, the score re-flows on the print line (wait for that state).
        await page.emulateMedia({ media: 'print' });
        const sheet = page.locator('tensile-drill-score svg.tensile-notation');
        await expect
          .poll(() => sheet.evaluate((svg) => Number(svg.getAttribute('width'))), {
            timeout: 30_000,
          })
          .toBeGreaterThanOrEqual(960);
        const bands = page.locator('tensile-drill-score .band');
        const perSystem = await bands.evaluateAll((strips) =>
          strips.map((strip) => strip.querySelectorAll('tensile-tension-plot').length),
        );
        const systems = perSystem.length;
        expect(systems).toBeGreaterThan(1);
        expect(perSystem.reduce((a, b) => a + b, 0)).toBe(size.bars);
        // Systems that fill the page: never a phone's one bar a line.
        expect(Math.max(...perSystem), 'bars on the fullest printed system').toBeGreaterThan(2);
        printedSystems.set(size.name, perSystem);
        const desktop = printedSystems.get('desktop');
        if (size.name !== 'desktop' && desktop) expect(perSystem).toEqual(desktop);
        // Nothing printed overlaps: every bar of a system starts where the one before it ends.
        const rows = await page
          .locator('tensile-drill-score .plot')
          .evaluateAll((plots) => plots.map((plot) => plot.getBoundingClientRect()));
        for (let i = 1; i < rows.length; i++) {
          const [a, b] = [rows[i - 1]!, rows[i]!];
          if (Math.abs(a.top - b.top) < 1) expect(b.left).toBeGreaterThanOrEqual(a.right - 0.5);
        }

        // Plain text first: what is on paper, and what is not.
        const plain = join(dir, 'plain.pdf');
        writeFileSync(plain, await page.pdf({ format: 'A4', preferCSSPageSize: true }));
        const text = execFileSync('pdftotext', ['-layout', plain, '-'], { encoding: 'utf8' });
        expect(text).toContain('Early backbeat');
        expect(text).toContain(`Seed ${SEED}`);
        expect(text).toMatch(/Difficulty \d/);
        for (const control of [
          'Regenerate',
          'Tempo trainer',
          'Rule cards',
          'Shortcuts',
          'Volume',
        ]) {
          expect(text, `"${control}" on paper`).not.toContain(control);
        }

        // Then with each system's strip outlined, to see where the pages break.
        await page.addStyleTag({
          content:
            'tensile-drill-score .band { border-top: 8px solid #f00; border-bottom: 8px solid #00f; }',
        });
        const marked = join(dir, 'marked.pdf');
        writeFileSync(marked, await page.pdf({ format: 'A4', preferCSSPageSize: true }));
        // To look at the pages: TENSILE_PRINT_DIR=/some/dir keeps both PDFs there.
        const keep = process.env['TENSILE_PRINT_DIR'];
        if (keep) {
          copyFileSync(plain, join(keep, `drill-print-${size.name}.pdf`));
          copyFileSync(marked, join(keep, `drill-print-${size.name}-marked.pdf`));
        }
        execFileSync('pdftoppm', ['-r', '96', marked, join(dir, 'page')]);
        const pages = readdirSync(dir)
          .filter((file) => file.startsWith('page') && file.endsWith('.ppm'))
          .sort();
        expect(pages.length).toBeGreaterThan(1);
        const perPage = pages.map((file) => markerRules(readPpm(join(dir, file))));
        // Every strip that starts on a page ends on it: "RBRB…", never a lone R or B.
        for (const [i, page] of perPage.entries()) {
          expect(page.rules, `page ${i + 1}`).toMatch(/^(RB)*$/);
        }
        expect(perPage.map((page) => page.rules).join('').length / 2).toBe(systems);
        // The text after the score starts below its last strip, never over it: on the strip's
        // page below it, or on a later page (where the page breaks fall depends on the score).
        const lastStripPage = perPage.findLastIndex((page) => page.rules.length > 0) + 1;
        const textPage = perPage.findIndex(
          (_page, i) => wordTop(marked, i + 1, 'Difficulty', 96) !== null,
        );
        expect(textPage, 'the difficulty line is printed').toBeGreaterThanOrEqual(0);
        expect(textPage + 1, 'the difficulty line follows the score').toBeGreaterThanOrEqual(
          lastStripPage,
        );
        if (textPage + 1 === lastStripPage) {
          const below = wordTop(marked, lastStripPage, 'Difficulty', 96)!;
          expect(below).toBeGreaterThan(perPage[lastStripPage - 1]!.lastRow);
        }
      } finally {
        await context.close();
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
