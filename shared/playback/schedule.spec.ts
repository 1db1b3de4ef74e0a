import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { VOICE_IDS, type DrillBar, type DrillHit, type VoiceId } from '../generator/drill';
import {
  addFractions,
  fraction,
  isNearestDouble,
  scaleFraction,
  type BigFraction,
} from './exact-double.testing';
import { cursorAt } from './position';
import { compareRational } from './rational';
import {
  compareEvents,
  countInEvents,
  loopEvents,
  loopShape,
  scheduleDrill,
  type PlayableDrill,
  type ScheduleOptions,
} from './schedule';

function hit(beat: number, slot: number, voice: VoiceId = 'kick'): DrillHit {
  return {
    beat,
    slot,
    voice,
    dynamic: 'normal',
    hand: voice === 'kick' ? null : 'R',
    source: 'fill',
  };
}

/** A bar with one hit of `voice` on every slot of every beat. */
function everySlotBar(bar: number, beats: readonly number[], voice: VoiceId = 'kick'): DrillBar {
  const hits = beats.flatMap((slots, b) =>
    Array.from({ length: slots }, (_, s) => hit(b + 1, s, voice)),
  );
  return { bar, beats, tension: 0, hits };
}

function options(overrides: Partial<ScheduleOptions> = {}): ScheduleOptions {
  return {
    tempo: 120,
    range: null,
    countIn: false,
    metronome: { enabled: false, accentFirstBeat: false, subdivisions: false },
    mute: new Set(),
    solo: new Set(),
    ...overrides,
  };
}

/**
 * Ideal onset times by walking the grid slot by slot and adding each slot's exact length
 * (a BigInt fraction): a different route from the per-event formula under test.
 */
function idealHitTimes(drill: PlayableDrill, tempo: number, loops: number, countInBeats: number) {
  const times: BigFraction[] = [];
  let beats = fraction(countInBeats);
  for (let loop = 0; loop < loops; loop += 1) {
    for (const bar of drill.bars) {
      bar.beats.forEach((slots, b) => {
        for (let slot = 0; slot < slots; slot += 1) {
          if (bar.hits.some((h) => h.beat === b + 1 && h.slot === slot)) {
            times.push(scaleFraction(beats, 60, tempo));
          }
          beats = addFractions(beats, fraction(1, slots));
        }
      });
    }
  }
  return times;
}

describe('scheduleDrill timing', () => {
  const quintuplets: PlayableDrill = {
    bars: [everySlotBar(1, [5, 5, 5, 5]), everySlotBar(2, [5, 5, 5, 5])],
  };
  const septuplets: PlayableDrill = {
    bars: [everySlotBar(1, [7, 7, 7, 7]), everySlotBar(2, [7, 7, 7])],
  };
  const mixed: PlayableDrill = {
    bars: [everySlotBar(1, [5, 7, 3, 8, 6]), everySlotBar(2, [7, 5])],
  };

  for (const [name, drill] of [
    ['quintuplets', quintuplets],
    ['septuplets', septuplets],
    ['mixed', mixed],
  ] as const) {
    for (const tempo of [40, 97, 300]) {
      it(`places ${name} at ${tempo} BPM on the nearest double to the exact time`, () => {
        const loops = 7;
        const events = scheduleDrill(drill, options({ tempo, countIn: true }), loops);
        const hits = events.filter((e) => e.kind === 'hit');
        const countIn = drill.bars[0]!.beats.length;
        const ideal = idealHitTimes(drill, tempo, loops, countIn);
        expect(hits).toHaveLength(ideal.length);
        hits.forEach((event, i) => {
          const exact = ideal[i]!;
          expect(
            isNearestDouble(event.time, exact.num, exact.den),
            `${event.time} vs ${exact.num}/${exact.den}`,
          ).toBe(true);
        });
      });
    }
  }

  it('matches note lengths from the identity ms = 60000 / (BPM × notes per beat)', () => {
    // 120 BPM quintuplet sixteenths last 100 ms; 140 BPM septuplets 61.22 ms (derived identity).
    const five = scheduleDrill(quintuplets, options({ tempo: 120 })).filter(
      (e) => e.kind === 'hit',
    );
    expect(five[1]!.time).toBe(0.1);
    expect(five[7]!.time).toBe(0.7);
    const seven = scheduleDrill(septuplets, options({ tempo: 140 })).filter(
      (e) => e.kind === 'hit',
    );
    expect(seven[1]!.time * 1000).toBeCloseTo(61.22, 2);
    // Bar 2 of the quintuplet drill starts after 4 beats: 2 s at 120 BPM.
    expect(five.find((e) => e.bar === 2)!.time).toBe(2);
  });
});

