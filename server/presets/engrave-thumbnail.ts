import type { Drill } from '../../shared/generator/index';

/** How many bars a thumbnail shows. */
export const THUMBNAIL_BARS = 2;

/**
 * Engraves with the server's VexFlow renderer, loaded on first use (VexFlow and the font canvas
 * are only needed once a thumbnail is missing from the cache), then outlines the glyphs so the
 * SVG shows as an `<img>` without the music font. Runs in the thumbnail worker thread.
 */
export async function engraveInProcess(drill: Drill): Promise<string> {
  const [{ renderDrillSvg }, { outlineText }] = await Promise.all([
    import('../notation/render-svg'),
    import('./outline-text'),
  ]);
  const { svg } = renderDrillSvg(drill, {
    width: 800,
    showSticking: false,
    showCounts: false,
    showLegend: false,
    showMarks: false,
    maxBarsPerSystem: THUMBNAIL_BARS,
  });
  return outlineText(svg);
}
