/**
 * Engraving checks made on the drawn SVG of every built-in preset: where rests sit in two-voice
 * writing, which tuplet groups keep their number, how much room a bar gives its slots and how
 * many bars share a system. Glyph boxes are measured from the fonts themselves (@napi-rs/canvas,
 * the faces the renderer registers), not from the renderer's own layout.
 */
import { createCanvas } from '@napi-rs/canvas';
import { JSDOM } from 'jsdom';
import { describe, expect, it } from 'vitest';
import { isHandVoice } from '../../shared/generator/drill';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { PRINT_LAYOUT } from '../../shared/notation/print-layout';
import { SYSTEM_CLASS } from '../../shared/notation/render-vexflow';
import { renderDrillSvg } from './render-svg';

const SEEDS = ['river-3', 'amber-40'];
/** VexFlow's stave space, in pixels; a step is half of it (a line to the next space). */
const SPACE = 10;
const measure = createCanvas(10, 10).getContext('2d');

function parse(svg: string): Document {
  return new JSDOM(svg, { contentType: 'image/svg+xml' }).window.document;
}

/** Each preset's drill at each seed drawn once for the whole file, as a screen draws it. */
const drawn = new Map<string, Document>();
function drawnDoc(id: string, seed: string): Document {
  const key = `${id} ${seed}`;
  let doc = drawn.get(key);
  if (!doc) {
    doc = parse(renderDrillSvg(drillOf(id, seed)).svg);
    drawn.set(key, doc);
  }
  return doc;
}

function drillOf(id: string, seed: string) {
  const preset = BUILT_IN_PRESETS.find((p) => p.id === id);
  if (!preset) throw new Error(`no preset ${id}`);
  return generateDrill(parseRuleCard(preset.card), seed);
}