describe('count-in and loops', () => {
  const drill: PlayableDrill = {
    bars: [
      everySlotBar(1, [4, 4, 4, 4]),
      { bar: 2, beats: [2, 2, 2], tension: 0, hits: [hit(1, 0), hit(3, 1, 'snare')] },
      { bar: 3, beats: [3, 3, 3, 3, 3], tension: 0, hits: [hit(5, 2)] },
    ],
  };

  it("plays one bar of clicks, as long as the loop's first bar, before the drill", () => {
    const shape = loopShape(drill, { from: 2, to: 3 }, true);
    expect(shape.countInBeats).toBe(3);
    expect(shape.lengthBeats).toBe(8);
    const clicks = countInEvents(shape, 60);
    expect(clicks.map((c) => c.time)).toEqual([0, 1, 2]);
    expect(clicks.map((c) => c.clickRole)).toEqual(['downbeat', 'beat', 'beat']);
    const first = scheduleDrill(
      drill,
      options({ tempo: 60, range: { from: 2, to: 3 }, countIn: true }),
    ).find((e) => e.kind === 'hit');
    expect(first).toMatchObject({ bar: 2, beat: 1, slot: 0, time: 3 });
  });

  it('offsets loop k by k × the loop length, exactly', () => {
    const tempo = 97;
    const events = scheduleDrill(
      drill,
      options({ tempo, range: { from: 2, to: 3 }, countIn: true }),
      200,
    );
    const last = events.filter((e) => e.loop === 199 && e.kind === 'hit');
    // Snare on the "&" of 3 in bar 2 and kick on the last triplet of beat 5 in bar 3, loop 199:
    // (3 + 199·8 + 2 + 1/2) beats and (3 + 199·8 + 3 + 4 + 2/3) beats at 97 BPM.
    expect(last.map((e) => e.voice)).toEqual(['kick', 'snare', 'kick']);
    expect(
      isNearestDouble(last[1]!.time, BigInt((2 * (3 + 199 * 8 + 2) + 1) * 60), BigInt(2 * 97)),
    ).toBe(true);
    expect(
      isNearestDouble(last[2]!.time, BigInt((3 * (3 + 199 * 8 + 7) + 2) * 60), BigInt(3 * 97)),
    ).toBe(true);
  });

  it('refuses a bar range outside the drill', () => {
    expect(() => loopShape(drill, { from: 0, to: 2 }, false)).toThrow(/from 1 to 3/);
    expect(() => loopShape(drill, { from: 3, to: 2 }, false)).toThrow(/not after/);
  });
});

