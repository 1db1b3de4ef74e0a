/**
 * Exact whole-number timing shared by the MIDI and MusicXML exports: ticks (MIDI) and divisions
 * (MusicXML) are both counted per quarter note, and a slot of any subdivision the engine allows
 * (1–8 per beat) must land on a whole one.
 */
import type { DrillBar, DrillHit } from '../generator/drill';
import { defaultGrouping, isCompound } from '../generator/meter';

/** lcm(1, 2, …, 8): slots per beat the engine allows, all on a whole tick of one beat. */
const SLOT_LCM = 840;

/**
 * Ticks per quarter note for a meter unit: 1680 (= 2 × 840) for half, quarter and eighth beats,
 * so a quarter beat and an eighth beat both split into 1–8 slots on whole ticks; 3360 for
 * sixteenth beats (a sixteenth of 1680 is 420, which does not split into 8).
 */
export function ticksPerQuarter(unit: number): number {
  return Math.max(1680, (SLOT_LCM * unit) / 4);
}

/** Ticks of one beat of the meter. */
export function beatTicks(unit: number): number {
  return (ticksPerQuarter(unit) * 4) / unit;
}

/** Ticks of one slot of a beat split into `slots`. */
export function slotTicks(unit: number, slots: number): number {
  return beatTicks(unit) / slots;
}

/** Ticks of a whole bar (every beat of the meter has the unit's length). */
export function barTicks(meter: { readonly beats: number; readonly unit: number }): number {
  return meter.beats * beatTicks(meter.unit);
}

/** The tick a hit starts on, counted from the start of the bar with index `barIndex` (from 0). */
export function hitTick(
  meter: { readonly beats: number; readonly unit: number },
  barIndex: number,
  bar: DrillBar,
  hit: Pick<DrillHit, 'beat' | 'slot'>,
): number {
  const slots = bar.beats[hit.beat - 1] ?? 1;
  return (
    barIndex * barTicks(meter) +
    (hit.beat - 1) * beatTicks(meter.unit) +
    hit.slot * slotTicks(meter.unit, slots)
  );
}

/**
 * True when the beat a listener taps is a dotted note of three meter units (6/8, 9/8, 12/8):
 * the card's grouping, or the default one, all threes.
 */
export function compoundMeter(meter: {
  readonly beats: number;
  readonly unit: number;
  readonly grouping?: readonly number[] | undefined;
}): boolean {
  const grouping = meter.grouping ?? defaultGrouping(meter) ?? undefined;
  return isCompound({ unit: meter.unit as 2 | 4 | 8 | 16, grouping });
}

/** Quarter notes a minute for a tempo counted in beats of the meter's unit (132 eighths: 66). */
export function quarterBpm(tempo: number, unit: number): number {
  return (tempo * 4) / unit;
}
