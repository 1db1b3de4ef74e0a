/**
 * Reads an engraved score's geometry in the page, as Chromium laid it out: ink boxes of glyphs
 * and words (measured with the page's own fonts through a canvas, since an SVG text's bounding
 * box is its font's full line height, not its ink), bounding boxes of stems, beams and brackets,
 * and every written note and rest with its beat, slot and value. The engraving rules are then
 * checked on these numbers in Node.
 */
import type { Page } from 'playwright-core';

export interface Box {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

export interface WrittenEvent {
  readonly kind: 'note' | 'rest';
  readonly beat: number;
  readonly slot: number;
  /** "16", "8d", "1" … as `data-duration` writes it. */
  readonly duration: string;
  /**
   * Ink of the notehead(s) or the rest glyph; null for a rest VexFlow leaves undrawn because the
   * other voice rests there for the same value (one rest then stands for both voices).
   */
  readonly box: Box | null;
}

export interface LayerGeometry {
  readonly events: readonly WrittenEvent[];
  /** Horizontal extent of each beam group (its stems and lines). */
  readonly beams: readonly { readonly left: number; readonly right: number }[];
  /** Shown tuplet brackets, with the top and bottom of their ink (bracket and number). */
  readonly tuplets: readonly {
    readonly n: number;
    readonly beat: number;
    readonly top: number;
    readonly bottom: number;
  }[];
}

export interface BarGeometry {
  readonly bar: number;
  readonly left: number;
  readonly right: number;
  readonly topLineY: number;
  readonly layers: Readonly<Record<'hands' | 'feet', LayerGeometry>>;
}

export interface ScoreGeometry {
  readonly accents: readonly Box[];
  /** Stems (in notes and in beams) and beam lines. */
  readonly stems: readonly Box[];
  readonly beamLines: readonly Box[];
  /** Tuplet brackets with their numbers. */
  readonly tupletBoxes: readonly Box[];
  readonly sticking: readonly (Box & { readonly text: string })[];
  /** Every counting syllable, sounding or silent, with its font size in pixels. */
  readonly counts: readonly (Box & {
    readonly text: string;
    readonly size: number;
    readonly silent: boolean;
    /** The slot the syllable counts. */
    readonly bar: number;
    readonly beat: number;
    readonly slot: number;
  })[];
  /** The voice key, if drawn: its box and whether it carries staff lines or a clef. */
  readonly legend: (Box & { readonly heading: string; readonly staffLines: number }) | null;
  readonly bars: readonly BarGeometry[];
  readonly polyrhythms: readonly (Box & { readonly label: string; readonly notes: string })[];
  readonly title: (Box & { readonly text: string }) | null;
  readonly tempo: (Box & { readonly text: string }) | null;
  readonly tensionMarks: readonly {
    readonly bar: number;
    readonly beat: number;
    readonly slot: number;
  }[];
  readonly tensionLegend: boolean;
  readonly simile: number;
  /** Ink of each "sim.". */
  readonly simileBoxes: readonly (Box & { readonly text: string })[];
  readonly shownTuplets: number;
  /** Width of the drawing (its viewBox), which a bar too wide for a phone's line widens. */
  readonly width: number;
}

/** The geometry of the score's SVG (the first `svg.tensile-notation` under `scope`). */
export async function readScore(page: Page, scope = 'body'): Promise<ScoreGeometry> {
  return page
    .locator(`${scope} svg.tensile-notation`)
    .first()
    .evaluate((svg) => {
      const measure = document.createElement('canvas').getContext('2d')!;
      const union = (boxes: Box[]): Box =>
        boxes.reduce((a, b) => ({
          left: Math.min(a.left, b.left),
          right: Math.max(a.right, b.right),
          top: Math.min(a.top, b.top),
          bottom: Math.max(a.bottom, b.bottom),
        }));
      const bbox = (el: Element): Box => {
        const b = (el as SVGGraphicsElement).getBBox();
        return { left: b.x, right: b.x + b.width, top: b.y, bottom: b.y + b.height };
      };
      /** Ink of a `<text>` (no tspans): the font's glyph outlines, measured with the page's fonts. */
      const ink = (text: Element): Box => {
        const style = getComputedStyle(text);
        measure.font = `${style.fontStyle} ${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
        const m = measure.measureText(text.textContent ?? '');
        const x = Number(text.getAttribute('x'));
        const y = Number(text.getAttribute('y'));
        const anchor = style.textAnchor;
        const start = anchor === 'middle' ? x - m.width / 2 : anchor === 'end' ? x - m.width : x;
        return {
          left: start - m.actualBoundingBoxLeft,
          right: start + m.actualBoundingBoxRight,
          top: y - m.actualBoundingBoxAscent,
          bottom: y + m.actualBoundingBoxDescent,
        };
      };
      const texts = (selector: string) =>
        [...svg.querySelectorAll(selector)].map((t) => ({ ...ink(t), text: t.textContent ?? '' }));
      const accents = [...svg.querySelectorAll('text')]
        .filter((t) => t.textContent === '\uE4A0' || t.textContent === '\uE4A1')
        .map(ink);
      const stems = [...svg.querySelectorAll('.vf-stem path, .vf-stem')]
        .filter((el) => el.tagName === 'path')
        .map(bbox);
      const beamLines = [...svg.querySelectorAll('.vf-beam > path')].map(bbox);
      const bars = [...svg.querySelectorAll('.tensile-bar')].map((bar) => {
        const lines = [...bar.querySelectorAll(':scope > .vf-stave path')].map(bbox);
        const layer = (name: string) => {
          const group = bar.querySelector(`[data-voice="${name}"]`);
          const events = group
            ? [...group.querySelectorAll('.tensile-note, .tensile-rest')].map((el) => {
                // A head's glyph comes first in its group; its accent or parentheses follow it.
                const glyphs = [...el.querySelectorAll('.vf-notehead > text:first-child')];
                return {
                  kind: el.classList.contains('tensile-rest') ? 'rest' : 'note',
                  beat: Number(el.getAttribute('data-beat')),
                  slot: Number(el.getAttribute('data-slot')),
                  duration: el.getAttribute('data-duration') ?? '',
                  box: glyphs.length > 0 ? union(glyphs.map(ink)) : null,
                } as const;
              })
            : [];
          const beams = group
            ? [...group.querySelectorAll('.vf-beam')].map((b) => {
                const box = bbox(b);
                return { left: box.left, right: box.right };
              })
            : [];
          const tuplets = group
            ? [...group.querySelectorAll('[data-tuplet]')].map((t) => ({
                n: Number(t.getAttribute('data-tuplet')),
                beat: Number(t.getAttribute('data-beat')),
                top: bbox(t).top,
                bottom: bbox(t).bottom,
              }))
            : [];
          return { events, beams, tuplets };
        };
        const stave = union(lines);
        return {
          bar: Number(bar.getAttribute('data-bar')),
          left: stave.left,
          right: stave.right,
          topLineY: stave.top,
          layers: { hands: layer('hands'), feet: layer('feet') },
        };
      });
      const polyrhythms = [...svg.querySelectorAll('.tensile-polyrhythm')].map((g) => ({
        ...bbox(g.querySelector('path')!),
        label: g.getAttribute('data-label') ?? '',
        notes: g.getAttribute('data-notes') ?? '',
      }));
      const title = texts('.tensile-title')[0] ?? null;
      const tempoEl = svg.querySelector('.tensile-tempo-mark');
      const tempo = tempoEl ? { ...bbox(tempoEl), text: tempoEl.textContent ?? '' } : null;
      const tensionMarks = [...svg.querySelectorAll('.tensile-tension-mark')].map((m) => ({
        bar: Number(m.getAttribute('data-bar')),
        beat: Number(m.getAttribute('data-beat')),
        slot: Number(m.getAttribute('data-slot')),
      }));
      return {
        width: (svg as SVGSVGElement).viewBox.baseVal.width,
        accents,
        stems,
        beamLines,
        tupletBoxes: [...svg.querySelectorAll('[data-tuplet]')].map(bbox),
        sticking: texts('.tensile-sticking'),
        counts: [...svg.querySelectorAll('.tensile-count')].map((t) => ({
          ...ink(t),
          text: t.textContent ?? '',
          size: parseFloat(getComputedStyle(t).fontSize),
          silent: t.classList.contains('tensile-count-silent'),
          bar: Number(t.closest('.tensile-bar')?.getAttribute('data-bar')),
          beat: Number(t.getAttribute('data-beat')),
          slot: Number(t.getAttribute('data-slot')),
        })),
        legend: (() => {
          const key = svg.querySelector('.tensile-legend');
          if (!key) return null;
          const heading = key.querySelector('.tensile-legend-heading');
          // Long horizontal strokes: the lines of a staff (a bar's look).
          const staffLines = [...key.querySelectorAll('path, line, rect')]
            .map(bbox)
            .filter((b) => b.bottom - b.top < 2 && b.right - b.left > 40).length;
          return { ...bbox(key), heading: heading?.textContent ?? '', staffLines };
        })(),
        bars,
        polyrhythms,
        title,
        tempo,
        tensionMarks,
        tensionLegend: svg.querySelector('.tensile-tension-legend') !== null,
        simile: svg.querySelectorAll('.tensile-simile').length,
        simileBoxes: texts('.tensile-simile'),
        shownTuplets: svg.querySelectorAll('[data-tuplet]').length,
      };
    });
}

/** Whether two boxes share any area (touching edges do not count). */
export function overlaps(a: Box, b: Box): boolean {
  return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/** Every pair of boxes that overlap, as "text@x / text@x" for a readable failure. */
export function collisions(boxes: readonly (Box & { readonly text: string })[]): string[] {
  const found: string[] = [];
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i]!;
      const b = boxes[j]!;
      if (overlaps(a, b))
        found.push(
          `${a.text}@${Math.round(a.left)},${Math.round(a.top)} / ${b.text}@${Math.round(b.left)},${Math.round(b.top)}`,
        );
    }
  }
  return found;
}

/**
 * Neighbours on one text row (same baseline) closer than `gap` pixels, as "a|b@x" for a readable
 * failure: touching ink ("&a3") is as hard to read as overlapping ink.
 */
export function crowded(
  boxes: readonly (Box & { readonly text: string })[],
  gap: number,
): string[] {
  const rows = new Map<number, (Box & { readonly text: string })[]>();
  for (const box of boxes) {
    const key = Math.round(box.bottom / 8);
    rows.set(key, [...(rows.get(key) ?? []), box]);
  }
  const found: string[] = [];
  for (const row of rows.values()) {
    const sorted = [...row].sort((a, b) => a.left - b.left);
    for (let i = 1; i < sorted.length; i++) {
      const a = sorted[i - 1]!;
      const b = sorted[i]!;
      if (b.left - a.right < gap) found.push(`${a.text}|${b.text}@${Math.round(a.right)}`);
    }
  }
  return found;
}