interface Box {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** The ink box of a `<text>` measured in `font`. */
function textBox(text: Element, font: string): Box {
  measure.font = font;
  const m = measure.measureText(text.textContent ?? '');
  const x = Number(text.getAttribute('x'));
  const y = Number(text.getAttribute('y'));
  return {
    left: x - m.actualBoundingBoxLeft,
    right: x + m.actualBoundingBoxRight,
    top: y - m.actualBoundingBoxAscent,
    bottom: y + m.actualBoundingBoxDescent,
  };
}

/** The ink box of a music glyph drawn as `<text>` (VexFlow sets its size in pt). */
function glyphBox(text: Element): Box {
  const size = text.getAttribute('font-size') ?? '30pt';
  const px = size.endsWith('pt') ? (parseFloat(size) * 4) / 3 : parseFloat(size);
  return textBox(text, `${px}px Bravura`);
}

/** The ink box of the renderer's italic words ("sim.", the late-backbeat hint). */
function italicBox(text: Element): Box {
  return textBox(text, `italic ${text.getAttribute('font-size')}px Academico`);
}

const overlaps = (a: Box, b: Box) =>
  a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

/** y of the middle line of a drawn bar's stave. */
function middleLine(bar: Element): number {
  const ys = [...bar.querySelectorAll(':scope > .vf-stave path')].map((p) =>
    Number(/M[\d.]+ ([\d.]+)/.exec(p.getAttribute('d') ?? '')?.[1]),
  );
  expect(ys).toHaveLength(5);
  return (Math.min(...ys) + Math.max(...ys)) / 2;
}

describe('rests in two voices on one staff', () => {
  // E. Gould, "Behind Bars", Faber Music 2011, ch. "Rests" (two parts sharing a stave; from
  // memory): the upper part's rests stand high, the lower part's low, each clear of the other
  // part's notes; a rest moved from its place moves by whole spaces, so it keeps its relation to
  // the lines.
  it('keeps each voice’s rests in its own half of the staff, by whole spaces, clear of the other voice', () => {
    let rests = 0;
    const faults: string[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      for (const seed of SEEDS) {
        const doc = drawnDoc(preset.id, seed);
        for (const bar of doc.querySelectorAll('.tensile-bar')) {
          const middle = middleLine(bar);
          const where = `${preset.id} ${seed} bar ${bar.getAttribute('data-bar')}`;
          const heads = (voice: string) =>
            [
              ...bar.querySelectorAll(`[data-voice="${voice}"] .tensile-note .vf-notehead text`),
            ].map(glyphBox);
          for (const [voice, other] of [
            ['hands', 'feet'],
            ['feet', 'hands'],
          ] as const) {
            const others = heads(other);
            for (const rest of bar.querySelectorAll(`[data-voice="${voice}"] .tensile-rest`)) {
              const glyph = rest.querySelector('.vf-notehead text')!;
              const box = glyphBox(glyph);
              const at = `${where} ${voice} rest beat ${rest.getAttribute('data-beat')}.${rest.getAttribute('data-slot')}`;
              rests++;
              if (others.some((head) => overlaps(box, head))) faults.push(`${at}: on a note`);
              // One pixel of slack for the glyphs' own rounding.
              if (voice === 'hands' && box.bottom > middle + 1) faults.push(`${at}: low`);
              if (voice === 'feet' && box.top < middle - 1) faults.push(`${at}: high`);
              if (rest.getAttribute('data-duration') === '1') continue;
              const offset = (middle - Number(glyph.getAttribute('y'))) / SPACE;
              if (Math.abs(offset - Math.round(offset)) > 0.1)
                faults.push(`${at}: ${offset.toFixed(2)} spaces from the middle line`);
            }
          }
        }
      }
    }
    expect(faults).toEqual([]);
    expect(rests).toBeGreaterThan(300);
  });

  // A whole rest hangs from a line, a half rest sits on one (common practice); in two voices the
  // upper part's whole-bar rest hangs from the fourth line, the lower part's lower, from the
  // second, so neither reads as the other's half rest.
  it("hangs a whole-bar rest from a line: the hands' from the fourth, the feet's from the second", () => {
    const hanging: Record<string, number> = { hands: 0, feet: 0 };
    // The presets keep the hands busy: a kick groove with a silent snare (invented) has them rest.
    const quietHands = generateDrill(
      parseRuleCard({
        meter: { beats: 4, unit: 4 },
        bars: 2,
        subdivision: 4,
        tempo: 90,
        voices: ['kick', 'snare'],
        density: 0,
        rules: [{ kind: 'backbeat', voice: 'kick', beats: [1, 3] }],
      }),
      'still-1',
    );
    const docs = [
      { doc: parse(renderDrillSvg(quietHands).svg), where: 'quiet hands' },
      ...BUILT_IN_PRESETS.flatMap((preset) =>
        [...SEEDS, 'cedar-5'].map((seed) => ({
          doc: drawnDoc(preset.id, seed),
          where: `${preset.id} ${seed}`,
        })),
      ),
    ];
    for (const { doc, where: drawn } of docs) {
      for (const bar of doc.querySelectorAll('.tensile-bar')) {
        const lines = [...bar.querySelectorAll(':scope > .vf-stave path')]
          .map((p) => Number(/M[\d.]+ ([\d.]+)/.exec(p.getAttribute('d') ?? '')?.[1]))
          .sort((a, b) => b - a);
        for (const voice of ['hands', 'feet'] as const)
          for (const rest of bar.querySelectorAll(
            `[data-voice="${voice}"] .tensile-rest[data-duration="1"]`,
          )) {
            const box = glyphBox(rest.querySelector('.vf-notehead text')!);
            const line = lines[voice === 'hands' ? 3 : 1]!;
            const where = `${drawn} bar ${bar.getAttribute('data-bar')} ${voice}`;
            expect(Math.abs(box.top - line), where).toBeLessThanOrEqual(1);
            hanging[voice]!++;
          }
      }
    }
    expect(hanging['feet']).toBeGreaterThan(0);
    expect(hanging['hands']).toBeGreaterThan(0);
  });
});

describe('triplets in a shuffle', () => {
  // Common practice: a shuffle part written in triplets marks every group whose rhythm a beam
  // does not show: a quarter and an eighth (or a rest and an eighth) without its "3" reads as
  // straight eighths. E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets" (from memory):
  // numbers are left out only where the rhythm stays unambiguous.
  it('writes a "3" over every beat where a voice plays off the beat', () => {
    let groups = 0;
    const missing: string[] = [];
    for (const seed of SEEDS) {
      const drill = drillOf('shuffle-kick-upbeats', seed);
      const doc = drawnDoc('shuffle-kick-upbeats', seed);
      for (const bar of drill.bars) {
        const drawnBar = doc.querySelector(`.tensile-bar[data-bar="${bar.bar}"]`)!;
        bar.beats.forEach((slots, i) => {
          expect(slots).toBe(3);
          for (const voice of ['hands', 'feet'] as const) {
            const offBeat = bar.hits.some(
              (h) =>
                h.beat === i + 1 && h.slot !== 0 && isHandVoice(h.voice) === (voice === 'hands'),
            );
            if (!offBeat) continue;
            groups++;
            const number = drawnBar.querySelector(
              `[data-voice="${voice}"] [data-tuplet="3"][data-beat="${i + 1}"] .vf-tuplet text`,
            );
            // SMuFL's tuplet digits start at U+E880.
            if (number?.textContent !== String.fromCodePoint(0xe883))
              missing.push(`${seed} bar ${bar.bar} beat ${i + 1} ${voice}`);
          }
        });
      }
      expect(doc.querySelectorAll('.tensile-simile')).toHaveLength(0);
    }
    expect(missing).toEqual([]);
    expect(groups).toBeGreaterThan(40);
  });
});

describe("room for a shuffle's triplet brackets", () => {
  // A rest and a quarter under a "3" ("r8 c4") get no narrower a bracket than the beat's other
  // groups, and every bracket ends before the next beat's first note or rest: the number sits in
  // a clear break of a bracket that spans its group (E. Gould, "Behind Bars", Faber Music 2011,
  // ch. "Tuplets"; from memory); like values, like room (common practice). Seed cedar-5 has the
  // figure in bar 1's feet.
  it("keeps every bracket arm at least 3/4 of the drill's usual one, clear of the next beat", () => {
    const faults: string[] = [];
    let brackets = 0;
    for (const seed of [...SEEDS, 'cedar-5']) {
      const doc = parse(renderDrillSvg(drillOf('shuffle-kick-upbeats', seed)).svg);
      const arms: { width: number; where: string }[] = [];
      for (const bar of doc.querySelectorAll('.tensile-bar')) {
        const barNumber = bar.getAttribute('data-bar');
        for (const group of bar.querySelectorAll('.tensile-tuplet')) {
          const rects = [...group.querySelectorAll('.vf-tuplet rect')];
          const hooks = rects.filter((r) => r.getAttribute('width') === '1');
          if (hooks.length === 0) continue; // a number alone, over a beam
          brackets++;
          const beat = Number(group.getAttribute('data-beat'));
          const where = `${seed} bar ${barNumber} beat ${beat} ${group.parentElement?.getAttribute('data-voice')}`;
          for (const r of rects)
            if (r.getAttribute('height') === '1')
              arms.push({ width: Number(r.getAttribute('width')), where });
          const right = Math.max(...hooks.map((h) => Number(h.getAttribute('x'))));
          const next = [
            ...bar.querySelectorAll(
              `.tensile-note[data-beat="${beat + 1}"] text, .tensile-rest[data-beat="${beat + 1}"] text`,
            ),
          ].map((t) => glyphBox(t).left);
          if (next.length > 0 && right > Math.min(...next) - 3)
            faults.push(`${where}: bracket reaches the next beat`);
        }
      }
      const usual = [...arms].sort((a, b) => a.width - b.width)[Math.floor(arms.length / 2)]!.width;
      for (const arm of arms)
        if (arm.width < 0.75 * usual) faults.push(`${arm.where}: arm ${arm.width} of ${usual}`);
    }
    expect(faults).toEqual([]);
    expect(brackets).toBeGreaterThan(60);
  });
});

describe('a note the loop carries into bar 1', () => {
  // late-backbeat-over-the-bar-line, in eighths, moves the snare of beat 4 three eighths late:
  // past the bar line, onto the "&" of 1 of the next bar, so bar 1 opens with the last bar's
  // late 4 (worked by hand from the card). A small word over it says so, clear of the letters and the notes.
  it('names the late 4 over bar 1 alone, clear of the sticking and the music', () => {
    for (const seed of SEEDS) {
      const drill = drillOf('late-backbeat-over-the-bar-line', seed);
      const doc = drawnDoc('late-backbeat-over-the-bar-line', seed);
      const hints = [...doc.querySelectorAll('.tensile-carried')];
      expect(hints).toHaveLength(1);
      const hint = hints[0]!;
      const bar = hint.closest('.tensile-bar')!;
      expect(bar.getAttribute('data-bar')).toBe('1');
      expect([hint.getAttribute('data-beat'), hint.getAttribute('data-slot')]).toEqual(['1', '1']);
      expect(hint.textContent).toBe(`late 4, from bar ${drill.bars.length}`);
      expect(
        bar.querySelector('.tensile-note[data-beat="1"][data-slot="1"][data-instruments~="snare"]'),
      ).not.toBeNull();
      const box = italicBox(hint);
      expect(box.top).toBeGreaterThan(0);
      const letters = rowBoxes(bar, '.tensile-sticking-row').flat();
      expect(letters.length).toBeGreaterThan(0);
      for (const other of [
        ...letters,
        ...[...bar.querySelectorAll('.vf-stavenote text')].map(glyphBox),
      ])
        expect(overlaps(box, other), JSON.stringify(other)).toBe(false);
    }
  });

  it('writes "sim." on its bracket number\'s line, below the sticking and clear of the notes', () => {
    // "sim." after the first marked group stands with the group's number, the words that go
    // with it, not with the sticking above (common practice).
    let seen = 0;
    // Quintuplets with the hi-hat on every value (invented), so the hands' groups all count
    // themselves and "sim." follows the first.
    const card = parseRuleCard({
      meter: { beats: 4, unit: 4 },
      bars: 4,
      subdivision: 5,
      tempo: 60,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 1, 2, 3, 4] },
      density: 0.2,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    });
    // And the quintuplet presets at seeds whose later groups all count themselves (after one
    // with a rest, whose bracket "sim." must clear).
    const drawings = [
      ...SEEDS.map((seed) => ({ drill: generateDrill(card, seed), where: `all-five ${seed}` })),
      ...['quintuplets-hihat-1-3-4', 'quintuplets-hihat-1-3-5'].flatMap((id) =>
        ['s17', 's25'].map((seed) => ({ drill: drillOf(id, seed), where: `${id} ${seed}` })),
      ),
    ];
    let bracketed = 0;
    for (const { drill, where: drawn } of drawings) {
      const doc = parse(renderDrillSvg(drill).svg);
      for (const simile of doc.querySelectorAll('[data-voice="hands"] .tensile-simile')) {
        seen++;
        const where = drawn;
        const number = simile.closest('.tensile-tuplet')?.querySelector('.vf-tuplet text');
        expect(number, where).toBeTruthy();
        const y = Number(simile.getAttribute('y'));
        expect(Math.abs(y - Number(number!.getAttribute('y'))), where).toBeLessThanOrEqual(3);
        const box = italicBox(simile);
        const bar = simile.closest('.tensile-bar')!;
        const letters = rowBoxes(bar, '.tensile-sticking-row').flat();
        expect(letters.length, where).toBeGreaterThan(0);
        for (const letter of letters) expect(box.top, where).toBeGreaterThan(letter.bottom);
        for (const glyph of [...bar.querySelectorAll('.vf-stavenote text')].map(glyphBox))
          expect(overlaps(box, glyph), `${where} ${JSON.stringify(glyph)}`).toBe(false);
        const hooks = [...simile.closest('.tensile-tuplet')!.querySelectorAll('.vf-tuplet rect')];
        if (hooks.length > 0) bracketed++;
        for (const hook of hooks)
          expect(box.left, where).toBeGreaterThan(
            Number(hook.getAttribute('x')) + Number(hook.getAttribute('width')),
          );
      }
    }
    expect(seen).toBeGreaterThan(0);
    expect(bracketed).toBeGreaterThan(0);
  });

