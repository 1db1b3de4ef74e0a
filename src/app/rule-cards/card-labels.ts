/** Words for a rule card's time feel, as a teacher would say them. */

const TUPLET_NAMES: Readonly<Record<number, string>> = {
  3: 'triplets',
  5: 'quintuplets',
  6: 'sextuplets',
  7: 'septuplets',
};

const NOTE_VALUE_NAMES: Readonly<Record<number, string>> = {
  2: 'halves',
  4: 'quarters',
  8: 'eighths',
  16: 'sixteenths',
  32: 'thirty-seconds',
  64: 'sixty-fourths',
  128: 'hundred-twenty-eighths',
};

/** "4/4" from `{ beats: 4, unit: 4 }`; strings pass through; anything else is "—". */
export function meterLabel(meter: unknown): string {
  if (typeof meter === 'string' && meter.trim()) return meter;
  const unit = beatUnit(meter);
  const beats =
    typeof meter === 'object' && meter !== null ? (meter as { beats?: unknown }).beats : null;
  return typeof beats === 'number' && unit !== null ? `${beats}/${unit}` : '—';
}

/**
 * Slots per beat in words. Even splits are named by the note value they make with the beat unit
 * (2 per quarter = eighths, 2 per eighth = sixteenths); odd splits are the beat's tuplets
 * (common practice). A per-beat list reads "mixed: sixteenths, triplets".
 */
export function subdivisionLabel(subdivision: unknown, meter?: unknown): string {
  if (typeof subdivision === 'string' && subdivision.trim()) return subdivision;
  if (typeof subdivision === 'number') return slotsLabel(subdivision, beatUnit(meter) ?? 4);
  if (Array.isArray(subdivision) && subdivision.length > 0) {
    const distinct = [...new Set(subdivision.map((entry) => subdivisionLabel(entry, meter)))];
    return distinct.length === 1 ? (distinct[0] ?? '—') : `mixed: ${distinct.join(', ')}`;
  }
  return '—';
}

function slotsLabel(slots: number, unit: number): string {
  if (slots === 1) return 'one per beat';
  const tuplet = TUPLET_NAMES[slots];
  if (tuplet) return tuplet;
  return NOTE_VALUE_NAMES[slots * unit] ?? `${slots} per beat`;
}

function beatUnit(meter: unknown): number | null {
  if (typeof meter !== 'object' || meter === null) return null;
  const { unit } = meter as { unit?: unknown };
  return typeof unit === 'number' ? unit : null;
}
