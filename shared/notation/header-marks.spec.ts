import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { VexFlow } from 'vexflow/bravura';
import { describe, expect, it } from 'vitest';
import {
  describeHeaderMarks,
  headerMarks,
  layoutHeaderMarks,
  MARK_GLYPHS,
  type MarkedCard,
} from './header-marks';

const card = (meter: MarkedCard['meter'], extra: Partial<MarkedCard> = {}): MarkedCard => ({
  meter,
  tempo: 92,
  ...extra,
});

describe('metronome mark', () => {
  // The beat's note in the mark (common practice): the meter's unit in simple time, the dotted
  // note of three units in compound time (6/8 as dotted quarters).
  it('counts simple meters in their unit', () => {
    expect(headerMarks(card({ beats: 4, unit: 4 })).tempo).toEqual({
      note: { value: 4, dotted: false },
      bpm: 92,
      approximate: false,
      exact: null,
    });
    expect(headerMarks(card({ beats: 2, unit: 2 })).tempo?.note).toEqual({
      value: 2,
      dotted: false,
    });
    // Odd meters and eighth meters without threes keep the eighth.
    for (const grouping of [[2, 2, 3], undefined]) {
      const mark = headerMarks(card({ beats: 7, unit: 8, grouping })).tempo;
      expect(mark).toMatchObject({ note: { value: 8, dotted: false }, bpm: 92 });
    }
  });

  it('counts compound meters in dotted beats of three units, with the unit beside a rounded value', () => {
    const sixEight = (tempo: number) =>
      headerMarks(card({ beats: 6, unit: 8, grouping: [3, 3] }, { tempo })).tempo;
    // The card's tempo counts eighths (as playback does): 90 eighths a minute = 30 dotted quarters.
    expect(sixEight(90)).toEqual({
      note: { value: 4, dotted: true },
      bpm: 30,
      approximate: false,
      exact: null,
    });
    expect(sixEight(92)).toEqual({
      note: { value: 4, dotted: true },
      bpm: 31,
      approximate: true,
      exact: { note: { value: 8, dotted: false }, bpm: 92 },
    });
    const twelveSixteen = headerMarks(card({ beats: 12, unit: 16, grouping: [3, 3, 3, 3] }));
    expect(twelveSixteen.tempo?.note).toEqual({ value: 8, dotted: true });
  });

  it('is left out when the source has no tempo', () => {
    expect(headerMarks({ meter: { beats: 4, unit: 4 } }).tempo).toBeNull();
  });
});

describe('swing marking', () => {
  const swung = (unit: number, ratio: number, meterUnit = 4) =>
    headerMarks(card({ beats: 4, unit: meterUnit }, { swing: { unit, ratio } })).swing;

  it('writes "Swing" with the triplet equivalence for the triplet feel', () => {
    expect(swung(8, 0.6667)).toEqual({
      unit: 8,
      words: 'Swing',
      equivalence: 'triplet',
      ratio: null,
    });
    expect(swung(16, 0.6667)).toEqual({
      unit: 16,
      words: 'Swing 16ths',
      equivalence: 'triplet',
      ratio: null,
    });
  });

  it('writes the dotted pair for 3:1 eighths and the ratio where no figure is exact', () => {
    expect(swung(8, 0.75)).toMatchObject({ equivalence: 'dotted', ratio: null });
    expect(swung(8, 0.6)).toMatchObject({ equivalence: 'triplet', ratio: '60:40' });
    expect(swung(16, 0.75)).toMatchObject({ equivalence: 'triplet', ratio: '75:25' });
  });

  it('is left out exactly where playback plays straight', () => {
    expect(swung(8, 0.5)).toBeNull();
    expect(headerMarks(card({ beats: 4, unit: 4 })).swing).toBeNull();
    // Swung eighths cannot pair inside an eighth beat: playback keeps them straight.
    expect(swung(8, 0.6667, 8)).toBeNull();
    expect(swung(16, 0.6667, 8)).toMatchObject({ words: 'Swing 16ths' });
  });
});

describe('marks in words and lines', () => {
  const marks = headerMarks(card({ beats: 4, unit: 4 }, { swing: { unit: 8, ratio: 0.6 } }));

  it('describes the marks for screen readers', () => {
    expect(describeHeaderMarks(marks)).toBe(
      'Tempo: quarter note = 92. Swing eighths: each pair played as a triplet quarter and ' +
        'eighth, long to short 60:40',
    );
    const compound = headerMarks(card({ beats: 6, unit: 8, grouping: [3, 3] }));
    expect(describeHeaderMarks(compound)).toBe(
      'Tempo: dotted quarter note = about 31 (eighth note = 92)',
    );
  });

  it('puts the marks on one line when they fit, else the swing marking on a second', () => {
    const wide = layoutHeaderMarks(marks, 800);
    expect(wide.lines).toHaveLength(1);
    expect(wide.lines[0]!.map((p) => p.className)).toEqual([
      'tensile-swing-words',
      'tensile-tempo-mark',
      'tensile-swing-mark',
    ]);
    const narrow = layoutHeaderMarks(marks, 200);
    expect(narrow.lines.map((l) => l.map((p) => p.className))).toEqual([
      ['tensile-swing-words', 'tensile-tempo-mark'],
      ['tensile-swing-mark'],
    ]);
    expect(narrow.height).toBe(2 * wide.height);
    expect(layoutHeaderMarks({ tempo: null, swing: null }, 800).height).toBe(0);
  });
});

describe('mark glyphs', () => {
  it("match Bravura's code points and advance widths", () => {
    const require = createRequire(import.meta.url);
    const metadata = JSON.parse(
      readFileSync(require.resolve('@vexflow-fonts/bravura/metadata.json'), 'utf8'),
    ) as { glyphAdvanceWidths: Record<string, number> };
    const codes = VexFlow.Glyphs as unknown as Record<string, string>;
    for (const [name, glyph] of Object.entries(MARK_GLYPHS)) {
      expect(glyph.code, name).toBe(codes[name]);
      expect(glyph.advance, name).toBe(metadata.glyphAdvanceWidths[name]);
    }
  });
});
