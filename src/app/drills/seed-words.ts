/**
 * Fresh seeds for "New seed": short, easy to read aloud and type back (a word and a number), so a
 * teacher can say "use seed meadow-417" across the room.
 */
const WORDS = [
  'amber',
  'birch',
  'cedar',
  'dune',
  'ember',
  'fern',
  'grove',
  'harbor',
  'iris',
  'juniper',
  'kestrel',
  'linden',
  'meadow',
  'nettle',
  'orchard',
  'pebble',
  'quarry',
  'river',
  'sorrel',
  'thistle',
  'umber',
  'willow',
  'yarrow',
  'zephyr',
] as const;

/** A new random seed such as `meadow-417` (browser randomness; the engine itself stays seeded). */
export function freshSeed(random: () => number = Math.random): string {
  const word = WORDS[Math.floor(random() * WORDS.length)] ?? 'meadow';
  const number = 100 + Math.floor(random() * 900);
  return `${word}-${number}`;
}
