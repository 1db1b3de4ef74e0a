/**
 * Fresh seed words for drill links: two plain words and a number ("brass-willow-42"), easy to read
 * aloud in a lesson and to type back. Uses the platform's CSPRNG; the engine itself stays seeded.
 */
const FIRST = [
  'amber',
  'brass',
  'cedar',
  'copper',
  'dusk',
  'ember',
  'fern',
  'flint',
  'harbor',
  'indigo',
  'juniper',
  'lark',
  'maple',
  'marble',
  'meadow',
  'nutmeg',
  'ochre',
  'pebble',
  'quartz',
  'river',
  'saffron',
  'slate',
  'tidal',
  'umber',
  'velvet',
  'willow',
] as const;
const SECOND = [
  'anchor',
  'arch',
  'bell',
  'bridge',
  'canyon',
  'comet',
  'drift',
  'echo',
  'falcon',
  'garden',
  'harvest',
  'island',
  'lantern',
  'meadow',
  'orbit',
  'pillar',
  'ridge',
  'signal',
  'spark',
  'summit',
  'thicket',
  'tide',
  'valley',
  'vine',
  'wave',
  'wren',
] as const;

/** A new seed word; `random` is injectable so tests can pin it. */
export function freshSeedWord(random: (bound: number) => number = cryptoIndex): string {
  const first = FIRST[random(FIRST.length)] ?? FIRST[0];
  const second = SECOND[random(SECOND.length)] ?? SECOND[0];
  return `${first}-${second}-${random(90) + 10}`;
}

function cryptoIndex(bound: number): number {
  const [value = 0] = crypto.getRandomValues(new Uint32Array(1));
  return value % bound;
}