  it('writes nothing where a backbeat is moved early across the bar line', () => {
    // shuffle-kick-upbeats plays the kick one triplet before 1: the last bar leads into the loop.
    for (const seed of SEEDS)
      expect(
        drawnDoc('shuffle-kick-upbeats', seed).querySelectorAll('.tensile-carried'),
      ).toHaveLength(0);
  });
});

/** Ink boxes of the words in each row of `selector` (sticking or counting), by line. */
function rowBoxes(bar: Element, selector: string): (Box & { what: string })[][] {
  const lines: (Box & { what: string })[][] = [];
  for (const row of bar.querySelectorAll(selector)) {
    const size = Number(row.getAttribute('font-size'));
    const byLine = new Map<string, (Box & { what: string })[]>();
    for (const span of row.querySelectorAll('tspan')) {
      const text = span.textContent ?? '';
      const bold = (span.getAttribute('font-weight') ?? row.getAttribute('font-weight')) === 'bold';
      measure.font = `${bold ? 'bold ' : ''}${size}px Academico`;
      const m = measure.measureText(text);
      // Anchored at the middle: the word starts half its advance to the left.
      const start = Number(span.getAttribute('x')) - m.width / 2;
      const y = Number(span.getAttribute('y'));
      const line = byLine.get(String(y)) ?? [];
      line.push({
        left: start - m.actualBoundingBoxLeft,
        right: start + m.actualBoundingBoxRight,
        top: y - m.actualBoundingBoxAscent,
        bottom: y + m.actualBoundingBoxDescent,
        what: `${text}@${span.getAttribute('data-beat')}.${span.getAttribute('data-slot')}`,
      });
      byLine.set(String(y), line);
    }
    lines.push(...byLine.values());
  }
  return lines;
}

