/**
 * The print controls in a real browser against the real server: the teacher names the studio and
 * uploads a logo on the Print settings page (a file that is not an image is refused and nothing
 * changes), cancels a worksheet's PDF while it is being laid out, lays it out again, and finds the
 * studio name and the logo in the PDF that arrives.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { signIn } from '../support/browser';
import { useServerAndBrowser } from '../support/browser-suite';
import { DEMO_TEACHERS } from '../support/demo-accounts';

const WORKSHEET = 'Juno, week 3: leaning on the backbeat';
const STUDIO = 'Larkspur Rhythm Room, Studio B';

describe('print settings and a cancelled print', () => {
  const suite = useServerAndBrowser();

  it(
    'brands the PDF with the studio name and logo, and a cancelled layout can be laid out again',
    {
      timeout: 240_000,
    },
    async () => {
      const context = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
      const dir = mkdtempSync(join(tmpdir(), 'tensile-print-controls-'));
      try {
        const page = await context.newPage();
        const teacher = DEMO_TEACHERS[0]!;
        await signIn(page, suite.server.url, teacher.email, teacher.password);

        await page.goto(`${suite.server.url}/print-settings`);
        await page.getByRole('heading', { level: 1, name: 'Print settings' }).waitFor();
        const name = page.getByRole('textbox', { name: 'Studio name' });
        await name.fill(STUDIO);
        await page.getByRole('button', { name: 'Save name' }).click();
        await page.getByRole('status').filter({ hasText: /saved/i }).waitFor();

        // A text file named like a picture is refused by its content.
        const logoInput = page.locator('input[type="file"]');
        await logoInput.setInputFiles({
          name: 'logo.png',
          mimeType: 'image/png',
          buffer: Buffer.from('not really a picture'),
        });
        await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/PNG or JPEG/i);
        expect(await page.getByText('No logo yet.').isVisible()).toBe(true);

        // A real PNG: a picture of the page itself, taken by the browser.
        const png = await page.screenshot({ clip: { x: 0, y: 0, width: 240, height: 120 } });
        await logoInput.setInputFiles({ name: 'studio.png', mimeType: 'image/png', buffer: png });
        await page.getByRole('img', { name: 'Your studio logo as it will print' }).waitFor();
        expect(await page.getByText(/240 × 120 pixels/).isVisible()).toBe(true);

        // The worksheet's PDF is held back by the test until the teacher has cancelled it.
        let release: () => void = () => undefined;
        const held = new Promise<void>((resolve) => (release = resolve));
        let asked = 0;
        await page.route('**/api/worksheets/*/pdf*', async (route) => {
          asked += 1;
          if (asked === 1) await held;
          await route.continue().catch(() => undefined);
        });

        await page.goto(`${suite.server.url}/worksheets`);
        await page.getByRole('link', { name: WORKSHEET }).click();
        await page.getByRole('heading', { level: 1, name: WORKSHEET }).waitFor();
        await page.getByRole('link', { name: 'Print preview' }).click();
        const laying = page.getByRole('status').filter({ hasText: 'Laying out the pages' });
        await laying.waitFor();
        expect(await page.getByRole('button', { name: 'Download PDF' }).isDisabled()).toBe(true);
        await laying.getByRole('button', { name: 'Cancel' }).click();
        await page.getByRole('status').filter({ hasText: 'Cancelled.' }).waitFor();
        release();
        // Nothing arrives for the cancelled request: no pages are shown.
        await page.waitForTimeout(500);
        expect(await page.locator('iframe.pages').count()).toBe(0);
        expect(await page.getByRole('button', { name: 'Download PDF' }).isDisabled()).toBe(true);

        await page.getByRole('button', { name: 'Lay out the pages again' }).click();
        await page.locator('iframe.pages').waitFor({ timeout: 180_000 });
        expect(asked).toBe(2);

        const [download] = await Promise.all([
          page.waitForEvent('download'),
          page.getByRole('button', { name: 'Download PDF' }).click(),
        ]);
        const file = join(dir, 'worksheet.pdf');
        await download.saveAs(file);
        const text = execFileSync('pdftotext', ['-f', '1', '-l', '1', file, '-'], {
          encoding: 'utf8',
        }).replace(/\s+/g, ' ');
        expect(text).toContain(STUDIO);
        // The logo is the first page's one picture (the notation and QR codes are vector art).
        const images = execFileSync('pdfimages', ['-f', '1', '-l', '1', '-list', file], {
          encoding: 'utf8',
        })
          .split('\n')
          .slice(2)
          .map((line) => line.trim().split(/\s+/))
          // An image with transparency is listed twice: the picture and its soft mask.
          .filter((columns) => columns[2] === 'image');
        expect(images.length).toBe(1);
        expect(images[0]!.slice(3, 5).map(Number)).toEqual([240, 120]);
      } finally {
        await context.close();
        rmSync(dir, { recursive: true, force: true });
      }
    },
  );
});
