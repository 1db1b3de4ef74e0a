import { createCanvas } from '@napi-rs/canvas';
import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { isHandVoice, type VoiceId } from '../../shared/generator/drill';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { STEP_PX, WEINBERG_STEPS } from '../../tests/support/drumset-staff';
import { renderDrillSvg } from './render-svg';

/** SMuFL code points of the tuplet digits start at U+E880 ("tuplet0"). */
const tupletGlyph = (n: number) => String.fromCodePoint(0xe880 + n);

function presetWhere(test: (card: Record<string, unknown>) => boolean) {
  const preset = BUILT_IN_PRESETS.find((p) => test(p.card as Record<string, unknown>));
  if (!preset) throw new Error('No built-in preset matches');
  return preset;
}

const subdivisionHas = (n: number) => (card: Record<string, unknown>) =>
  card['subdivision'] === n ||
  (Array.isArray(card['subdivision']) && card['subdivision'].includes(n));

function parse(svg: string): Document {
  return new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document;
}

function handsOf(drill: Drill, hand: boolean) {
  return drill.bars.flatMap((bar) => bar.hits.filter((h) => isHandVoice(h.voice) === hand));
}

/** Beats (bar, beat) where a voice layer has a hit off the beat, in a beat of prime `n` slots. */
function offBeatBeats(drill: Drill, n: number, hand: boolean): number {
  let count = 0;
  for (const bar of drill.bars) {
    bar.beats.forEach((slots, i) => {
      if (slots !== n) return;
      const off = bar.hits.some(
        (h) => h.beat === i + 1 && h.slot !== 0 && isHandVoice(h.voice) === hand,
      );
      if (off) count++;
    });
  }
  return count;
}