describe('room in every bar', () => {
  // Counting syllables at 13 px: one slot's syllable needs its own width (up to 0.62 em) and a
  // clear gap before the next, so no slot gets under 1.5 em, 19.5 px, on a screen (the stated
  // minimum; common practice: each syllable read as a word of its own).
  const LEAST_SLOT = 19.5;

  it('keeps every slot at least 1.5 em wide, and no two letters, syllables or noteheads of a voice touching', () => {
    const faults: string[] = [];
    let bars = 0;
    for (const preset of BUILT_IN_PRESETS) {
      for (const seed of SEEDS) {
        const doc = drawnDoc(preset.id, seed);
        for (const bar of doc.querySelectorAll('.tensile-bar')) {
          bars++;
          const where = `${preset.id} ${seed} bar ${bar.getAttribute('data-bar')}`;
          const counts = [...bar.querySelectorAll('.tensile-count')].map((c) =>
            Number(c.getAttribute('x')),
          );
          for (let i = 1; i < counts.length; i++)
            if (counts[i]! - counts[i - 1]! < LEAST_SLOT)
              faults.push(`${where}: slot ${i} ${(counts[i]! - counts[i - 1]!).toFixed(1)} px`);
          for (const line of [
            ...rowBoxes(bar, '.tensile-sticking-row'),
            ...rowBoxes(bar, '.tensile-count-row'),
          ]) {
            line.sort((a, b) => a.left - b.left);
            for (let i = 1; i < line.length; i++)
              if (line[i]!.left < line[i - 1]!.right)
                faults.push(`${where}: ${line[i - 1]!.what} touches ${line[i]!.what}`);
          }
          for (const voice of ['hands', 'feet']) {
            const events = [...bar.querySelectorAll(`[data-voice="${voice}"] .tensile-note`)].map(
              (note) => ({
                at: `${note.getAttribute('data-beat')}.${note.getAttribute('data-slot')}`,
                heads: [...note.querySelectorAll('.vf-notehead text')].map(glyphBox),
              }),
            );
            for (const [i, a] of events.entries())
              for (const b of events.slice(i + 1))
                if (a.heads.some((h) => b.heads.some((k) => overlaps(h, k))))
                  faults.push(`${where} ${voice}: heads at ${a.at} and ${b.at} touch`);
          }
        }
      }
    }
    expect(faults).toEqual([]);
    expect(bars).toBeGreaterThan(100);
  });
});

