/**
 * `Array.from({ length }, (_, i) => make(i))` as a plain loop: the engine builds such arrays
 * for every drill, and `Array.from` on an array-like takes V8's slow generic path.
 */
export function arrayOf<T>(length: number, make: (i: number) => T): T[] {
  const out: T[] = [];
  for (let i = 0; i < length; i++) out.push(make(i));
  return out;
}