describe('renderDrillSvg (Node, jsdom + @napi-rs/canvas)', () => {
  const quintuplets = presetWhere(subdivisionHas(5));
  const drill = generateDrill(parseRuleCard(quintuplets.card), 'lesson-12');
  const { svg, layout } = renderDrillSvg(drill, {
    width: 1100,
    showSticking: true,
    showCounts: true,
  });
  const doc = parse(svg);

  it('is a standalone SVG document with its namespace', () => {
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
    expect(layout.bars.map((b) => b.bar)).toEqual(drill.bars.map((b) => b.bar));
  });

  it('writes the same drill the same way whatever was drawn before it', () => {
    const options = { width: 1100, showSticking: true, showCounts: true };
    const other = generateDrill(parseRuleCard(BUILT_IN_PRESETS[0]!.card), 'lesson-13');
    renderDrillSvg(other, options);
    expect(renderDrillSvg(drill, options).svg).toBe(svg);
  });

  it('draws one notehead per hit, hands and feet in their own voices', () => {
    for (const [voice, hand] of [
      ['hands', true],
      ['feet', false],
    ] as const) {
      const heads = doc.querySelectorAll(`[data-voice="${voice}"] .tensile-note .vf-notehead`);
      expect(heads.length).toBe(handsOf(drill, hand).length);
    }
  });

  // E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets" (from memory): once a tuplet
  // pattern is established the numbers may be dropped, "sim." after the first, but only where
  // unambiguous: a group of five written in fewer than five values (a combined rest), or with a
  // rest among its five, reads as plain sixteenths without its "5" (common practice).
  it('writes "5" then at most one "sim." a part, and a "5" on every group with a rest or fewer values', () => {
    for (const id of ['quintuplets-hihat-1-3-4', 'quintuplets-hihat-1-3-5']) {
      for (const seed of ['lesson-12', 'cedar-5', 'moss-21']) {
        const preset = BUILT_IN_PRESETS.find((p) => p.id === id)!;
        const drawn = renderDrillSvg(generateDrill(parseRuleCard(preset.card), seed), {
          width: 1100,
          showSticking: true,
          showCounts: true,
        });
        const page = parse(drawn.svg);
        const where = `${id} ${seed}`;
        expect(
          page.querySelectorAll('[data-voice="hands"] .tensile-simile').length,
          where,
        ).toBeLessThanOrEqual(1);
        let shortGroups = 0;
        for (const bar of page.querySelectorAll('[data-bar]')) {
          for (const voice of bar.querySelectorAll('[data-voice]')) {
            for (let beat = 1; beat <= 4; beat++) {
              const values = [...voice.querySelectorAll(`[data-beat="${beat}"][data-duration]`)];
              // Written sixteenths in the beat: five under a "5", four in a plain beat.
              const sixteenths = values.reduce(
                (sum, v) => sum + 16 / Number.parseInt(v.getAttribute('data-duration')!, 10),
                0,
              );
              const played = values.every((v) => v.classList.contains('tensile-note'));
              if (sixteenths !== 5 || (values.length === 5 && played)) continue;
              shortGroups++;
              const number = voice.querySelector(`[data-tuplet="5"][data-beat="${beat}"]`);
              expect(number, `${where} bar ${bar.getAttribute('data-bar')} beat ${beat}`).not.toBe(
                null,
              );
            }
          }
        }
        expect(shortGroups, where).toBeGreaterThan(0);
      }
    }
    for (const voice of ['hands', 'feet'] as const) {
      const numbers = [...doc.querySelectorAll(`[data-voice="${voice}"] [data-tuplet]`)];
      expect(numbers[0]!.getAttribute('data-tuplet')).toBe('5');
      expect(numbers[0]!.querySelector('.vf-tuplet text')?.textContent).toBe(tupletGlyph(5));
    }
    expect(offBeatBeats(drill, 5, true)).toBeGreaterThan(4);
  });

  // Gould, "Behind Bars", ch. "Tuplets" (from memory): where one beam spans exactly the
  // tuplet's notes the number stands alone; a group with a rest at an end keeps its bracket.
  it('draws the bracket line only where the beam does not span the whole group', () => {
    const quintupletDrill = (slots: number[]): Drill => ({
      ...drill,
      bars: drill.bars.slice(0, 1).map((bar) => ({
        ...bar,
        hits: slots.map((slot) => ({
          beat: 1,
          slot,
          voice: 'hihat' as const,
          dynamic: 'normal' as const,
          hand: 'R' as const,
          source: 'fill' as const,
        })),
      })),
    });
    const bracketLines = (slots: number[]) => {
      const one = parse(renderDrillSvg(quintupletDrill(slots), { width: 1100 }).svg);
      const numbers = [...one.querySelectorAll('[data-voice="hands"] .vf-tuplet')];
      expect(numbers).toHaveLength(1);
      expect(numbers[0]!.querySelector('text')?.textContent).toBe(tupletGlyph(5));
      // VexFlow draws a bracket's lines (two level, two hooks) as thin rectangles.
      return numbers[0]!.querySelectorAll('rect').length;
    };
    expect(bracketLines([0, 2, 4])).toBe(0);
    expect(bracketLines([0, 1, 2, 3, 4])).toBe(0);
    expect(bracketLines([0, 2, 3])).toBe(4);
  });

  // Common practice in drum-set parts: the hands' accents stand above the staff at the stem's tip,
  // also when only the snare of a cymbal-and-snare chord is accented (the reader takes it for
  // the drum; an accent under the snare would sit in the feet's part, on its rests and notes).
  it('writes every accent of the hands above the staff, also a snare accented under a cymbal', () => {
    const accentGlyphs = new Set([0xe4a0, 0xe4a1]);
    let mixed = 0;
    for (const [b, bar] of [...doc.querySelectorAll('.tensile-bar')].entries()) {
      for (const note of bar.querySelectorAll('[data-voice="hands"] .tensile-note')) {
        const beat = Number(note.getAttribute('data-beat'));
        const slot = Number(note.getAttribute('data-slot'));
        const hits = drill.bars[b]!.hits.filter(
          (h) => h.beat === beat && h.slot === slot && isHandVoice(h.voice),
        );
        const accented = hits.filter((h) => h.dynamic === 'accent');
        if (accented.length === 0) continue;
        const texts = [...note.querySelectorAll('text')];
        const accents = texts.filter((t) => accentGlyphs.has(t.textContent!.codePointAt(0)!));
        expect(accents).toHaveLength(1);
        const y = Number(accents[0]!.getAttribute('y'));
        const heads = [...note.querySelectorAll('.vf-notehead')].map((h) =>
          Number(h.querySelector('text')!.getAttribute('y')),
        );
        expect(y, `bar ${b + 1} beat ${beat}`).toBeLessThan(Math.min(...heads));
        if (accented.length < hits.length) mixed++;
      }
    }
    expect(mixed).toBeGreaterThan(0);
  });

  it('sets every notehead on the line or space the drum-set convention gives its voice', () => {
    let checked = 0;
    for (const bar of doc.querySelectorAll('.tensile-bar')) {
      const lineYs = [...bar.querySelectorAll(':scope > .vf-stave path')].map((p) =>
        Number(/M[\d.]+ ([\d.]+)/.exec(p.getAttribute('d') ?? '')?.[1]),
      );
      expect(lineYs).toHaveLength(5);
      const topLine = Math.floor(Math.min(...lineYs));
      for (const note of bar.querySelectorAll('.tensile-note')) {
        const voices = (note.getAttribute('data-instruments') ?? '').split(' ') as VoiceId[];
        const heads = [...note.querySelectorAll('.vf-notehead')].map((h) =>
          Number(h.querySelector('text')?.getAttribute('y')),
        );
        expect(heads).toHaveLength(voices.length);
        voices.forEach((voice, i) => {
          // The top line is 4 steps above the middle line.
          expect(heads[i]).toBeCloseTo(topLine + (4 - WEINBERG_STEPS[voice]) * STEP_PX, 0);
          checked++;
        });
      }
    }
    expect(checked).toBe(drill.bars.reduce((n, bar) => n + bar.hits.length, 0));
  });

  it('writes the 4:3 polyrhythm preset with a notehead per hit and only the brackets due', () => {
    const poly = presetWhere(
      (card) =>
        Array.isArray(card['rules']) &&
        card['rules'].some((r: { kind?: string }) => r.kind === 'polyrhythm'),
    );
    const polyDrill = generateDrill(parseRuleCard(poly.card), 'lesson-12');
    const polyDoc = parse(renderDrillSvg(polyDrill).svg);
    const heads = polyDoc.querySelectorAll('.tensile-note .vf-notehead').length;
    expect(heads).toBe(polyDrill.bars.reduce((n, bar) => n + bar.hits.length, 0));
    for (const n of [3, 5, 7]) {
      const expected = offBeatBeats(polyDrill, n, true) + offBeatBeats(polyDrill, n, false);
      expect(polyDoc.querySelectorAll(`[data-tuplet="${n}"]`).length).toBe(expected);
    }
  });

  // A quintuplet is read 3+2 where its fourth value starts the second group, and a group of
  // three sixteenths writes a sixteenth and an eighth rest (Gould, "Behind Bars", ch. "Tuplets",
  // from memory; common practice): a kick on "ta" and "mi" is 16, r8 | 16, r16.
  it('writes a quintuplet kick on "ta" and "mi" as sixteenth, eighth rest, sixteenth, rest', () => {
    const preset = BUILT_IN_PRESETS.find((p) => p.id === 'quintuplets-hihat-1-3-5')!;
    let checked = 0;
    for (const seed of ['cedar-5', 'moss-21']) {
      const drill = generateDrill(parseRuleCard(preset.card), seed);
      const page = parse(renderDrillSvg(drill, { width: 1100 }).svg);
      for (const bar of drill.bars) {
        for (let beat = 1; beat <= 4; beat++) {
          const kicks = bar.hits.filter((h) => h.beat === beat && !isHandVoice(h.voice));
          const slots = [...new Set(kicks.map((h) => h.slot))].sort();
          if (slots.join() !== '0,3') continue;
          checked++;
          const feet = page.querySelector(`[data-bar="${bar.bar}"] [data-voice="feet"]`)!;
          const written = [...feet.querySelectorAll(`[data-beat="${beat}"][data-duration]`)].map(
            (e) =>
              `${e.classList.contains('tensile-rest') ? 'r' : ''}${e.getAttribute('data-duration')}`,
          );
          expect(written, `${seed} bar ${bar.bar} beat ${beat}`).toEqual(['16', 'r8', '16', 'r16']);
        }
      }
    }
    expect(checked).toBeGreaterThanOrEqual(3);
  });

  // A grouping bracket spans its notes' whole durations, to the end of the last note's value
  // (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets": a bracket covers the full length
  // of the group; from memory). In 4 vs 3 over a 3/4 bar the fourth note lasts to the bar line.
  it('runs each "4 vs 3" line to the bar line that ends its cycle', () => {
    const poly = BUILT_IN_PRESETS.find((p) => p.id === 'four-over-three')!;
    const card = poly.card as {
      meter: { beats: number };
      rules: { kind: string; span?: number }[];
    };
    expect(card.rules.find((r) => r.kind === 'polyrhythm')?.span).toBe(card.meter.beats);
    for (const seed of ['lesson-12', 'cedar-5']) {
      const render = renderDrillSvg(generateDrill(parseRuleCard(poly.card), seed), {
        width: 1000,
      });
      const brackets = [...parse(render.svg).querySelectorAll('.tensile-polyrhythm')];
      expect(brackets.length, seed).toBeGreaterThan(0);
      for (const bracket of brackets) {
        const notes = bracket.getAttribute('data-notes')!.split(' ');
        const bar = Number(notes.at(-1)!.split(':')[0]);
        const box = render.layout.bars.find((b) => b.bar === bar)!;
        const xs = [
          ...bracket
            .querySelector('path')!
            .getAttribute('d')!
            .matchAll(/[ML]([\d.]+) /g),
        ];
        const end = Math.max(...xs.map((m) => Number(m[1])));
        const barLine = box.x + box.width;
        expect(barLine - end, `${seed} bar ${bar}`).toBeGreaterThanOrEqual(0);
        expect(barLine - end, `${seed} bar ${bar}`).toBeLessThan(6);
      }
    }
  });

  it('prints the counts and sticking rows when asked, and leaves them out otherwise', () => {
    expect(doc.querySelectorAll('.tensile-count').length).toBeGreaterThan(0);
    expect(doc.querySelectorAll('.tensile-sticking').length).toBeGreaterThan(0);
    const plain = parse(renderDrillSvg(drill, { width: 1100 }).svg);
    expect(plain.querySelectorAll('.tensile-count, .tensile-sticking').length).toBe(0);
  });

  it('writes the clef on every system and the time signature once, at the start', () => {
    // Clef on every line, time signature only at the start and where the meter changes:
    // E. Gould, "Behind Bars", Faber Music 2011, on clefs and time signatures (from memory).
    const long = generateDrill(
      parseRuleCard({ ...(quintuplets.card as object), bars: 8 }),
      'lesson-12',
    );
    const render = renderDrillSvg(long, { width: 1100, showCounts: true });
    const longDoc = parse(render.svg);
    const openers = new Set(
      render.layout.bars
        .filter((b, i, all) => i === 0 || all[i - 1]!.system !== b.system)
        .map((b) => b.bar),
    );
    expect(openers.size).toBeGreaterThan(1);
    for (const bar of longDoc.querySelectorAll('.tensile-bar')) {
      const number = Number(bar.getAttribute('data-bar'));
      expect(bar.querySelectorAll('.vf-clef').length, `clef in bar ${number}`).toBe(
        openers.has(number) ? 1 : 0,
      );
      expect(bar.querySelectorAll('.vf-timesignature').length, `time in bar ${number}`).toBe(
        number === 1 ? 1 : 0,
      );
    }
  });

  it('counts every slot of every beat, lighter where no hit sounds, under the written notes', () => {
    for (const preset of [quintuplets, presetWhere(subdivisionHas(3))]) {
      const counted = generateDrill(parseRuleCard(preset.card), 'lesson-12');
      const countedDoc = parse(renderDrillSvg(counted, { width: 1100, showCounts: true }).svg);
      let silentSlots = 0;
      for (const bar of counted.bars) {
        const group = countedDoc.querySelector(`.tensile-bar[data-bar="${bar.bar}"]`)!;
        const counts = [...group.querySelectorAll('.tensile-count')];
        expect(counts).toHaveLength(bar.beats.reduce((a, b) => a + b, 0));
        const xs = counts.map((c) => Number(c.getAttribute('x')));
        // In time order along the bar: beat by beat, slot by slot.
        for (let i = 1; i < xs.length; i++) expect(xs[i]!).toBeGreaterThan(xs[i - 1]!);
        for (const count of counts) {
          const beat = Number(count.getAttribute('data-beat'));
          const slot = Number(count.getAttribute('data-slot'));
          const sounds = bar.hits.some((h) => h.beat === beat && h.slot === slot);
          const silent = count.classList.contains('tensile-count-silent');
          expect(silent, `bar ${bar.bar} beat ${beat} slot ${slot}`).toBe(!sounds);
          if (silent) {
            silentSlots++;
            expect(Number(count.getAttribute('opacity'))).toBeLessThan(1);
          } else expect(count.hasAttribute('opacity')).toBe(false);
          const note = group.querySelector(
            `.tensile-note[data-beat="${beat}"][data-slot="${slot}"] .vf-notehead text`,
          );
          if (note)
            expect(
              Math.abs(Number(count.getAttribute('x')) - Number(note.getAttribute('x'))),
            ).toBeLessThan(14);
        }
      }
      // Holes in the pattern exist, so the lighter syllables are really exercised.
      expect(silentSlots, preset.id).toBeGreaterThan(0);
    }
  });
});

