/**
 * Draws the polyrhythm grouping marks (see `polyrhythmGroups`): a dashed line over (or under)
 * the cycle, from its first note to the end of its last beat, with short hooks at its ends and its label ("4 vs 3") in a gap at its middle.
 * Dashed and without a ratio, so it is not read as a tuplet bracket (the notes under it are
 * written at their real values). A cycle that runs onto the next system is drawn in two pieces,
 * the label on the first, the open ends without hooks.
 */
import type { SVGContext } from 'vexflow/core';
import type { PolyrhythmGroup } from './polyrhythm';
import { svgText } from './svg-text';

/** Where the notes of an instant were set: `${bar}:${beat}:${slot}`. */
export interface InstantBox {
  readonly left: number;
  readonly right: number;
  readonly system: number;
}

/** A system's note area and the lines the brackets sit on, over and under its staff. */
export interface SystemBand {
  readonly left: number;
  readonly right: number;
  readonly aboveY: number;
  readonly belowY: number;
}

const HOOK = 6;
const LABEL_SIZE = 13;
const PAD = 3;

/**
 * `boxes` are keyed by instant, `beatEnds` by `${bar}:${beat}`: where each beat's area ends (the
 * bar line for a bar's last beat), so a cycle's line runs through its last note's value.
 */
export function drawPolyrhythmBrackets(
  ctx: SVGContext,
  groups: readonly PolyrhythmGroup[],
  boxes: ReadonlyMap<string, InstantBox>,
  beatEnds: ReadonlyMap<string, InstantBox>,
  systems: readonly SystemBand[],
): void {
  for (const group of groups) {
    const key = (n: { bar: number; beat: number; slot: number }) => `${n.bar}:${n.beat}:${n.slot}`;
    const first = boxes.get(key(group.notes[0]!));
    const last = beatEnds.get(`${group.lastBeat.bar}:${group.lastBeat.beat}`);
    if (!first || !last) continue;
    const element = ctx.openGroup();
    element.setAttribute('class', 'tensile-polyrhythm');
    element.setAttribute('data-label', group.label);
    element.setAttribute('data-notes', group.notes.map(key).join(' '));
    for (let system = first.system; system <= last.system; system++) {
      const band = systems[system];
      if (!band) continue;
      const from = system === first.system ? first.left - PAD : band.left;
      const to = system === last.system ? last.right - PAD : band.right;
      const y = group.below ? band.belowY : band.aboveY;
      const hookDir = group.below ? -1 : 1;
      piece(ctx, from, to, y, hookDir, {
        open: system !== first.system,
        close: system !== last.system,
        label: system === first.system ? group.label : null,
      });
    }
    ctx.closeGroup();
  }
}

function piece(
  ctx: SVGContext,
  from: number,
  to: number,
  y: number,
  hookDir: number,
  ends: { open: boolean; close: boolean; label: string | null },
): void {
  const mid = (from + to) / 2;
  // The label's gap: about 0.55 of the size a character, with air.
  const half = ends.label ? (ends.label.length * LABEL_SIZE * 0.55) / 2 + 4 : 0;
  const segments: [number, number][] = ends.label
    ? [
        [from, mid - half],
        [mid + half, to],
      ]
    : [[from, to]];
  let d = '';
  for (const [a, b] of segments) if (b > a) d += `M${r(a)} ${r(y)}L${r(b)} ${r(y)}`;
  if (!ends.open) d += `M${r(from)} ${r(y)}L${r(from)} ${r(y + hookDir * HOOK)}`;
  if (!ends.close) d += `M${r(to)} ${r(y)}L${r(to)} ${r(y + hookDir * HOOK)}`;
  const path = ctx.create('path') as SVGPathElement;
  path.setAttribute('d', d);
  path.setAttribute('fill', 'none');
  path.setAttribute('stroke-width', '1');
  path.setAttribute('stroke-dasharray', '4 3');
  ctx.add(path);
  if (ends.label) {
    svgText(ctx, ends.label, mid, y + LABEL_SIZE * 0.35, 'tensile-polyrhythm-label', {
      size: LABEL_SIZE,
      weight: 'bold',
    });
  }
}

function r(n: number): string {
  return String(Math.round(n * 10) / 10);
}
