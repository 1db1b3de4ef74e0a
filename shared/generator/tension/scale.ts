/**
 * A raw syncopation value on a grid whose greatest value is `most`, in ten-thousandths of the
 * 0..1 scale (the stored precision; 0 on a grid where nothing can syncopate).
 */
export function unitsOf(raw: number, most: number): number {
  return most === 0 ? 0 : Math.round((raw / most) * 10_000);
}

/** The same on the 0..1 scale, rounded to 4 decimals. */
export function scaled(raw: number, most: number): number {
  return unitsOf(raw, most) / 10_000;
}