/** Every y a path's absolute commands name (M, L, C, Q, S, T pairs; A's end point; V). */
function pathYs(d: string): number[] {
  const ys: number[] = [];
  for (const [, command, args] of d.matchAll(/([A-Za-z])([^A-Za-z]*)/g)) {
    const n = args!.match(/-?[\d.]+(?:e-?\d+)?/g)?.map(Number) ?? [];
    if (command === 'A') for (let i = 6; i < n.length; i += 7) ys.push(n[i]!);
    else if (command === 'V') ys.push(...n);
    else if (command !== 'H' && command !== 'Z')
      for (let i = 1; i < n.length; i += 2) ys.push(n[i]!);
  }
  return ys;
}

describe('marks above the first system', () => {
  const swingCard = {
    meter: { beats: 4, unit: 4 },
    bars: 4,
    subdivision: 4,
    tempo: 92,
    voices: ['kick', 'snare', 'hihat', 'crash'],
    swing: { unit: 8, ratio: 0.6667 },
    density: 0.6,
  };
  const swingDrill = generateDrill(parseRuleCard(swingCard), 'lesson-12');
  const render = renderDrillSvg(swingDrill, { width: 1000, showSticking: true, showCounts: true });
  const swingDoc = parse(render.svg);
  const glyphsOf = (el: Element | null) =>
    [...(el?.querySelectorAll('tspan[font-family="Bravura"]') ?? [])]
      .map((t) => t.textContent)
      .join('');

  it('writes the metronome mark with the beat note, and the swing marking where playback swings', () => {
    const tempo = swingDoc.querySelector('.tensile-marks .tensile-tempo-mark');
    // Bravura's metronome-mark quarter note (SMuFL U+ECA5) and the card's tempo.
    expect(glyphsOf(tempo)).toBe('\uECA5');
    expect(tempo?.textContent?.replace(/\u00a0/g, ' ')).toContain('= 92');
    expect(swingDoc.querySelector('.tensile-swing-words')?.textContent).toBe('Swing');
    // Beamed eighths = quarter and eighth under a "3" (common practice for swung eighths).
    expect(glyphsOf(swingDoc.querySelector('.tensile-swing-mark'))).toBe(
      '\uE1F0\uE1F7\uE1F2\uE1F0\uECA7\uE1FE\uE1FF\uE200',
    );
    expect(swingDoc.querySelector('.tensile-marks')?.getAttribute('aria-label')).toMatch(
      /^Tempo: quarter note = 92\. Swing eighths/,
    );
  });

  it('keeps the marks in a band of their own, clear of everything the first system draws', () => {
    const band = render.layout.bars[0]!.systemTop;
    expect(band).toBeGreaterThan(0);
    const marksBaseline = Number(swingDoc.querySelector('.tensile-marks text')?.getAttribute('y'));
    // Noteheads reach 0.56 staff space under the baseline (Bravura metadata): 24 px glyphs.
    expect(marksBaseline + 0.6 * 6).toBeLessThanOrEqual(band);
    const firstSystem = render.layout.bars.filter((b) => b.system === 0).map((b) => b.bar);
    const groups = firstSystem.map((bar) =>
      swingDoc.querySelector(`.tensile-bar[data-bar="${bar}"]`)!,
    );
    expect(highestOf(groups)).toBeGreaterThanOrEqual(band);
    // The voice key stands at the right of the marks' line (the tempo mark at the left margin),
    // a compact line whose staff fragments end above the first system's band.
    const key = swingDoc.querySelector('.tensile-legend > g[transform]')!;
    const [, kx, ky, scale] = /translate\(([\d.]+) ([\d.]+)\) scale\(([\d.]+)\)/
      .exec(key.getAttribute('transform') ?? '')!
      .map(Number);
    expect(kx).toBeGreaterThan(1000 / 2);
    const tempoX = Number(swingDoc.querySelector('.tensile-marks text')?.getAttribute('x'));
    expect(tempoX).toBeLessThan(1000 / 4);
    for (const path of key.querySelectorAll('path'))
      expect(ky! + scale! * Math.max(...pathYs(path.getAttribute('d') ?? ''))).toBeLessThanOrEqual(
        band,
      );
  });

  /** The highest y any text, rect or path of `groups` reaches. */
  function highestOf(groups: readonly Element[]): number {
    let highest = Infinity;
    for (const group of groups) {
      for (const text of group.querySelectorAll('text')) {
        // A glyph or word reaches at most one em above its baseline.
        const size = text.closest('[font-size]')?.getAttribute('font-size') ?? '10pt';
        const px = size.endsWith('pt') ? (parseFloat(size) * 4) / 3 : parseFloat(size);
        highest = Math.min(highest, Number(text.getAttribute('y')) - px);
      }
      for (const rect of group.querySelectorAll('rect')) {
        highest = Math.min(highest, Number(rect.getAttribute('y')));
      }
      for (const path of group.querySelectorAll('path')) {
        highest = Math.min(highest, ...pathYs(path.getAttribute('d') ?? ''));
      }
    }
    return highest;
  }

  it('moves the swing marking to a line of its own on a page too narrow for one line', () => {
    // At a phone's 390 px the voice key moves above the first system, which leaves the marks
    // the whole line (about 216 px); 230 px is too narrow for them on one line.
    const narrow = renderDrillSvg(swingDrill, { width: 230, showSticking: true, showCounts: true });
    const lines = parse(narrow.svg).querySelectorAll('.tensile-marks text');
    expect(lines).toHaveLength(2);
    expect(lines[1]!.querySelector('.tensile-swing-mark')).not.toBeNull();
    // The systems start under both lines.
    expect(narrow.layout.bars[0]!.systemTop).toBeGreaterThanOrEqual(
      2 * render.layout.bars[0]!.systemTop,
    );
  });

  it('writes no swing marking for a straight drill, and no marks when asked', () => {
    const plainDrill = generateDrill(
      parseRuleCard({ ...swingCard, swing: undefined }),
      'lesson-12',
    );
    const straight = parse(renderDrillSvg(plainDrill).svg);
    expect(straight.querySelector('.tensile-tempo-mark')).not.toBeNull();
    expect(straight.querySelector('.tensile-swing-mark, .tensile-swing-words')).toBeNull();
    const bare = renderDrillSvg(swingDrill, { width: 1000, showMarks: false, showLegend: false });
    expect(parse(bare.svg).querySelector('.tensile-marks')).toBeNull();
    expect(bare.layout.bars[0]!.systemTop).toBe(0);
  });

  it('counts 6/8 in dotted quarters', () => {
    const sixEight = generateDrill(
      parseRuleCard({ ...swingCard, meter: { beats: 6, unit: 8 }, tempo: 120, swing: undefined }),
      'lesson-12',
    );
    const tempo = parse(renderDrillSvg(sixEight).svg).querySelector('.tensile-tempo-mark');
    expect(glyphsOf(tempo)).toBe('\uECA5\uECB7');
    expect(tempo?.textContent?.replace(/\u00a0/g, ' ')).toContain('= 40');
  });
});

