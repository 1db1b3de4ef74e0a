/**
 * Reading a PDF the way a test needs it, with poppler-utils (`pdftotext`, `pdftoppm`, `pdffonts`)
 * and @napi-rs/canvas for pixels: words with their page and box, page sizes, page images.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { createCanvas, loadImage } from '@napi-rs/canvas';
import jsQR from 'jsqr';

const run = promisify(execFile);

export interface PdfWord {
  /** Page number, from 1. */
  readonly page: number;
  readonly text: string;
  /** Box in points from the page's top-left corner. */
  readonly xMin: number;
  readonly yMin: number;
  readonly xMax: number;
  readonly yMax: number;
}

export interface PdfText {
  readonly pages: readonly { readonly width: number; readonly height: number }[];
  readonly words: readonly PdfWord[];
}

/** A PDF written to a temporary folder for the poppler tools; `dispose` removes it. */
export async function pdfOnDisk(
  bytes: Buffer,
): Promise<{ path: string; dispose(): Promise<void> }> {
  const dir = await mkdtemp(join(tmpdir(), 'tensile-pdf-'));
  const path = join(dir, 'print.pdf');
  await writeFile(path, bytes);
  return { path, dispose: () => rm(dir, { recursive: true, force: true }) };
}

const unescape = (s: string) =>
  s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&amp;/g, '&');

/** Every word with its page and box (`pdftotext -bbox`), and every page's size in points. */
export async function pdfText(path: string): Promise<PdfText> {
  const { stdout } = await run('pdftotext', ['-bbox', path, '-'], { maxBuffer: 64 << 20 });
  const pages: { width: number; height: number }[] = [];
  const words: PdfWord[] = [];
  for (const [, pageAttrs, body] of stdout.matchAll(/<page ([^>]*)>([\s\S]*?)<\/page>/g)) {
    const size = /width="([\d.]+)" height="([\d.]+)"/.exec(pageAttrs!)!;
    pages.push({ width: Number(size[1]), height: Number(size[2]) });
    const re =
      /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g;
    for (const [, xMin, yMin, xMax, yMax, text] of body!.matchAll(re)) {
      words.push({
        page: pages.length,
        text: unescape(text!),
        xMin: Number(xMin),
        yMin: Number(yMin),
        xMax: Number(xMax),
        yMax: Number(yMax),
      });
    }
  }
  return { pages, words };
}

/** Where a phrase (words in a row on one page) starts; every occurrence. */
export function findPhrase(text: PdfText, phrase: string): PdfWord[][] {
  const wanted = phrase.split(/\s+/);
  const found: PdfWord[][] = [];
  text.words.forEach((_, i) => {
    const run = text.words.slice(i, i + wanted.length);
    if (
      run.length === wanted.length &&
      run.every((w, j) => w.text === wanted[j] && w.page === run[0]!.page)
    )
      found.push(run);
  });
  return found;
}

/** Names of the fonts embedded in the file (`pdffonts`), without their subset prefix. */
export async function embeddedFonts(path: string): Promise<string[]> {
  const { stdout } = await run('pdffonts', [path]);
  return stdout
    .split('\n')
    .slice(2)
    .filter((line) => line.trim() !== '')
    .map((line) => {
      const name = line.split(/\s+/)[0]!;
      const embedded = /\s(yes|no)\s+(yes|no)\s+(yes|no)\s/.exec(line)?.[1] === 'yes';
      return embedded ? name.replace(/^[A-Z]{6}\+/, '') : `${name} (not embedded)`;
    });
}

export interface PageImage {
  readonly width: number;
  readonly height: number;
  /** RGBA bytes. */
  readonly data: Uint8ClampedArray;
  /** Pixels per point. */
  readonly scale: number;
}

/** One page rendered to PNG by `pdftoppm -png -r <dpi>` and decoded. */
export async function pageImage(path: string, page: number, dpi = 110): Promise<PageImage> {
  const prefix = `${path}-page`;
  await run('pdftoppm', [
    '-png',
    '-r',
    String(dpi),
    '-f',
    String(page),
    '-l',
    String(page),
    '-singlefile',
    path,
    prefix,
  ]);
  const image = await loadImage(await readFile(`${prefix}.png`));
  const canvas = createCanvas(image.width, image.height);
  const ctx = canvas.getContext('2d');
  ctx.drawImage(image, 0, 0);
  const { data } = ctx.getImageData(0, 0, image.width, image.height);
  return { width: image.width, height: image.height, data, scale: dpi / 72 };
}

/** A box in points on the page. */
export interface PointBox {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** Share of pixels in the box darker than mid-grey (0..1). */
export function inkShare(image: PageImage, box: PointBox): number {
  const { x0, y0, x1, y1 } = pixelBox(image, box);
  let dark = 0;
  for (let y = y0; y < y1; y++) {
    for (let x = x0; x < x1; x++) {
      const i = (y * image.width + x) * 4;
      if (image.data[i]! + image.data[i + 1]! + image.data[i + 2]! < 3 * 128) dark++;
    }
  }
  return dark / Math.max(1, (x1 - x0) * (y1 - y0));
}

/** The text of the QR code in the box, or null when none can be read. */
export function readQr(image: PageImage, box: PointBox): string | null {
  const { x0, y0, x1, y1 } = pixelBox(image, box);
  const width = x1 - x0;
  const height = y1 - y0;
  const crop = new Uint8ClampedArray(width * height * 4);
  for (let y = 0; y < height; y++) {
    const from = ((y + y0) * image.width + x0) * 4;
    crop.set(image.data.subarray(from, from + width * 4), y * width * 4);
  }
  return jsQR(crop, width, height)?.data ?? null;
}

function pixelBox(image: PageImage, box: PointBox) {
  const clampX = (v: number) => Math.max(0, Math.min(image.width, Math.round(v * image.scale)));
  const clampY = (v: number) => Math.max(0, Math.min(image.height, Math.round(v * image.scale)));
  return {
    x0: clampX(box.x),
    y0: clampY(box.y),
    x1: clampX(box.x + box.width),
    y1: clampY(box.y + box.height),
  };
}
