import type { Drill } from '../../shared/generator/index';
import { renderDrillSvg } from '../notation/render-svg';
import type { PrintAids } from './worksheet-print';

/**
 * Width the notation is engraved at, in VexFlow pixels. Scaled onto a page's ~520 pt text width,
 * a stave space of 10 px prints at about 1.7 mm, a staff about 6.6 mm high, near the rastral
 * sizes used for printed parts (common practice).
 */
export const PRINT_ENGRAVING_WIDTH = 1100;

export interface NotationArt {
  readonly svg: string;
  /** Size of the drawing in its own units; pdfmake scales it to the width it is given. */
  readonly width: number;
  readonly height: number;
}

/** The drill engraved as for the browser, with the aids the teacher chose, in black. */
export function notationArt(drill: Drill, aids: PrintAids): NotationArt {
  const { svg, layout } = renderDrillSvg(drill, {
    width: PRINT_ENGRAVING_WIDTH,
    showSticking: aids.sticking,
    showCounts: aids.counts,
    showLegend: true,
    showMarks: true,
    ink: 'black',
  });
  return { svg, width: layout.width, height: layout.height };
}
