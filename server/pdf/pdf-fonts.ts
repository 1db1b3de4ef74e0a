/**
 * The faces a printed worksheet embeds, all from npm packages on disk (nothing is fetched), and
 * the one pdfmake instance, set up once with them and with no network and no other file access.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import pdfmake from 'pdfmake';
import { MUSIC_FONT_FILES } from '../../fonts/font-files';

const require = createRequire(import.meta.url);
const pdfmakeFonts = join(dirname(require.resolve('pdfmake/package.json')), 'fonts', 'Roboto');
const academicoBold = join(dirname(MUSIC_FONT_FILES.academico), 'academico-bold.otf');

/** Text face of the page (headings, ladder, footer). */
export const TEXT_FONT = 'Roboto';

/** pdfmake's font table: the text face, and the two faces VexFlow's SVG names. */
export const PDF_FONTS = {
  [TEXT_FONT]: {
    normal: join(pdfmakeFonts, 'Roboto-Regular.ttf'),
    bold: join(pdfmakeFonts, 'Roboto-Medium.ttf'),
    italics: join(pdfmakeFonts, 'Roboto-Italic.ttf'),
    bolditalics: join(pdfmakeFonts, 'Roboto-MediumItalic.ttf'),
  },
  // Without Bravura every music glyph of the notation would print as an empty box.
  Bravura: {
    normal: MUSIC_FONT_FILES.bravura,
    bold: MUSIC_FONT_FILES.bravura,
    italics: MUSIC_FONT_FILES.bravura,
    bolditalics: MUSIC_FONT_FILES.bravura,
  },
  Academico: {
    normal: MUSIC_FONT_FILES.academico,
    bold: academicoBold,
    italics: MUSIC_FONT_FILES.academico,
    bolditalics: academicoBold,
  },
};

const allowedFiles = new Set(Object.values(PDF_FONTS).flatMap((faces) => Object.values(faces)));
let ready = false;

/** pdfmake with Tensile's fonts: no URL is ever fetched, and only the font files are read. */
export function preparedPdfmake(): typeof pdfmake {
  if (!ready) {
    pdfmake.addFonts(PDF_FONTS);
    pdfmake.setUrlAccessPolicy(() => false);
    pdfmake.setLocalAccessPolicy((path) => allowedFiles.has(path));
    ready = true;
  }
  return pdfmake;
}