describe('renderDrillSvg: grouped eighth meters', () => {
  /** A card with the hi-hat on every eighth, so each group's beam is complete. */
  const eighthsCard = (beats: number, grouping?: number[]) =>
    parseRuleCard({
      meter: { beats, unit: 8, ...(grouping ? { grouping } : {}) },
      subdivision: 1,
      bars: 2,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0] },
      density: 0.3,
    });

  /** Stems under each hands beam of each bar, e.g. `3 3 | 3 3`. */
  function beamShape(svg: string): string {
    const doc = parse(svg);
    return [...doc.querySelectorAll('.tensile-bar')]
      .map((bar) =>
        [...bar.querySelectorAll('[data-voice="hands"] .vf-beam')]
          .map((beam) => beam.querySelectorAll('.vf-stem').length)
          .join(' '),
      )
      .join(' | ');
  }

  // Common practice; E. Gould, "Behind Bars" (Faber Music 2011), beaming in compound time (from
  // memory): eighths beamed by the dotted-quarter beat, not as single flagged eighths.
  it('beams 6/8 and 12/8 eighths in threes, with no flag on any hi-hat eighth', () => {
    for (const [beats, shape] of [
      [6, '3 3 | 3 3'],
      [12, '3 3 3 3 | 3 3 3 3'],
    ] as const) {
      const { svg } = renderDrillSvg(generateDrill(eighthsCard(beats), 'threes'), {
        width: 1100,
      });
      expect(beamShape(svg)).toBe(shape);
      expect(parse(svg).querySelectorAll('[data-voice="hands"] .vf-flag')).toHaveLength(0);
    }
  });

  it('shows 5/8, 7/8 and 15/8 groupings by beaming, and an uneven one over the signature', () => {
    for (const [beats, grouping, shape, label] of [
      [7, undefined, '2 2 3 | 2 2 3', '2+2+3'],
      [7, [3, 2, 2], '3 2 2 | 3 2 2', '3+2+2'],
      [5, undefined, '3 2 | 3 2', '3+2'],
      [15, undefined, '3 3 3 3 3 | 3 3 3 3 3', null],
    ] as const) {
      const drill = generateDrill(eighthsCard(beats, grouping && [...grouping]), 'groups');
      const { svg } = renderDrillSvg(drill, { width: 1100 });
      expect(beamShape(svg)).toBe(shape);
      const doc = parse(svg);
      // The time signature stays the meter; the grouping is written once, over it.
      expect(doc.querySelectorAll('.vf-timesignature')).toHaveLength(1);
      const labels = [...doc.querySelectorAll('.tensile-grouping')].map((t) => t.textContent);
      expect(labels).toEqual(label ? [label] : []);
    }
  });

  // Common practice (an irregular meter is read pulse by pulse): in 7/8 as 2+2+3, counted
  // "1 2, 1 2, 1 2 3", a note either lasts whole eighths from an eighth or stays inside one, so
  // every counted eighth starts with a note or a rest and the beams show 2+2+3.
  it('never lets a note or rest of 7/8 cross an eighth unless it lasts whole eighths', () => {
    const seven = BUILT_IN_PRESETS.find((p) => p.id === 'seven-eight-two-two-three')!;
    let checked = 0;
    for (const seed of ['lesson-12', 'seed-1', '7', 'c']) {
      const doc = parse(renderDrillSvg(generateDrill(parseRuleCard(seven.card), seed)).svg);
      for (const voice of doc.querySelectorAll('.tensile-bar [data-voice]')) {
        for (const event of voice.querySelectorAll('.tensile-note, .tensile-rest')) {
          const written = event.getAttribute('data-duration')!;
          if (written === '1') continue;
          // In sixteenths: 16ths of this drill's two slots per eighth.
          const value = Number(written.replace('d', ''));
          const length = (16 / value) * (written.endsWith('d') ? 1.5 : 1);
          const start =
            (Number(event.getAttribute('data-beat')) - 1) * 2 +
            Number(event.getAttribute('data-slot'));
          const end = start + length;
          const crosses = Math.floor(start / 2) !== Math.floor((end - 1) / 2);
          if (crosses)
            expect(
              [start % 2, end % 2],
              `${seed}: ${written} at beat ${event.getAttribute('data-beat')}`,
            ).toEqual([0, 0]);
          checked++;
        }
      }
    }
    expect(checked).toBeGreaterThan(50);
  });

  it('keeps a cursor box for every beat, even one that a dotted quarter covers', () => {
    const drill = generateDrill(eighthsCard(6), 'boxes');
    const { layout } = renderDrillSvg(drill, { width: 1100 });
    for (const bar of layout.bars) {
      expect(bar.beats.map((b) => b.beat)).toEqual([1, 2, 3, 4, 5, 6]);
      for (let i = 1; i < bar.beats.length; i++)
        expect(bar.beats[i]!.x).toBeGreaterThan(bar.beats[i - 1]!.x);
    }
  });
});

