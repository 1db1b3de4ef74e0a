import type { BarBox, NotationLayout } from '../../../../shared/notation/render-vexflow';

/** Where the score's bars and beats landed, without the SVG element itself. */
export type ScoreLayout = Omit<NotationLayout, 'svg'>;

/** A bar and beat on the score, counted from 1 as a drummer counts. */
export interface ScorePosition {
  readonly bar: number;
  readonly beat: number;
}

/** The box to highlight for a position, or null when it is not on the score. */
export function cursorBox(
  layout: ScoreLayout,
  position: ScorePosition | null,
): { x: number; y: number; width: number; height: number } | null {
  if (!position) return null;
  const bar = layout.bars.find((b) => b.bar === position.bar);
  const beat = bar?.beats.find((b) => b.beat === position.beat);
  if (!bar || !beat) return null;
  const top = bar.topLineY - 60;
  return { x: beat.x, y: top, width: beat.width, height: bar.bottomLineY + 60 - top };
}

/** The next position when stepping `by` beats, wrapping around the drill (drills are loops). */
export function stepPosition(
  bars: readonly Pick<BarBox, 'bar' | 'beats'>[],
  from: ScorePosition | null,
  by: number,
): ScorePosition | null {
  const all = bars.flatMap((bar) => bar.beats.map((beat) => ({ bar: bar.bar, beat: beat.beat })));
  if (all.length === 0) return null;
  const index = from ? all.findIndex((p) => p.bar === from.bar && p.beat === from.beat) : -1;
  const start = index < 0 ? (by > 0 ? -1 : 0) : index;
  return all[(((start + by) % all.length) + all.length) % all.length] ?? null;
}

/** Room kept right of the last bar line, matching the engraver's left margin. */
const RIGHT_MARGIN = 12;

/**
 * How to fit an engraving into `width`. A bar can be wider than a line (a dense bar beside the
 * voice key on a tablet); rather than cut it off at the edge, the whole score is drawn at its
 * full width and scaled down to fit, but never below `minScale` (below that it scrolls instead,
 * as small notes stop being readable from a music stand).
 */
export function fitToWidth(
  layout: { readonly bars: readonly Pick<BarBox, 'x' | 'width'>[] },
  width: number,
  minScale = 0.75,
): { readonly contentWidth: number; readonly scale: number } {
  const right = Math.max(0, ...layout.bars.map((bar) => bar.x + bar.width)) + RIGHT_MARGIN;
  const contentWidth = Math.max(width, Math.ceil(right));
  return { contentWidth, scale: Math.max(minScale, width / contentWidth) };
}

/**
 * The beat under a point of the engraving (a click or tap), or null outside every bar. The clef
 * and time signature at a system's start belong to its first beat.
 */
export function positionAtPoint(
  layout: {
    readonly bars: readonly Pick<
      BarBox,
      'bar' | 'beats' | 'x' | 'width' | 'systemTop' | 'systemBottom'
    >[];
  },
  x: number,
  y: number,
): ScorePosition | null {
  const bar = layout.bars.find(
    (b) => y >= b.systemTop && y < b.systemBottom && x >= b.x && x < b.x + b.width,
  );
  const beats = bar?.beats ?? [];
  if (!bar || beats.length === 0) return null;
  const hit = beats.find((beat) => x >= beat.x && x < beat.x + beat.width);
  const beat = hit ?? (x < (beats[0]?.x ?? 0) ? beats[0] : beats[beats.length - 1]);
  return beat ? { bar: bar.bar, beat: beat.beat } : null;
}

/** One system's horizontal strip of the engraving, with the room under it. */
export interface SystemBand {
  readonly system: number;
  readonly top: number;
  readonly height: number;
}

/**
 * The engraving cut into one strip per system, top to bottom without gaps (the first strip
 * starts at 0 with the marks above the first system, the last ends at the drawing's foot), so
 * stacked they rebuild the page, and print can break between strips but never through one.
 */
export function systemBands(layout: {
  readonly height: number;
  readonly bars: readonly Pick<BarBox, 'system' | 'systemTop'>[];
}): SystemBand[] {
  const tops = new Map<number, number>();
  for (const bar of layout.bars) {
    tops.set(bar.system, Math.min(tops.get(bar.system) ?? Infinity, bar.systemTop));
  }
  const systems = [...tops.keys()].sort((a, b) => a - b);
  return systems.map((system, i) => {
    const top = i === 0 ? 0 : (tops.get(system) ?? 0);
    const next = systems[i + 1];
    const bottom = next === undefined ? layout.height : (tops.get(next) ?? layout.height);
    return { system, top, height: Math.max(0, bottom - top) };
  });
}
