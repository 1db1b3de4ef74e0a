/**
 * Bjorklund's algorithm, as described by G. T. Toussaint, "The Euclidean Algorithm Generates
 * Traditional Musical Rhythms", Proc. BRIDGES: Mathematical Connections in Art, Music and Science,
 * Banff, 2005, pp. 47–56 (after E. Bjorklund's timing-system note for the SNS accelerator).
 *
 * Spreads `pulses` onsets as evenly as possible over `steps` positions: start with `pulses` groups
 * [x] and `steps - pulses` groups [.], append one trailing group to each leading group (as many as
 * pair up; the leftovers of the longer list become the new trailing list) and repeat while more
 * than one trailing group is left. The first pairing always happens: testing before it would turn
 * E(2,3) into `xx.` instead of the paper's `x.x`.
 *
 * The result is in the rotation the procedure produces, which is the one printed in Toussaint's
 * table: it starts with an onset (except E(0,n), which is silent), e.g. E(3,8) = x..x..x. and
 * E(5,13) = x..x.x..x.x.. . Returns `true` for an onset.
 */
export function bjorklund(pulses: number, steps: number): boolean[] {
  if (!Number.isInteger(steps) || steps < 0 || !Number.isInteger(pulses) || pulses < 0) {
    throw new RangeError(`E(${pulses},${steps}) needs whole numbers of pulses and steps.`);
  }
  if (pulses > steps) {
    throw new RangeError(`E(${pulses},${steps}) has more pulses than steps.`);
  }
  if (pulses === 0 || pulses === steps) return new Array<boolean>(steps).fill(pulses > 0);

  let leading: boolean[][] = Array.from({ length: pulses }, () => [true]);
  let trailing: boolean[][] = Array.from({ length: steps - pulses }, () => [false]);
  do {
    const paired = Math.min(leading.length, trailing.length);
    const merged = leading.slice(0, paired).map((group, i) => group.concat(trailing[i] ?? []));
    trailing = leading.length > paired ? leading.slice(paired) : trailing.slice(paired);
    leading = merged;
  } while (trailing.length > 1);
  const out: boolean[] = [];
  for (const group of leading.concat(trailing)) for (const step of group) out.push(step);
  return out;
}
