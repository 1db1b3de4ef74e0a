import type { Drill } from '../../shared/generator/index';

/** Drawing units of the plot (pdfmake scales the SVG to the width it is given). */
export const PLOT_WIDTH = 500;
export const PLOT_HEIGHT = 48;
const LEFT = 58;
const TOP = 6;
const BOTTOM = 14;

/** The card's target tension for a bar (its curve repeats over the bars), if it sets one. */
function targetOf(drill: Drill, bar: number): number | null {
  const rule = drill.card.rules.find((r) => r.kind === 'tension');
  if (!rule || rule.kind !== 'tension' || rule.curve.length === 0) return null;
  return rule.curve[(bar - 1) % rule.curve.length] ?? null;
}

const clamp = (v: number) => Math.min(1, Math.max(0, v));
const fixed = (v: number) => Number(v.toFixed(2));

/**
 * A small vector plot of the drill's tension: one column per bar, its height the bar's measured
 * syncopation (0..1), and a dashed tick at the card's target where the card sets a curve.
 */
export function tensionPlotSvg(drill: Drill): string {
  const bars = drill.bars;
  const inner = PLOT_HEIGHT - TOP - BOTTOM;
  const slot = (PLOT_WIDTH - LEFT) / Math.max(1, bars.length);
  const column = Math.max(2, slot * 0.6);
  const baseline = TOP + inner;
  const parts: string[] = [
    `<text x="0" y="${TOP + 10}" font-family="Roboto" font-size="10">Tension</text>`,
    `<text x="0" y="${TOP + 22}" font-family="Roboto" font-size="8" fill="#555">per bar, 0–1</text>`,
    `<line x1="${LEFT}" y1="${baseline}" x2="${PLOT_WIDTH}" y2="${baseline}" stroke="#000" stroke-width="0.8"/>`,
    `<line x1="${LEFT}" y1="${TOP}" x2="${PLOT_WIDTH}" y2="${TOP}" stroke="#bbb" stroke-width="0.5"/>`,
  ];
  bars.forEach((bar, i) => {
    const x = LEFT + i * slot + (slot - column) / 2;
    const h = clamp(bar.tension) * inner;
    parts.push(
      `<rect x="${fixed(x)}" y="${fixed(baseline - h)}" width="${fixed(column)}" height="${fixed(h)}" fill="#444"/>`,
    );
    const target = targetOf(drill, bar.bar);
    if (target !== null) {
      const y = fixed(baseline - clamp(target) * inner);
      parts.push(
        `<line x1="${fixed(x - 2)}" y1="${y}" x2="${fixed(x + column + 2)}" y2="${y}" stroke="#000" stroke-width="1" stroke-dasharray="2,1.5"/>`,
      );
    }
    parts.push(
      `<text x="${fixed(x + column / 2)}" y="${PLOT_HEIGHT - 2}" font-family="Roboto" font-size="8" text-anchor="middle">${bar.bar}</text>`,
    );
  });
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${PLOT_WIDTH}" height="${PLOT_HEIGHT}" viewBox="0 0 ${PLOT_WIDTH} ${PLOT_HEIGHT}">${parts.join('')}</svg>`;
}
