/**
 * The browser draws the score with fonts/tensile-music.woff2, a subset of Bravura. A glyph left
 * out would fall back to another face (a wrong symbol, and VexFlow's measured widths would move
 * the layout), so every code point the notation draws must be in the subset with Bravura's own
 * advance width.
 */
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { renderDrillSvg } from '../../server/notation/render-svg';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { MARK_GLYPHS } from '../../shared/notation/header-marks';
import { REPO_ROOT } from '../support/browser';

interface FontkitFont {
  readonly characterSet: readonly number[];
  readonly familyName: string;
  glyphForCodePoint(codePoint: number): { readonly advanceWidth: number };
}
// fontkit comes with pdfmake (through pdfkit); it reads WOFF2 and OpenType alike.
const fontkit = createRequire(import.meta.url)('fontkit') as {
  openSync(path: string): FontkitFont;
};

const subset = fontkit.openSync(join(REPO_ROOT, 'fonts/tensile-music.woff2'));
const full = fontkit.openSync(
  createRequire(import.meta.url).resolve('@vexflow-fonts/bravura/bravura.otf'),
);
const inSubset = new Set(subset.characterSet);

const hex = (codePoint: number): string => `U+${codePoint.toString(16).toUpperCase()}`;

/** Code points of the subset missing or drawn wider or narrower than in Bravura. */
function missing(codePoints: Iterable<number>): string[] {
  return [...codePoints]
    .filter(
      (cp) =>
        !inSubset.has(cp) ||
        subset.glyphForCodePoint(cp).advanceWidth !== full.glyphForCodePoint(cp).advanceWidth,
    )
    .map(hex);
}

/** Private-use code points (SMuFL's music symbols) in the text of an SVG drawing. */
function musicCodePoints(svg: string): Set<number> {
  const found = new Set<number>();
  for (const [, text] of svg.matchAll(/>([^<]+)</g)) {
    for (const ch of text!) {
      const cp = ch.codePointAt(0)!;
      if (cp >= 0xe000 && cp <= 0xf8ff) found.add(cp);
    }
  }
  return found;
}

describe('the music font subset', () => {
  it('is not named Bravura (a reserved font name under the SIL OFL 1.1, section 3)', () => {
    expect(subset.familyName).toBe('Tensile Music');
  });

  it('has every glyph the notation draws for the built-in presets, at several seeds and options', () => {
    const drawn = new Set<number>();
    for (const preset of BUILT_IN_PRESETS) {
      const card = parseRuleCard(preset.card);
      for (const seed of ['font-a', 'font-b', 'font-c']) {
        const drill = generateDrill(card, seed);
        for (const options of [
          { width: 1000, showSticking: true, showCounts: true, showTension: true },
          { width: 360, showSticking: false, showCounts: false, showTension: false },
        ]) {
          for (const cp of musicCodePoints(renderDrillSvg(drill, options).svg)) drawn.add(cp);
        }
      }
    }
    // Noteheads, rests, flags, clef, time signature, accents, tuplets, dots: dozens, not a few.
    expect(drawn.size).toBeGreaterThan(20);
    expect(missing(drawn)).toEqual([]);
  });

  it('has the tempo and swing marks drawn over the staff', () => {
    const codes = Object.values(MARK_GLYPHS).map((glyph) => glyph.code.codePointAt(0)!);
    expect(missing(codes)).toEqual([]);
  });

  // The SMuFL ranges a drum part can draw (SMuFL 1.4, Steinberg, 2021, "Ranges"; boundaries
  // from memory): every glyph Bravura has in them is kept, whether or not a preset shows it.
  it.each([
    ['staves, barlines and repeats', 0xe000, 0xe04f],
    ['clefs', 0xe050, 0xe07f],
    ['time signatures', 0xe080, 0xe09f],
    ['noteheads', 0xe0a0, 0xe0ff],
    ['individual notes and beamed groups of notes', 0xe1d0, 0xe20f],
    ['stems and tremolos', 0xe210, 0xe23f],
    ['flags', 0xe240, 0xe25f],
    ['articulation', 0xe4a0, 0xe4bf],
    ['holds and pauses', 0xe4c0, 0xe4df],
    ['rests', 0xe4e0, 0xe4ff],
    ['bar repeats', 0xe500, 0xe51f],
    ['dynamics', 0xe520, 0xe54f],
    ['grace notes', 0xe560, 0xe56f],
    ['tuplets', 0xe880, 0xe88f],
    ['metronome marks', 0xeca0, 0xecbf],
  ])('keeps %s', (_name, first, last) => {
    const inBravura = full.characterSet.filter((cp) => cp >= first && cp <= last);
    expect(inBravura.length).toBeGreaterThan(0);
    expect(missing(inBravura)).toEqual([]);
  });

  it('is a real subset: a range drum parts never draw (lute tablature) is left out', () => {
    const lute = full.characterSet.filter((cp) => cp >= 0xebc0 && cp <= 0xebff);
    expect(lute.length).toBeGreaterThan(0);
    expect(lute.filter((cp) => inSubset.has(cp))).toEqual([]);
  });
});
