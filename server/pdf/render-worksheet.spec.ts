import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  embeddedFonts,
  findPhrase,
  inkShare,
  pageImage,
  pdfOnDisk,
  pdfText,
  readQr,
  type PdfText,
  type PdfWord,
} from '../../tests/support/pdf-inspect';
import { drawArt, layOutPdf, pdfBytes, renderWorksheetPdf } from './render-worksheet';
import { presetDrill, samplePrint } from './testing/sample-print';
import { PRACTICE_CAUTION } from './worksheet-document';
import type { WorksheetPrint } from './worksheet-print';

const SLOW = 300_000;

/** Five drills of different lengths: some fill a page, some could share one. */
const print = samplePrint([
  presetDrill('kick-off-the-one', 16, 'pdf-1'),
  presetDrill('early-backbeat', 4, 'pdf-2', { sticking: true, counts: false, tension: true }),
  presetDrill('four-over-three', 2, 'pdf-4', { sticking: false, counts: true, tension: true }),
  presetDrill('quintuplets-hihat-1-3-5', 8, 'pdf-3'),
  presetDrill('six-eight-groove', 12, 'pdf-5'),
]);

interface Rendered {
  readonly path: string;
  readonly text: PdfText;
  dispose(): Promise<void>;
}

async function render(worksheet: WorksheetPrint, withoutNotation = false): Promise<Rendered> {
  const bytes = withoutNotation
    ? await pdfBytes(
        await layOutPdf(worksheet, await drawArt(worksheet), { withoutNotation: true }),
      )
    : await pdfBytes(await renderWorksheetPdf(worksheet));
  expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  const file = await pdfOnDisk(bytes);
  return { ...file, text: await pdfText(file.path) };
}

/** The one line that names the drill's seed ("… · seed pdf-3"), i.e. the line under its title. */
function factsLine(text: PdfText, seed: string): PdfWord {
  const found = findPhrase(text, `seed ${seed}`);
  expect(found, `facts line of ${seed}`).toHaveLength(1);
  return found[0]![1]!;
}

/** The first word `word` after `after` on the same page. */
function nextOnPage(text: PdfText, after: PdfWord, word: string): PdfWord {
  const found = text.words.find(
    (w) => w.page === after.page && w.yMin > after.yMax && w.text === word,
  );
  expect(found, `"${word}" after ${after.text} on page ${after.page}`).toBeDefined();
  return found!;
}

