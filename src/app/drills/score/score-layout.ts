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
