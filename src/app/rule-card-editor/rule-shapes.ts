/**
 * What the rule fields show before the engine runs: the Euclidean pattern as dots and the
 * polyrhythm spans whose hits all land on a slot of the grid.
 */

/**
 * E(pulses, steps) by Bjorklund's procedure (pair leading [x] groups with trailing [.] groups until
 * at most one trailing group is left), as in G. T. Toussaint, "The Euclidean Algorithm Generates
 * Traditional Musical Rhythms", BRIDGES 2005, then turned left by `rotation` steps as the drill
 * contract's euclid rule does.
 */
export function euclidDots(pulses: number, steps: number, rotation = 0): boolean[] {
  if (!Number.isInteger(pulses) || !Number.isInteger(steps) || steps < 1 || pulses < 0) return [];
  if (pulses > steps) return [];
  let pattern: boolean[];
  if (pulses === 0 || pulses === steps) {
    pattern = new Array<boolean>(steps).fill(pulses > 0);
  } else {
    let leading: boolean[][] = Array.from({ length: pulses }, () => [true]);
    let trailing: boolean[][] = Array.from({ length: steps - pulses }, () => [false]);
    do {
      const paired = Math.min(leading.length, trailing.length);
      const merged = leading.slice(0, paired).map((group, i) => group.concat(trailing[i] ?? []));
      trailing = leading.length > paired ? leading.slice(paired) : trailing.slice(paired);
      leading = merged;
    } while (trailing.length > 1);
    pattern = leading.concat(trailing).flat();
  }
  const turn = (((Number.isInteger(rotation) ? rotation : 0) % steps) + steps) % steps;
  return pattern.slice(turn).concat(pattern.slice(0, turn));
}

/**
 * Whether `against` even hits over every `span` beats all land on a slot, for cycles repeating
 * through `totalBeats` beats whose slots per beat are `beatSlots` (bar after bar). Hit i of a cycle
 * sits `i * span / against` beats after the cycle's start.
 */
export function spanLands(
  against: number,
  span: number,
  beatSlots: readonly number[],
  totalBeats: number,
): boolean {
  if (against < 1 || span < 1 || beatSlots.length === 0) return false;
  for (let start = 0; start < Math.max(totalBeats, span); start += span) {
    for (let i = 0; i < against; i += 1) {
      // Position in beats as the exact fraction (start * against + i * span) / against.
      const numerator = start * against + i * span;
      const beat = Math.floor(numerator / against);
      const remainder = numerator - beat * against;
      const slots = beatSlots[beat % beatSlots.length] ?? 1;
      if ((remainder * slots) % against !== 0) return false;
    }
  }
  return true;
}

/** The spans (1..max) a polyrhythm of `against` hits may use on this grid. */
export function landingSpans(
  against: number,
  beatSlots: readonly number[],
  totalBeats: number,
  max = 16,
): number[] {
  const spans: number[] = [];
  for (let span = 1; span <= max; span += 1) {
    if (spanLands(against, span, beatSlots, totalBeats)) spans.push(span);
  }
  return spans;
}
