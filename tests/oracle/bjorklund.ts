/**
 * Bjorklund's algorithm, written for the oracle (it shares no code with the engine).
 *
 * E. Bjorklund, "The theory of rep-rate pattern generation in the SNS timing system", SNS ADT
 * note, 2003, as described by G. T. Toussaint, "The Euclidean Algorithm Generates Traditional
 * Musical Rhythms", BRIDGES 2005, section 3: start with `pulses` sequences [x] and
 * `steps − pulses` sequences [.]; repeatedly append one sequence of the remainder group to each
 * sequence of the leading group (as many as pair up); whatever is left over becomes the new
 * remainder; stop when the remainder holds at most one sequence; read all sequences in order.
 */
export function bjorklund(pulses: number, steps: number): boolean[] {
  if (pulses <= 0) return Array.from({ length: steps }, () => false);
  if (pulses >= steps) return Array.from({ length: steps }, () => true);
  let lead: boolean[][] = Array.from({ length: pulses }, () => [true]);
  let rest: boolean[][] = Array.from({ length: steps - pulses }, () => [false]);
  do {
    const pairs = Math.min(lead.length, rest.length);
    const joined = lead.slice(0, pairs).map((seq, i) => [...seq, ...rest[i]!]);
    const left = lead.length > pairs ? lead.slice(pairs) : rest.slice(pairs);
    lead = joined;
    rest = left;
  } while (rest.length > 1);
  return [...lead.flat(), ...rest.flat()];
}

/**
 * The pattern turned left by `rotation` steps: it starts `rotation` steps later (the drill
 * contract's "rotation starts the pattern that many steps later (left rotation)").
 */
export function rotateLeft<T>(pattern: readonly T[], rotation: number): T[] {
  const n = pattern.length;
  const r = ((rotation % n) + n) % n;
  return [...pattern.slice(r), ...pattern.slice(0, r)];
}

/** `x` for a pulse, `.` for a rest: the notation of Toussaint's table. */
export function show(pattern: readonly boolean[]): string {
  return pattern.map((on) => (on ? 'x' : '.')).join('');
}