describe('bars to a system by their content', () => {
  const systemSizes = (bars: readonly { system: number }[]) => {
    const sizes: number[] = [];
    for (const bar of bars) sizes[bar.system] = (sizes[bar.system] ?? 0) + 1;
    return sizes;
  };

  // A 12/8 shuffle bar holds twelve eighths, no more notes than a 4/4 bar of triplets: it takes
  // half a screen's line, and on paper (a part's staff, 7–7.5 mm) three or more share a system,
  // as 4/4 bars of eighths do (common practice: bars per system follow their content).
  it('sets 12/8 shuffle bars two or more to a screen line and three or more to a printed one', () => {
    for (const seed of SEEDS) {
      const doc = drawnDoc('twelve-eight-shuffle', seed);
      const screen = [...doc.querySelectorAll(`.${SYSTEM_CLASS}`)].map(
        (system) => system.querySelectorAll('.tensile-bar').length,
      );
      expect(screen.length, seed).toBeGreaterThan(0);
      expect(Math.min(...screen), `${seed} screen`).toBeGreaterThanOrEqual(2);
      const preset = BUILT_IN_PRESETS.find((p) => p.id === 'twelve-eight-shuffle')!;
      const long = generateDrill(parseRuleCard({ ...(preset.card as object), bars: 16 }), seed);
      const paper = renderDrillSvg(long, {
        ...PRINT_LAYOUT,
        showSticking: true,
        showCounts: true,
      }).layout;
      expect(Math.max(...systemSizes(paper.bars)), `${seed} paper`).toBeGreaterThanOrEqual(3);
    }
  });
});