describe('metronome, dynamics, mute and solo', () => {
  const drill: PlayableDrill = {
    bars: [
      {
        bar: 1,
        beats: [5, 3],
        tension: 0,
        hits: [
          { ...hit(1, 0, 'hihat'), dynamic: 'accent' },
          { ...hit(1, 2, 'snare'), dynamic: 'ghost' },
          hit(2, 0, 'kick'),
        ],
      },
    ],
  };
  const metronome = { enabled: true, accentFirstBeat: true, subdivisions: false };

  it('clicks on every beat, accenting beat 1 when asked', () => {
    const clicks = scheduleDrill(drill, options({ metronome })).filter((e) => e.kind === 'click');
    expect(clicks.map((c) => [c.beat, c.slot, c.velocity])).toEqual([
      [1, 0, 1],
      [2, 0, 0.8],
    ]);
    const plain = scheduleDrill(
      drill,
      options({ metronome: { ...metronome, accentFirstBeat: false } }),
    );
    expect(plain.filter((e) => e.kind === 'click').map((c) => c.velocity)).toEqual([0.8, 0.8]);
  });

  it('adds a click on every subdivision when asked', () => {
    const clicks = scheduleDrill(
      drill,
      options({ metronome: { ...metronome, subdivisions: true } }),
    ).filter((e) => e.kind === 'click');
    expect(clicks).toHaveLength(8);
    expect(clicks.filter((c) => c.clickRole === 'subdivision')).toHaveLength(6);
  });

  it('keeps count-in clicks when the metronome is off', () => {
    const events = scheduleDrill(drill, options({ countIn: true }));
    expect(events.filter((e) => e.kind === 'click').map((e) => e.loop)).toEqual([-1, -1]);
  });

  it('sets velocity from the dynamic: ghost < normal < accent', () => {
    const hits = scheduleDrill(drill, options()).filter((e) => e.kind === 'hit');
    const byVoice = Object.fromEntries(hits.map((h) => [h.voice, h.velocity]));
    expect(byVoice['snare']).toBeLessThan(byVoice['kick']!);
    expect(byVoice['kick']).toBeLessThan(byVoice['hihat']!);
    expect(hits.map((h) => h.midiNote)).toEqual([42, 38, 36]);
  });

  it('silences muted voices, and everything but the soloed ones', () => {
    const voices = (o: Partial<ScheduleOptions>) =>
      scheduleDrill(drill, options(o))
        .filter((e) => e.kind === 'hit')
        .map((e) => e.voice);
    expect(voices({ mute: new Set(['snare']) })).toEqual(['hihat', 'kick']);
    expect(voices({ solo: new Set(['snare', 'kick']) })).toEqual(['snare', 'kick']);
    expect(voices({ solo: new Set(['snare']), mute: new Set(['snare']) })).toEqual([]);
  });
});

const barArbitrary = fc
  .array(fc.integer({ min: 1, max: 8 }), { minLength: 1, maxLength: 7 })
  .chain((beats) =>
    fc
      .uniqueArray(
        fc.record({
          beat: fc.integer({ min: 1, max: beats.length }),
          slot: fc.nat({ max: 7 }),
          voice: fc.constantFrom(...VOICE_IDS),
        }),
        { selector: (h) => `${h.beat}/${h.slot}/${h.voice}`, maxLength: 24 },
      )
      .map((raw) => ({
        beats,
        hits: raw
          .filter((h) => h.slot < beats[h.beat - 1]!)
          .map((h) => ({ ...hit(h.beat, h.slot, h.voice), dynamic: 'accent' as const })),
      })),
  );

describe('schedule properties', () => {
  it('returns events sorted in time with non-decreasing seconds', () => {
    fc.assert(
      fc.property(
        fc.array(barArbitrary, { minLength: 1, maxLength: 5 }),
        fc.integer({ min: 20, max: 320 }),
        fc.boolean(),
        fc.boolean(),
        fc.integer({ min: 1, max: 4 }),
        (bars, tempo, countIn, subdivisions, loops) => {
          const drill = { bars: bars.map((b, i) => ({ bar: i + 1, tension: 0, ...b })) };
          const metronome = { enabled: true, accentFirstBeat: true, subdivisions };
          const events = scheduleDrill(drill, options({ tempo, countIn, metronome }), loops);
          for (let i = 1; i < events.length; i += 1) {
            expect(compareEvents(events[i - 1]!, events[i]!)).toBeLessThanOrEqual(0);
            expect(events[i]!.time).toBeGreaterThanOrEqual(events[i - 1]!.time);
            if (compareRational(events[i - 1]!.at, events[i]!.at) < 0) {
              expect(events[i]!.time).toBeGreaterThan(events[i - 1]!.time);
            }
          }
          const hitCount = drill.bars.reduce((n, b) => n + b.hits.length, 0) * loops;
          expect(events.filter((e) => e.kind === 'hit')).toHaveLength(hitCount);
        },
      ),
    );
  });
});

