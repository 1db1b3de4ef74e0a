/**
 * Notes of the first bar that belong to the loop's seam: a backbeat moved late past the end of
 * the drill's last bar sounds at the start of the first, as the loop comes round. A student
 * reading bar 1 cold sees a note that no beat of bar 1 explains, so the first bar says where it
 * comes from, in a small word over the note (common practice: a cue or a short text names a
 * note carried over from elsewhere; E. Gould, "Behind Bars", Faber Music 2011, ch. "Cues";
 * from memory).
 */
import type { DrillBar, VoiceId } from '../generator/drill';
import { createGrid, positionOf, shiftedInstant } from '../generator/grid';

/** The slice of a backbeat rule that places its notes (see `placeBackbeat`). */
export interface SeamRuleSource {
  readonly kind: string;
  readonly voice?: VoiceId;
  readonly beats?: readonly number[];
  readonly shift?: number;
  readonly bars?: readonly number[] | null;
}

/** A note of bar 1 carried over from a beat of the drill's last bar. */
export interface CarriedNote {
  readonly beat: number;
  readonly slot: number;
  readonly voice: VoiceId;
  /** The bar and beat it is the late backbeat of. */
  readonly fromBar: number;
  readonly fromBeat: number;
}

/** The notes of bar 1 that late backbeats of the last bar carried round the loop. */
export function carriedIntoFirstBar(
  rules: readonly SeamRuleSource[],
  bars: readonly Pick<DrillBar, 'bar' | 'beats' | 'hits'>[],
): CarriedNote[] {
  const first = bars[0];
  const lastBar = bars.length;
  if (!first || lastBar === 0) return [];
  const grid = createGrid(lastBar, first.beats);
  const carried: CarriedNote[] = [];
  for (const rule of rules) {
    if (rule.kind !== 'backbeat' || !rule.voice || !rule.beats || (rule.shift ?? 0) <= 0) continue;
    if (rule.bars && !rule.bars.includes(lastBar)) continue;
    for (const beat of rule.beats) {
      const home = (lastBar - 1) * grid.beatsPerBar + (beat - 1);
      const at = positionOf(grid, shiftedInstant(grid, home, rule.shift!));
      if (at.bar !== 1) continue;
      // Only a note that is there (a kept bar or a conflict may have left it out).
      const sounds = first.hits.some(
        (hit) =>
          hit.voice === rule.voice &&
          hit.beat === at.beat &&
          hit.slot === at.slot &&
          hit.source === 'backbeat',
      );
      if (sounds)
        carried.push({
          beat: at.beat,
          slot: at.slot,
          voice: rule.voice,
          fromBar: lastBar,
          fromBeat: beat,
        });
    }
  }
  return carried;
}
