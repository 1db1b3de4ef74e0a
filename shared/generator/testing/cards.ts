import fc from 'fast-check';
import { VOICE_IDS, type VoiceId } from '../drill';
import { gcd } from '../grid';

/**
 * Random valid rule cards for the engine's property tests: varied meters, tuplet and mixed
 * grids, voices, ostinati and every rule kind. Test-only: nothing in the engine imports it.
 */

const divisors = (n: number): number[] =>
  Array.from({ length: n }, (_, i) => i + 1).filter((d) => n % d === 0);

/** Counts of even points over `span` beats that land on slots of every beat (`common` = gcd of subdivisions). */
function landingCounts(span: number, common: number): number[] {
  const counts = new Set<number>();
  for (const k of divisors(common)) counts.add(span * k); // k points per beat
  for (const g of divisors(span)) counts.add(span / g); // a point every g beats
  return [...counts].filter((c) => c >= 1 && c <= 32).sort((a, b) => a - b);
}

interface Frame {
  beats: number;
  bars: number;
  subdivision: number | number[];
  voices: VoiceId[];
}

const frameArb: fc.Arbitrary<Frame> = fc
  .record({
    beats: fc.integer({ min: 1, max: 15 }),
    bars: fc.integer({ min: 1, max: 4 }),
    voices: fc.shuffledSubarray([...VOICE_IDS], { minLength: 1, maxLength: 5 }),
  })
  .chain((f) =>
    fc
      .oneof(
        fc.integer({ min: 1, max: 8 }),
        fc.array(fc.integer({ min: 1, max: 8 }), { minLength: f.beats, maxLength: f.beats }),
      )
      .map((subdivision) => ({ ...f, subdivision })),
  );

function ruleArb(f: Frame): fc.Arbitrary<Record<string, unknown>> {
  const slots = typeof f.subdivision === 'number' ? [f.subdivision] : f.subdivision;
  const common = slots.reduce(gcd);
  const voice = fc.constantFrom(...f.voices);
  const someVoices = fc.shuffledSubarray(f.voices, {
    minLength: 1,
    maxLength: Math.min(2, f.voices.length),
  });
  const span = fc.integer({ min: 1, max: 8 });
  return fc.oneof(
    fc.record({
      kind: fc.constant('backbeat'),
      voice,
      beats: fc.shuffledSubarray(
        Array.from({ length: f.beats }, (_, i) => i + 1),
        { minLength: 1, maxLength: Math.min(3, f.beats) },
      ),
      shift: fc.integer({ min: -8, max: 8 }),
    }),
    fc.record({
      kind: fc.constant('avoidDownbeat'),
      voice,
      resolveEvery: fc.integer({ min: 0, max: 4 }),
      anticipate: fc.boolean(),
    }),
    fc.record({
      kind: fc.constant('fillHoles'),
      voices: someVoices,
      ghost: fc.constantFrom(0, 0.25, 0.5),
      accent: fc.constantFrom(0, 0.1, 0.5),
    }),
    fc.record({ kind: fc.constant('linear'), maxOverlaps: fc.integer({ min: 0, max: 6 }) }),
    span.chain((s) =>
      fc.record({
        kind: fc.constant('polyrhythm'),
        voices: someVoices,
        against: fc.constantFrom(...landingCounts(s, common)),
        span: fc.constant(s),
      }),
    ),
    span.chain((s) =>
      fc.constantFrom(...landingCounts(s, common)).chain((steps) =>
        fc.record({
          kind: fc.constant('euclid'),
          voice,
          pulses: fc.integer({ min: 1, max: steps }),
          steps: fc.constant(steps),
          rotation: fc.integer({ min: 0, max: steps - 1 }),
          span: fc.constant(s),
        }),
      ),
    ),
    fc.record({
      kind: fc.constant('tension'),
      curve: fc.array(
        fc.integer({ min: 0, max: 10 }).map((n) => n / 10),
        { minLength: 1, maxLength: 4 },
      ),
    }),
  );
}

/** Valid rule cards: varied meters, tuplet and mixed grids, voices, ostinati, every rule kind. */
export const cardArb = frameArb.chain((f) => {
  const fewest = typeof f.subdivision === 'number' ? f.subdivision : Math.min(...f.subdivision);
  const ostinato = fc.option(
    fc.record({
      voice: fc.constantFrom(...f.voices),
      slots: fc.shuffledSubarray(
        Array.from({ length: fewest }, (_, i) => i),
        { minLength: 1 },
      ),
    }),
    { nil: undefined },
  );
  return fc
    .record({
      unit: fc.constantFrom(2, 4, 8, 16),
      tempo: fc.integer({ min: 20, max: 320 }),
      density: fc.integer({ min: 0, max: 10 }).map((n) => n / 10),
      ostinato,
      rules: fc.array(ruleArb(f), { maxLength: 4 }),
    })
    .map(({ unit, tempo, density, ostinato: o, rules }) => ({
      meter: { beats: f.beats, unit },
      bars: f.bars,
      subdivision: f.subdivision,
      tempo,
      voices: f.voices,
      ...(o ? { ostinato: o } : {}),
      density,
      // one tension rule per card
      rules: rules.filter(
        (r, i) => r['kind'] !== 'tension' || rules.findIndex((x) => x['kind'] === 'tension') === i,
      ),
    }));
});