describe('renderWorksheetPdf: a five-drill worksheet on A4', () => {
  let a4: Rendered;
  beforeAll(async () => {
    a4 = await render(print);
  }, SLOW);
  afterAll(() => a4?.dispose());

  it('embeds its text face and the music faces the notation uses', async () => {
    const fonts = await embeddedFonts(a4.path);
    // Without Bravura every music glyph would print as an empty box.
    expect(fonts).toEqual(expect.arrayContaining(['Roboto-Regular', 'Bravura', 'Academico']));
    expect(fonts.filter((f) => f.includes('not embedded'))).toEqual([]);
  });

  it('prints the header, every drill title and seed link, page numbers and the caution', () => {
    const { text } = a4;
    for (const phrase of [print.title, print.studioName, print.date, print.notes!]) {
      expect(findPhrase(text, phrase), phrase).toHaveLength(1);
    }
    for (const drill of print.drills) {
      expect(findPhrase(text, drill.title), drill.title).toHaveLength(1);
      expect(
        text.words.filter((w) => w.text === drill.seedLink),
        drill.seedLink,
      ).toHaveLength(1);
    }
    const pages = text.pages.length;
    expect(pages).toBeGreaterThan(1);
    for (let page = 1; page <= pages; page++) {
      const words = text.words.filter((w) => w.page === page).map((w) => w.text);
      expect(words.join(' ')).toContain(`Page ${page} of ${pages}`);
      expect(words.join(' ')).toContain('hearing protection');
    }
    expect(findPhrase(text, PRACTICE_CAUTION.split(' ').slice(0, 6).join(' ')).length).toBe(pages);
  });

  it('never splits a drill: its title, notation, ladder and link share one page', () => {
    const { text } = a4;
    for (const drill of print.drills) {
      const title = findPhrase(text, drill.title)[0]![0]!;
      const facts = factsLine(text, drill.drill.seed);
      const link = text.words.find((w) => w.text === drill.seedLink)!;
      const ladder = nextOnPage(text, facts, 'Tempo');
      expect([facts.page, ladder.page, link.page], drill.title).toEqual([
        title.page,
        title.page,
        title.page,
      ]);
      expect(title.yMax).toBeLessThanOrEqual(facts.yMin);
      expect(ladder.yMax).toBeLessThanOrEqual(link.yMin);
    }
    // Five drills over fewer than five pages: short ones share a page.
    expect(text.pages.length).toBeLessThan(print.drills.length);
  });

  it(
    'draws the notation: the box between a drill’s title and its plot is inked',
    async () => {
      const { text } = a4;
      const blank = await render(print, true);
      try {
        for (const drill of print.drills) {
          const facts = factsLine(text, drill.drill.seed);
          const below = nextOnPage(text, facts, 'Tension');
          const page = text.pages[facts.page - 1]!;
          const box = {
            x: 40,
            y: facts.yMax + 2,
            width: page.width - 80,
            height: below.yMin - facts.yMax - 4,
          };
          expect(box.height, drill.title).toBeGreaterThan(60);
          const ink = inkShare(await pageImage(a4.path, facts.page), box);
          // Staff lines, noteheads and beams cover a few per cent of the box; blank paper none.
          expect(ink, drill.title).toBeGreaterThan(0.02);
          // The same box with the notation left out is blank: the measure tells them apart.
          const blankFacts = factsLine(blank.text, drill.drill.seed);
          expect(blankFacts.page).toBe(facts.page);
          expect(inkShare(await pageImage(blank.path, facts.page), box)).toBeLessThan(0.001);
        }
      } finally {
        await blank.dispose();
      }
    },
    SLOW,
  );

  it(
    'prints a QR code beside the ladder that reads as the drill’s seed link',
    async () => {
      const { text } = a4;
      for (const drill of print.drills) {
        const facts = factsLine(text, drill.drill.seed);
        const ladder = nextOnPage(text, facts, 'Tempo');
        const page = text.pages[facts.page - 1]!;
        const box = { x: page.width - 140, y: ladder.yMin - 12, width: 110, height: 110 };
        expect(readQr(await pageImage(a4.path, facts.page), box), drill.title).toBe(drill.seedLink);
      }
    },
    SLOW,
  );
});

describe('renderWorksheetPdf: paper sizes and sharing a page', () => {
  const short = [
    presetDrill('early-backbeat', 2, 'short-1', { sticking: true, counts: true, tension: false }),
    // A quarter-note hi-hat groove: two bars fit one system whatever the seed.
    presetDrill('kick-off-the-one', 2, 'short-2', {
      sticking: false,
      counts: false,
      tension: false,
    }),
  ];

  it(
    'prints A4 and US Letter at their sizes, two short drills on one page',
    async () => {
      // ISO 216: A4 is 210 × 297 mm = 595.28 × 841.89 pt; ANSI/ASME Y14.1: Letter is
      // 8.5 × 11 in = 612 × 792 pt (72 pt to the inch, the PDF user unit; ISO 32000-1:2008, 8.3.2.3).
      for (const [paper, width, height] of [
        ['a4', 595.28, 841.89],
        ['letter', 612, 792],
      ] as const) {
        const rendered = await render(samplePrint(short, paper));
        try {
          expect(rendered.text.pages).toHaveLength(1);
          expect(rendered.text.pages[0]!.width).toBeCloseTo(width, 1);
          expect(rendered.text.pages[0]!.height).toBeCloseTo(height, 1);
          for (const drill of short) expect(findPhrase(rendered.text, drill.title)).toHaveLength(1);
        } finally {
          await rendered.dispose();
        }
      }
    },
    SLOW,
  );

  it('stops when the download is cancelled', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(renderWorksheetPdf(samplePrint(short), controller.signal)).rejects.toMatchObject({
      name: 'AbortError',
    });
  });
});
