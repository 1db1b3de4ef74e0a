import { isHandVoice, type VoiceId } from '../drill';
import type { Grid } from '../grid';
import type { WorkHit } from '../hands';
import type { RuleCard } from '../schema';
import { countOverlaps, overlapBudget } from './linear';
import { phraseOf } from './phrase';
import type { Placement } from './placement';

/** Voices whose line a euclid or polyrhythm rule draws: no anchor and no fill blur it. */
export function lineVoices(card: RuleCard): Set<VoiceId> {
  const out = new Set<VoiceId>();
  for (const rule of card.rules) {
    if (rule.kind === 'euclid') out.add(rule.voice);
    if (rule.kind === 'polyrhythm') for (const voice of rule.voices) out.add(voice);
  }
  return out;
}

/** Instants where a colour crash sounds: beat 1 of bar 1 (a phrase rule places its own). */
export function colourCrashes(card: RuleCard): Set<number> {
  const crashes = new Set<number>();
  if (card.roles.crash === 'colour' && !phraseOf(card)) crashes.add(0);
  return crashes;
}

/**
 * The anchor's hits, placed after every rule: each anchor voice on beat 1 of every bar where no
 * rule keeps it off, no line owns it and the linear budget has room; and the colour crash. The
 * crash is played by a hand: where that would need a third hand it is left out.
 */
export function placeAnchors(
  card: RuleCard,
  grid: Grid,
  cells: readonly (readonly WorkHit[])[],
  avoided: ReadonlyMap<VoiceId, ReadonlyMap<number, number>>,
): Placement[] {
  const lines = lineVoices(card);
  const budget = overlapBudget(card);
  const anchors = card.voices.filter((v) => card.roles[v] === 'anchor' && !lines.has(v));
  const out: Placement[] = [];
  for (let bar = 0; bar < grid.bars; bar++) {
    const downbeat = bar * grid.slotsPerBar;
    let overlaps = countOverlaps(
      downbeat,
      downbeat + grid.slotsPerBar,
      (i) => cells[i]?.length ?? 0,
    );
    const cell = cells[downbeat] ?? [];
    let count = cell.length;
    let hands = cell.filter((hit) => isHandVoice(hit.voice)).length;
    const wanted: VoiceId[] = [...anchors];
    if (colourCrashes(card).has(downbeat)) wanted.push('crash');
    for (const voice of wanted) {
      if (cell.some((hit) => hit.voice === voice) || avoided.get(voice)?.has(downbeat)) continue;
      if (count === 1 && overlaps >= budget) continue;
      if (isHandVoice(voice) && hands >= 2) continue;
      out.push({ instant: downbeat, voice, source: 'anchor', dynamic: 'normal', rule: -3 });
      if (count === 1) overlaps++;
      count++;
      if (isHandVoice(voice)) hands++;
    }
  }
  return out;
}