describe('renderDrillSvg: sticking letters', () => {
  const measure = createCanvas(10, 10).getContext('2d');

  /** Clear space between neighbouring letters of each sticking line, with the letters' size. */
  function letterGaps(svg: string): { gap: number; size: number; where: string }[] {
    const doc = parse(svg);
    const gaps: { gap: number; size: number; where: string }[] = [];
    for (const row of doc.querySelectorAll('.tensile-sticking-row')) {
      const size = Number(row.getAttribute('font-size'));
      // The letters' ink as the font draws it (Academico bold, registered by the renderer).
      measure.font = `bold ${size}px Academico`;
      const lines = new Map<string, { left: number; right: number; text: string }[]>();
      for (const span of row.querySelectorAll('tspan')) {
        const text = span.textContent ?? '';
        const m = measure.measureText(text);
        const x = Number(span.getAttribute('x')) - m.width / 2;
        const line = lines.get(span.getAttribute('y')!) ?? [];
        line.push({
          left: x - m.actualBoundingBoxLeft,
          right: x + m.actualBoundingBoxRight,
          text: `${text}@${span.getAttribute('data-beat')}.${span.getAttribute('data-slot')}`,
        });
        lines.set(span.getAttribute('y')!, line);
      }
      for (const line of lines.values()) {
        line.sort((a, b) => a.left - b.left);
        for (let i = 1; i < line.length; i++)
          gaps.push({
            gap: line[i]!.left - line[i - 1]!.right,
            size,
            where: `${line[i - 1]!.text} ${line[i]!.text}`,
          });
      }
    }
    return gaps;
  }

  // Sticking is read letter by letter: two letters need clearly more than a word space (about a
  // quarter of an em; common practice) between them, or "L R" reads as one word "LR". The least
  // gap is set at half the letters' size.
  it('keeps half the letter size between neighbouring letters of 4:3 sticking', () => {
    const poly = BUILT_IN_PRESETS.find((p) => p.id === 'four-over-three')!;
    let checked = 0;
    for (const bars of [4, 16]) {
      for (const seed of ['lesson-12', 'seed-1', '7']) {
        const drill = generateDrill(parseRuleCard({ ...(poly.card as object), bars }), seed);
        for (const width of [1100, 1000, 800, 500, 390]) {
          const { svg } = renderDrillSvg(drill, {
            width,
            showSticking: true,
            showCounts: true,
            showLegend: true,
          });
          const gaps = letterGaps(svg);
          const tight = gaps.filter((g) => g.gap < g.size / 2);
          expect(
            tight.map((g) => `${g.where}: ${g.gap.toFixed(1)}`),
            `${seed} ${bars} bars ${width}`,
          ).toEqual([]);
          checked += gaps.length;
        }
      }
    }
    expect(checked).toBeGreaterThan(100);
  });
});
