import { createRequire } from 'node:module';
import { afterAll, describe, expect, it } from 'vitest';
import { pageImage, pdfOnDisk, pdfText, type PageImage } from '../../tests/support/pdf-inspect';
import { SvgDocument, type SvgNode } from '../notation/svg-document';
import { notationArt } from './notation-art';
import { preparedPdfmake } from './pdf-fonts';
import { compilePrintDrawing } from './print-drawing';
import { drawNotation, pdfBytes, type LaidOutDocument } from './render-worksheet';
import { ALL_AIDS, presetDrill } from './testing/sample-print';
import { NOTATION_DRAWING } from './worksheet-document';

/*
 * The reference is pdfmake's own SVG path, svg-to-pdfkit. pdfmake re-indents an SVG string with
 * xmldoc before svg-to-pdfkit reads it (pdfmake/js/SVGMeasure.js, writeDimensions), which adds
 * white-space text between elements; the compiled drawing is given that same tree here, so the
 * two must print the same page, pixel for pixel but for anti-aliasing.
 */
const pdfmakeRequire = createRequire(createRequire(import.meta.url).resolve('pdfmake'));
const { XmlDocument } = pdfmakeRequire('xmldoc') as {
  XmlDocument: new (xml: string) => XmlElement & { toString(): string };
};

interface XmlElement {
  readonly type: 'element';
  readonly name: string;
  readonly attr: Record<string, string>;
  readonly children: readonly (XmlElement | { readonly type: string; readonly text: string })[];
}

function treeOf(xml: XmlElement, document: SvgDocument): SvgNode {
  const node = document.createElementNS('http://www.w3.org/2000/svg', xml.name);
  for (const [name, value] of Object.entries(xml.attr)) node.setAttribute(name, value);
  for (const child of xml.children)
    node.append('text' in child ? child.text : treeOf(child, document));
  return node;
}

const WIDTH = 515;
const disposers: (() => Promise<void>)[] = [];
afterAll(async () => Promise.all(disposers.map((d) => d())));

async function onePage(node: object, drawn: boolean): Promise<{ path: string; page: PageImage }> {
  const doc = await preparedPdfmake()
    .createPdf({ content: [node], pageSize: 'A4' }, { bufferPages: true })
    .getStream();
  if (drawn) drawNotation(doc as unknown as LaidOutDocument);
  doc.end();
  const file = await pdfOnDisk(await pdfBytes(doc));
  disposers.push(file.dispose);
  return { path: file.path, page: await pageImage(file.path, 1, 100) };
}

/** Pixels whose grey differs by more than a quarter of the range, and the largest difference. */
function difference(a: PageImage, b: PageImage): { pixels: number; inked: number } {
  expect([a.width, a.height]).toEqual([b.width, b.height]);
  let pixels = 0;
  let inked = 0;
  for (let i = 0; i < a.data.length; i += 4) {
    const grey = (d: Uint8ClampedArray) => (d[i]! + d[i + 1]! + d[i + 2]!) / 3;
    if (Math.abs(grey(a.data) - grey(b.data)) > 64) pixels++;
    if (grey(a.data) < 128) inked++;
  }
  return { pixels, inked };
}

describe('drawPrintDrawing', () => {
  it.each([
    // Counts, sticking, accents, the key; and tuplet brackets with dashed lines.
    ['early-backbeat', 4],
    ['four-over-three', 2],
  ])(
    '%s: prints what svg-to-pdfkit prints from the same SVG',
    async (preset, bars) => {
      const art = notationArt(presetDrill(preset, bars, 'draw-1').drill, ALL_AIDS);
      const indented = new XmlDocument(art.svg).toString();
      const drawing = compilePrintDrawing(treeOf(new XmlDocument(indented), new SvgDocument()));
      const reference = await onePage({ svg: art.svg, width: WIDTH }, false);
      const placeholder = `<svg xmlns="http://www.w3.org/2000/svg" width="${art.width}" height="${art.height}"/>`;
      const ours = await onePage(
        { svg: placeholder, width: WIDTH, [NOTATION_DRAWING]: drawing },
        true,
      );
      const { pixels, inked } = difference(reference.page, ours.page);
      expect(inked).toBeGreaterThan(2000);
      expect(pixels).toBeLessThan(20);
      // The same words come out of the page (sticking, counts, the key's labels).
      const words = async (path: string) => (await pdfText(path)).words.map((w) => w.text).sort();
      expect(await words(ours.path)).toEqual(await words(reference.path));
    },
    120_000,
  );
});