describe('swing', () => {
  const card = (unit: 8 | 16, ratio: number, meterUnit = 4) => ({
    meter: { unit: meterUnit },
    swing: { unit, ratio },
  });
  const hitTimes = (drill: PlayableDrill, o: Partial<ScheduleOptions> = {}, loops = 1) =>
    scheduleDrill(drill, options(o), loops).filter((e) => e.kind === 'hit');
  const eighths: DrillBar = everySlotBar(1, [2, 2, 2, 2], 'ride');

  it('plays a ratio of 0.5 exactly as straight, in every meter', () => {
    fc.assert(
      fc.property(
        fc.array(barArbitrary, { minLength: 1, maxLength: 4 }),
        fc.constantFrom(8, 16) as fc.Arbitrary<8 | 16>,
        fc.constantFrom(2, 4, 8),
        (bars, unit, meterUnit) => {
          const drill = { bars: bars.map((b, i) => ({ bar: i + 1, tension: 0, ...b })) };
          const metronome = { enabled: true, accentFirstBeat: true, subdivisions: true };
          const straight = scheduleDrill(drill, options({ metronome }), 2);
          const swung = scheduleDrill(
            { ...drill, card: card(unit, 0.5, meterUnit) },
            options({ metronome }),
            2,
          );
          expect(swung).toEqual(straight);
        },
      ),
      { numRuns: Math.min(200, Number(process.env['FC_RUNS'] ?? 200)) },
    );
  });

  it('puts the swung "&" (ratio 0.6667) on the third note of the triplet, to the double', () => {
    // The same groove written as triplets with the middle note left out.
    const triplets: PlayableDrill = {
      bars: [
        {
          bar: 1,
          beats: [3, 3, 3, 3],
          tension: 0,
          hits: [1, 2, 3, 4].flatMap((b) => [hit(b, 0, 'ride'), hit(b, 2, 'ride')]),
        },
      ],
    };
    for (const tempo of [60, 97, 240]) {
      const swung = hitTimes({ bars: [eighths], card: card(8, 0.6667) }, { tempo }, 3);
      const written = hitTimes(triplets, { tempo }, 3);
      expect(swung.map((e) => e.at)).toEqual(written.map((e) => e.at));
      expect(swung.map((e) => e.time)).toEqual(written.map((e) => e.time));
    }
    // At 60 BPM the "&" of beat 1 sounds at 2/3 s: on the nearest double.
    const and = hitTimes({ bars: [eighths], card: card(8, 0.6667) }, { tempo: 60 })[1]!;
    expect(isNearestDouble(and.time, 2n, 3n)).toBe(true);
  });

  it('swings sixteenth pairs: "e" and "a" move, the "&" stays', () => {
    const sixteenths: PlayableDrill = {
      bars: [everySlotBar(1, [4, 4, 4, 4], 'hihat')],
      card: card(16, 0.6),
    };
    const beat2 = hitTimes(sixteenths, { tempo: 100 }).filter((e) => e.beat === 2);
    // Beat 2 starts 1 beat in; a sixteenth pair lasts 1/2 beat, its long note 0.6 of it.
    expect(beat2.map((e) => `${e.at.num}/${e.at.den}`)).toEqual(['1/1', '13/10', '3/2', '9/5']);
    // 13/10 beats at 100 BPM = 13·60 / (10·100) s.
    expect(isNearestDouble(beat2[1]!.time, 13n * 60n, 1000n)).toBe(true);
    // In 6/8 a sixteenth pair is one eighth beat: its second sixteenth moves.
    const sixEight = hitTimes({
      bars: [everySlotBar(1, [2, 2, 2, 2, 2, 2])],
      card: card(16, 0.6, 8),
    });
    expect(sixEight.slice(0, 4).map((e) => `${e.at.num}/${e.at.den}`)).toEqual([
      '0/1',
      '3/5',
      '1/1',
      '8/5',
    ]);
  });

  it('places a 32nd inside a swung pair by linear interpolation within its half', () => {
    const thirtySeconds: PlayableDrill = {
      bars: [{ bar: 1, beats: [8, 8], tension: 0, hits: [hit(2, 1), hit(2, 2), hit(2, 3)] }],
      card: card(16, 0.6667),
    };
    // Beat 2, slots 1–3: 1 + 1/6, 1 + 1/3 (the swung "e"), 1 + 5/12.
    expect(hitTimes(thirtySeconds).map((e) => `${e.at.num}/${e.at.den}`)).toEqual([
      '7/6',
      '4/3',
      '17/12',
    ]);
  });

  it('swings the subdivision clicks with the hits and leaves tuplet beats alone', () => {
    const drill: PlayableDrill = {
      bars: [{ bar: 1, beats: [2, 3, 6], tension: 0, hits: [hit(1, 1), hit(2, 1), hit(3, 3)] }],
      card: card(8, 0.6667),
    };
    const metronome = { enabled: true, accentFirstBeat: false, subdivisions: true };
    const events = scheduleDrill(drill, options({ metronome }));
    const at = (kind: 'hit' | 'click') =>
      events.filter((e) => e.kind === kind).map((e) => `${e.at.num}/${e.at.den}`);
    expect(at('hit')).toEqual(['2/3', '4/3', '5/2']);
    // Beat 1 swung; beat 2 (triplets) and beat 3 (sextuplets) as written.
    expect(at('click')).toEqual([
      '0/1',
      '2/3',
      '1/1',
      '4/3',
      '5/3',
      '2/1',
      '13/6',
      '7/3',
      '5/2',
      '8/3',
      '17/6',
    ]);
  });

  it('keeps every swung event inside its beat, in order, so the cursor shows the written beat', () => {
    fc.assert(
      fc.property(
        fc.array(barArbitrary, { minLength: 1, maxLength: 4 }),
        fc.constantFrom(8, 16) as fc.Arbitrary<8 | 16>,
        fc.integer({ min: 5000, max: 7500 }),
        fc.boolean(),
        (bars, unit, tenThousandths, countIn) => {
          const drill = {
            bars: bars.map((b, i) => ({ bar: i + 1, tension: 0, ...b })),
            card: card(unit, tenThousandths / 10_000),
          };
          const metronome = { enabled: true, accentFirstBeat: true, subdivisions: true };
          const shape = loopShape(drill, null, countIn);
          const events = scheduleDrill(drill, options({ metronome, countIn }), 2);
          for (let i = 1; i < events.length; i += 1) {
            expect(compareEvents(events[i - 1]!, events[i]!)).toBeLessThanOrEqual(0);
          }
          for (const event of events.filter((e) => e.loop >= 0)) {
            const position = cursorAt(shape, event.at.num / event.at.den);
            expect(position).toEqual({
              phase: 'drill',
              loop: event.loop,
              bar: event.bar,
              beat: event.beat,
            });
          }
        },
      ),
      { numRuns: Math.min(200, Number(process.env['FC_RUNS'] ?? 200)) },
    );
  });

  it('stays exact far into a long run with a fine ratio', () => {
    // 0.5813 reads as 93/160; pass 40 000 of a 4-beat loop starts 160 000 beats in.
    const drill: PlayableDrill = {
      bars: [{ ...eighths, beats: [4, 4, 4, 4] }],
      card: card(16, 0.5813),
    };
    const shape = loopShape(drill, null, false);
    const far = loopEvents(shape, 97, 40_000).filter((e) => e.kind === 'hit');
    // Slot 1 of beat 1: 160 000 + (93/160) / 2 beats.
    const [num, den] = [160_000n * 320n + 93n, 320n];
    expect(isNearestDouble(far[1]!.time, num * 60n, den * 97n)).toBe(true);
    expect(far[1]!.time).toBeLessThan(far[2]!.time);
  });
});
