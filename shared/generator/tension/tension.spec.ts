import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type DrillBar, type DrillHit, HIT_SOURCES, VOICE_IDS } from '../drill';
import { lhlSyncopation } from './lhl';
import { maxLhlSyncopation } from './lhl-range';
import { measureTension, tensionMeter } from './tension';

const GRIDS = [
  [4, 4, 4, 4],
  [3, 3, 3, 3],
  [4, 4, 5, 5],
  [6, 6, 6],
  [5, 5, 5, 5],
  [8, 8],
  [2, 2, 2],
];
const DYNAMICS = ['ghost', 'normal', 'accent'] as const;

const hitAt = (beats: readonly number[]) =>
  fc.integer({ min: 0, max: beats.length - 1 }).chain((b) =>
    fc.record({
      beat: fc.constant(b + 1),
      slot: fc.integer({ min: 0, max: (beats[b] ?? 1) - 1 }),
      voice: fc.constantFrom(...VOICE_IDS),
      dynamic: fc.constantFrom(...DYNAMICS),
      hand: fc.constant(null),
      source: fc.constantFrom(...HIT_SOURCES),
    }),
  );

const barArb = fc.constantFrom(...GRIDS).chain((beats) =>
  fc.record({
    bar: fc.integer({ min: 1, max: 64 }),
    beats: fc.constant(beats),
    tension: fc.constant(0),
    hits: fc.array(hitAt(beats), { maxLength: 30 }),
  }),
);

const onsetsOf = (bar: DrillBar): boolean[] => {
  const starts = bar.beats.map((_, i) => bar.beats.slice(0, i).reduce((a, b) => a + b, 0));
  const onsets = new Array<boolean>(bar.beats.reduce((a, b) => a + b, 0)).fill(false);
  for (const hit of bar.hits)
    if (hit.source !== 'ostinato') onsets[(starts[hit.beat - 1] ?? 0) + hit.slot] = true;
  return onsets;
};

describe('measureTension', () => {
  it('lies in 0..1, rounded to 4 decimals', () => {
    fc.assert(
      fc.property(barArb, (bar) => {
        const t = measureTension(bar);
        return (
          t >= 0 &&
          t <= 1 &&
          Number.isInteger(Math.round(t * 10_000)) &&
          Math.abs(t * 10_000 - Math.round(t * 10_000)) < 1e-9
        );
      }),
    );
  });

  it('is the LHL syncopation of the merged non-ostinato stream over the grid maximum', () => {
    fc.assert(
      fc.property(barArb, (bar) => {
        const expected = lhlSyncopation(bar.beats, onsetsOf(bar)) / maxLhlSyncopation(bar.beats);
        return Math.abs(measureTension(bar) - expected) <= 0.00005;
      }),
    );
  });

  it('ignores ostinato hits wherever they fall', () => {
    fc.assert(
      fc.property(barArb, fc.array(fc.nat(), { maxLength: 20 }), (bar, picks) => {
        const ostinato: DrillHit[] = picks.map((n) => {
          const beat = (n % bar.beats.length) + 1;
          return {
            beat,
            slot: n % (bar.beats[beat - 1] ?? 1),
            voice: 'hihat',
            dynamic: 'normal',
            hand: 'R',
            source: 'ostinato',
          };
        });
        return measureTension({ ...bar, hits: [...bar.hits, ...ostinato] }) === measureTension(bar);
      }),
    );
  });

  it('does not depend on voices or dynamics, only on which instants are struck', () => {
    fc.assert(
      fc.property(barArb, fc.nat(), (bar, salt) => {
        const moved = bar.hits.map((hit, i) => ({
          ...hit,
          voice: VOICE_IDS[(i + salt) % VOICE_IDS.length] ?? 'kick',
          dynamic: DYNAMICS[(i * 7 + salt) % DYNAMICS.length] ?? 'normal',
        }));
        return measureTension({ ...bar, hits: moved }) === measureTension(bar);
      }),
    );
  });

  it('gives the same value through a tension meter built once for the grid', () => {
    fc.assert(
      fc.property(barArb, (bar) => tensionMeter(bar.beats).measure(bar) === measureTension(bar)),
    );
  });

  // Tight scaling: on each common grid some onset pattern reaches exactly 1 (checked over every
  // pattern of the grid).
  it.each([[[4, 4, 4, 4]], [[3, 3, 3, 3]], [[2, 2, 2, 2]], [[6, 6]], [[4, 4, 5, 5]], [[5, 5, 5]]])(
    'reaches exactly 1 on %j and never more',
    (beats) => {
      const meter = tensionMeter(beats);
      const pulses = beats.reduce((a, b) => a + b, 0);
      let top = 0;
      for (let mask = 0; mask < 1 << pulses; mask++) {
        top = Math.max(
          top,
          meter.measureOnsets(Array.from({ length: pulses }, (_, i) => ((mask >> i) & 1) === 1)),
        );
      }
      expect(top).toBe(1);
    },
  );

  it('is 0 for a bar with only the ostinato, and for a grid that cannot syncopate', () => {
    const hit: DrillHit = {
      beat: 1,
      slot: 1,
      voice: 'hihat',
      dynamic: 'normal',
      hand: 'R',
      source: 'ostinato',
    };
    expect(measureTension({ bar: 1, beats: [4, 4, 4, 4], tension: 0, hits: [hit] })).toBe(0);
    expect(
      measureTension({ bar: 1, beats: [3], tension: 0, hits: [{ ...hit, source: 'fill' }] }),
    ).toBe(0);
  });

  it('refuses a hit outside the bar grid', () => {
    const hit: DrillHit = {
      beat: 5,
      slot: 0,
      voice: 'kick',
      dynamic: 'normal',
      hand: null,
      source: 'fill',
    };
    expect(() => measureTension({ bar: 2, beats: [4, 4, 4, 4], tension: 0, hits: [hit] })).toThrow(
      /beat 5/,
    );
  });
});
