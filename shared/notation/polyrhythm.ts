/**
 * The polyrhythm's own grouping on the page: each cycle of a `polyrhythm` rule (4 even notes
 * over 3 beats) gets a grouping line labelled "4 vs 3" from the cycle's first note to the end of
 * its last beat (where its last note's value ends, as a bracket spans its notes' durations), so the
 * four can be seen among the grid's notes. The notes are already written at their real values,
 * so the mark carries no ratio: a "4:3" bracket tells a reader to play its notes as a tuplet
 * (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets"; from memory), which would double the
 * speed-up. "4 vs 3" as a text label is common practice.
 */
import { FOOT_VOICES, type DrillBar, type VoiceId } from '../generator/drill';

const isFoot = (voice: VoiceId) => FOOT_VOICES.has(voice);

/** A struck instant of the drill. */
export interface DrillInstant {
  readonly bar: number;
  readonly beat: number;
  readonly slot: number;
}

/** One cycle of a polyrhythm: its ratio and its notes in time order. */
export interface PolyrhythmGroup {
  /** "4 vs 3": `against` notes in the time of `span` beats (a label, never a tuplet ratio). */
  readonly label: string;
  readonly notes: readonly DrillInstant[];
  /** The cycle's last beat: the bracket runs to its end, where the last note's value ends. */
  readonly lastBeat: { readonly bar: number; readonly beat: number };
  /** The bracket goes under the staff for a stream of feet alone, else over it. */
  readonly below: boolean;
}

/** The part of a polyrhythm rule notation reads. */
export interface PolyrhythmSource {
  readonly kind: string;
  readonly voices?: readonly VoiceId[];
  readonly against?: number;
  readonly span?: number;
}

/**
 * Every whole cycle of every polyrhythm rule whose notes are all in the drill (hit i of a cycle
 * at i·span/against beats from the cycle's start, in the voice `voices[i % n]`, as the engine
 * places them). A cycle cut by the drill's end, or one whose notes landed off the grid, gets no
 * bracket.
 */
export function polyrhythmGroups(
  rules: readonly PolyrhythmSource[],
  bars: readonly Pick<DrillBar, 'bar' | 'beats' | 'hits'>[],
  beatsPerBar: number,
): PolyrhythmGroup[] {
  const groups: PolyrhythmGroup[] = [];
  const total = bars.length * beatsPerBar;
  for (const rule of rules) {
    const voices = rule.voices ?? [];
    const against = rule.against ?? 0;
    const span = rule.span ?? beatsPerBar;
    if (rule.kind !== 'polyrhythm' || against < 2 || voices.length === 0) continue;
    for (let start = 0; start + span <= total; start += span) {
      const notes: DrillInstant[] = [];
      for (let i = 0; i < against; i++) {
        const voice = voices[i % voices.length]!;
        const at = instantAt(bars, beatsPerBar, start, i * span, against);
        if (!at || !struck(bars, at, voice)) break;
        notes.push(at);
      }
      const end = start + span - 1;
      const lastBeat = {
        bar: bars[Math.floor(end / beatsPerBar)]!.bar,
        beat: (end % beatsPerBar) + 1,
      };
      if (notes.length === against)
        groups.push({
          label: `${against} vs ${span}`,
          notes,
          lastBeat,
          below: voices.every(isFoot),
        });
    }
  }
  return groups;
}

/** The instant `num / den` beats after beat `start` of the drill, or null off the grid. */
function instantAt(
  bars: readonly Pick<DrillBar, 'bar' | 'beats'>[],
  beatsPerBar: number,
  start: number,
  num: number,
  den: number,
): DrillInstant | null {
  const whole = start + Math.floor(num / den);
  const bar = bars[Math.floor(whole / beatsPerBar)];
  const beat = (whole % beatsPerBar) + 1;
  const slots = bar?.beats[beat - 1];
  if (!bar || slots === undefined) return null;
  const slot = ((num % den) * slots) / den;
  return Number.isInteger(slot) ? { bar: bar.bar, beat, slot } : null;
}

function struck(
  bars: readonly Pick<DrillBar, 'bar' | 'hits'>[],
  at: DrillInstant,
  voice: VoiceId,
): boolean {
  const bar = bars.find((b) => b.bar === at.bar);
  return !!bar?.hits.some((h) => h.beat === at.beat && h.slot === at.slot && h.voice === voice);
}
