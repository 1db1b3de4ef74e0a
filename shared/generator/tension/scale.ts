/**
 * The stored precision of every tension: ten-thousandths of the 0..1 scale (4 decimals). The
 * one place a tension is rounded; the search compares whole units, never floats.
 */
const UNITS = 10_000;

/** A raw syncopation value on a grid whose greatest value is `most`, in units (0 when nothing can syncopate). */
export function unitsOf(raw: number, most: number): number {
  return most === 0 ? 0 : tensionUnits(raw / most);
}

/** A tension on the 0..1 scale in units. */
export function tensionUnits(tension: number): number {
  return Math.round(tension * UNITS);
}

/** Units back on the 0..1 scale. */
export function fromUnits(units: number): number {
  return units / UNITS;
}

/** A raw value on the 0..1 scale, rounded to 4 decimals. */
export function scaled(raw: number, most: number): number {
  return fromUnits(unitsOf(raw, most));
}
