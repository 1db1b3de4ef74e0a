import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DrillBar, DrillHit, VoiceId } from '../generator/drill';
import { buildNotation, type LayerBar, type NotationSource } from './notation-model';
import { soundingLength } from './rhythm';

const HANDS: VoiceId[] = ['hihat', 'snare', 'tomFloor'];
const FEET: VoiceId[] = ['kick', 'hihatFoot'];

function hit(beat: number, slot: number, voice: VoiceId, extra: Partial<DrillHit> = {}): DrillHit {
  const hand = FEET.includes(voice) ? null : 'R';
  return { beat, slot, voice, dynamic: 'normal', hand, source: 'fill', ...extra };
}

function drillOf(beats: number[], hits: DrillHit[], unit = 4, grouping?: number[]): NotationSource {
  const bar: DrillBar = { bar: 1, beats, tension: 0, hits };
  return {
    card: {
      meter: { beats: beats.length, unit, ...(grouping ? { grouping } : {}) },
      voices: [...HANDS, ...FEET],
    },
    bars: [bar],
  };
}

/** Random hits for a bar with the given slots per beat (one hit per voice and instant at most). */
function hitsFor(beats: number[]) {
  const instants = beats.flatMap((n, i) =>
    Array.from({ length: n }, (_, slot) => ({ beat: i + 1, slot })),
  );
  const cells = instants.flatMap((at) => [...HANDS, ...FEET].map((voice) => ({ ...at, voice })));
  return fc.subarray(cells).map((chosen) => chosen.map((c) => hit(c.beat, c.slot, c.voice)));
}

/** The events of one voice that start in `beat`, with the tuplet each stands under. */
function beatOf(layer: LayerBar, beat: number) {
  return layer.events.flatMap((event, i) =>
    event.beat === beat
      ? [{ event, tuplet: layer.tuplets.find((t) => t.events.includes(i))?.ratio ?? null }]
      : [],
  );
}

/** Ticks of a whole note: every written value under any tuplet of the model is a whole number. */
const WHOLE = 26880;

/**
 * Every event of the layer starts exactly where its beat and slot say, and the layer fills the
 * bar exactly (a whole-bar rest counts as the bar, whatever the meter).
 */
function expectTimed(layer: LayerBar, beats: readonly number[], unit: number): void {
  const barTicks = (beats.length * WHOLE) / unit;
  let t = 0;
  layer.events.forEach((event, i) => {
    const slots = beats[event.beat - 1]!;
    const start = ((event.beat - 1) * slots + event.slot) * (WHOLE / unit / slots);
    expect(t, `start of event ${i}`).toBe(start);
    const tuplet = layer.tuplets.find((x) => x.events.includes(i))?.ratio ?? null;
    const { num, den } = soundingLength(event.duration, tuplet);
    t += event.barRest ? barTicks : (WHOLE * num) / den;
  });
  expect(t).toBe(barTicks);
}

describe('buildNotation', () => {
  it('mixed [4,4,5,5]: every voice fills each beat exactly; brackets only on quintuplet beats', () => {
    fc.assert(
      fc.property(hitsFor([4, 4, 5, 5]), (hits) => {
        const model = buildNotation(drillOf([4, 4, 5, 5], hits));
        expect(model.layers).toEqual(['hands', 'feet']);
        const bar = model.bars[0]!;
        for (const beat of bar.beats) {
          for (const layer of bar.layers) {
            expectTimed(layer, [4, 4, 5, 5], 4);
            const offBeat = hits.some(
              (h) =>
                h.beat === beat.beat &&
                h.slot !== 0 &&
                (layer.layer === 'hands') === HANDS.includes(h.voice),
            );
            const expected = beat.subdivision === 5 && offBeat ? 5 : null;
            const bracket = beatOf(layer, beat.beat)[0]?.tuplet;
            expect(bracket?.numNotes ?? null).toBe(expected);
          }
        }
      }),
    );
  });

  for (let n = 1; n <= 8; n++) {
    it(`every voice fills each beat exactly in a bar of ${n} per beat`, () => {
      fc.assert(
        fc.property(hitsFor([n, n]), (hits) => {
          const bar = buildNotation(drillOf([n, n], hits)).bars[0]!;
          for (const layer of bar.layers) expectTimed(layer, [n, n], 4);
        }),
        { numRuns: 60 },
      );
    });
  }

  it('beams join each run of flagged notes in one beat, never across beats (x/4 meters)', () => {
    fc.assert(
      fc.property(hitsFor([4, 3, 6, 2]), (hits) => {
        const bar = buildNotation(drillOf([4, 3, 6, 2], hits)).bars[0]!;
        for (const layer of bar.layers) {
          const runs: number[][] = [];
          let run: number[] = [];
          layer.events.forEach((e, i) => {
            if (run.length > 0 && layer.events[run[0]!]!.beat !== e.beat) {
              runs.push(run);
              run = [];
            }
            if (e.kind === 'rest') return;
            if (e.duration.value >= 8) run.push(i);
            else {
              runs.push(run);
              run = [];
            }
          });
          runs.push(run);
          expect(layer.beams.map((b) => b.notes)).toEqual(runs.filter((r) => r.length >= 2));
          for (const beam of layer.beams) expect(beam.breaks).toEqual([]);
        }
      }),
    );
  });

  it('puts each hit as a head of the chord at its instant, in its voice layer', () => {
    fc.assert(
      fc.property(hitsFor([4, 5, 3]), (hits) => {
        const model = buildNotation(drillOf([4, 5, 3], hits));
        const written = model.bars[0]!.layers.flatMap((layer) =>
          layer.events.flatMap((e) =>
            e.heads.map((head) => `${e.beat}:${e.slot}:${head.voice}:${layer.layer}`),
          ),
        );
        const expected = hits.map(
          (h) => `${h.beat}:${h.slot}:${h.voice}:${FEET.includes(h.voice) ? 'feet' : 'hands'}`,
        );
        expect(written.sort()).toEqual(expected.sort());
      }),
    );
  });

  it('a sixteenth beat with hi-hat on 1 and & and snare on 1 is two eighths, chord first', () => {
    const model = buildNotation(
      drillOf([4], [hit(1, 0, 'hihat'), hit(1, 0, 'snare', { hand: 'L' }), hit(1, 2, 'hihat')]),
    );
    const hands = model.bars[0]!.layers[0]!;
    expect(hands.events.map((e) => [e.kind, e.duration.value])).toEqual([
      ['note', 8],
      ['note', 8],
    ]);
    expect(hands.events[0]!.heads.map((h) => h.key)).toEqual(['c/5', 'g/5/x2']);
    const feet = model.bars[0]!.layers[1]!;
    // Silent for the whole bar: one whole-bar rest (see the rests tests below).
    expect(feet.events.map((e) => [e.kind, e.duration.value, e.barRest])).toEqual([
      ['rest', 1, true],
    ]);
  });

  it('accents mark the chord, ghosts mark their own head', () => {
    const model = buildNotation(
      drillOf(
        [4],
        [hit(1, 1, 'snare', { dynamic: 'ghost' }), hit(1, 2, 'snare', { dynamic: 'accent' })],
      ),
    );
    const events = model.bars[0]!.layers[0]!.events.filter((e) => e.kind === 'note');
    expect(events[0]!.heads[0]!.ghost).toBe(true);
    expect(events[0]!.accent).toBe(false);
    expect(events[1]!.accent).toBe(true);
  });

  it('counts "1 e & a" in sixteenths and "1 & a" in triplets (common practice)', () => {
    const model = buildNotation(
      drillOf(
        [4, 3],
        [0, 1, 2, 3].map((s) => hit(1, s, 'snare')).concat([0, 1, 2].map((s) => hit(2, s, 'kick'))),
      ),
    );
    const [one, two] = model.bars[0]!.beats;
    expect(one!.counts.map((c) => c.text)).toEqual(['1', 'e', '&', 'a']);
    expect(two!.counts.map((c) => c.text)).toEqual(['2', '&', 'a']);
    expect([...one!.counts, ...two!.counts].every((c) => c.sounding)).toBe(true);
    expect(two!.sticking).toEqual([]);
  });

  it('counts every slot of the subdivision, marking the slots where nothing sounds', () => {
    // Quintuplet with hits on 1, di, mi, ti: "ka" is still counted (Hoffman, Pelto and White 1996).
    const model = buildNotation(
      drillOf(
        [5, 4],
        [0, 2, 3, 4].map((s) => hit(1, s, 'snare')),
      ),
    );
    const [one, two] = model.bars[0]!.beats;
    expect(one!.counts.map((c) => c.text)).toEqual(['1', 'ka', 'di', 'mi', 'ti']);
    expect(one!.counts.map((c) => c.sounding)).toEqual([true, false, true, true, true]);
    expect(one!.counts.map((c) => c.slot)).toEqual([0, 1, 2, 3, 4]);
    // An empty beat is counted in full, all of it silent, its number included.
    expect(two!.counts.map((c) => c.text).join(' ')).toBe('2 e & a');
    expect(two!.counts.some((c) => c.sounding)).toBe(false);
  });

  it('sticking lists both hands of a double stop, the voice higher on the staff first', () => {
    const model = buildNotation(
      drillOf([2], [hit(1, 0, 'snare', { hand: 'L' }), hit(1, 0, 'hihat', { hand: 'R' })]),
    );
    expect(model.bars[0]!.beats[0]!.sticking).toEqual([{ slot: 0, hands: ['R', 'L'] }]);
  });

  it('writes only the hands voice for a card without feet', () => {
    const source: NotationSource = {
      card: { meter: { beats: 1, unit: 4 }, voices: ['snare'] },
      bars: [{ bar: 1, beats: [4], tension: 0, hits: [hit(1, 0, 'snare')] }],
    };
    expect(buildNotation(source).layers).toEqual(['hands']);
  });

  it('lists voices in staff order from the top', () => {
    const model = buildNotation(drillOf([1], []));
    expect(model.voices).toEqual(['hihat', 'snare', 'tomFloor', 'kick', 'hihatFoot']);
  });
});

describe('buildNotation in grouped eighth meters', () => {
  /** One voice's bar as `8 8 8 | r4d` (groups split by `|`), for readable expectations. */
  function spelledBar(source: NotationSource, layer = 0): string {
    const model = buildNotation(source);
    const bar = model.bars[0]!;
    const events = bar.layers[layer]!.events;
    const groups = model.meter.grouping ?? [bar.beats.length];
    const starts = groups.map((_, g) => groups.slice(0, g).reduce((a, b) => a + b, 1));
    return events
      .map((e, i) => {
        const text = `${e.kind === 'rest' ? 'r' : ''}${e.duration.value}${e.duration.dots ? 'd' : ''}`;
        const opens = i > 0 && e.slot === 0 && starts.includes(e.beat);
        return opens ? `| ${text}` : text;
      })
      .join(' ');
  }

  const snare = (...at: [number, number][]) => at.map(([beat, slot]) => hit(beat, slot, 'snare'));
  const sixEight = (slots: number, hits: DrillHit[]) =>
    drillOf(
      Array.from({ length: 6 }, () => slots),
      hits,
      8,
    );

  it('fills in the default grouping when the card leaves it out', () => {
    expect(buildNotation(drillOf([1, 1, 1, 1, 1, 1, 1], [], 8)).meter.grouping).toEqual([2, 2, 3]);
    expect(buildNotation(sixEight(1, [])).meter.grouping).toEqual([3, 3]);
    expect(buildNotation(drillOf([4, 4, 4, 4], [])).meter.grouping).toBeNull();
    expect(buildNotation(drillOf([1, 1, 1, 1, 1, 1, 1], [], 8, [3, 2, 2])).meter.grouping).toEqual([
      3, 2, 2,
    ]);
  });

  // Common practice; E. Gould, "Behind Bars" (Faber Music 2011), beaming and rests in compound
  // time (from memory): eighths beamed by the dotted quarter, a silent dotted-quarter beat one
  // dotted-quarter rest, the first two eighths of a beat may share a quarter rest, the last two
  // may not, and notes show the dotted-quarter beat (quarter-eighth, eighth-quarter).
  it.each([
    // A silent bar: one whole-bar rest (see the rests tests).
    [[], 'r1'],
    [[1], '4d | r4d'],
    [[1, 4], '4d | 4d'],
    [[1, 2, 3, 4, 5, 6], '8 8 8 | 8 8 8'],
    [[1, 3], '4 8 | r4d'],
    [[1, 2], '8 4 | r4d'],
    [[2], 'r8 4 | r4d'],
    [[3], 'r4 8 | r4d'],
    [[2, 3, 5], 'r8 8 8 | r8 4'],
  ])('6/8 in eighths, snare on eighths %j → %s', (eighths, expected) => {
    expect(spelledBar(sixEight(1, snare(...eighths.map((b): [number, number] => [b, 0]))))).toBe(
      expected,
    );
  });

  it.each([
    [
      [
        [1, 0],
        [1, 1],
      ],
      '16 16 r8 r8 | r4d',
    ],
    [
      [
        [1, 0],
        [2, 1],
      ],
      '8d 16 r8 | r4d',
    ],
    [[[2, 1]], 'r8 r16 16 r8 | r4d'],
  ] as [[number, number][], string][])('6/8 in sixteenths, snare on %j → %s', (at, expected) => {
    expect(spelledBar(sixEight(2, snare(...at)))).toBe(expected);
  });

  it('beams 6/8 and 12/8 eighths in threes, never as single flagged eighths', () => {
    const all = (n: number) =>
      drillOf(
        Array.from({ length: n }, () => 1),
        Array.from({ length: n }, (_, b) => hit(b + 1, 0, 'hihat')),
        8,
      );
    for (const n of [6, 12]) {
      const hands = buildNotation(all(n)).bars[0]!.layers[0]!;
      expect(hands.events.every((e) => e.kind === 'note' && e.duration.value === 8)).toBe(true);
      expect(hands.beams.map((b) => b.notes)).toEqual(
        Array.from({ length: n / 3 }, (_, g) => [3 * g, 3 * g + 1, 3 * g + 2]),
      );
    }
  });

  it('beams 7/8 as 2+2+3, 5/8 as 3+2 and 15/8 in five threes: the beams show the grouping', () => {
    const beamed = (n: number, grouping?: number[]) =>
      buildNotation(
        drillOf(
          Array.from({ length: n }, () => 1),
          Array.from({ length: n }, (_, b) => hit(b + 1, 0, 'hihat')),
          8,
          grouping,
        ),
      )
        .bars[0]!.layers[0]!.beams.map((b) => b.notes.length)
        .join('+');
    expect(beamed(7)).toBe('2+2+3');
    expect(beamed(7, [3, 2, 2])).toBe('3+2+2');
    expect(beamed(5)).toBe('3+2');
    expect(beamed(15)).toBe('3+3+3+3+3');
    expect(beamed(3)).toBe('3');
  });

  it('breaks the sixteenth beams of a dotted quarter at each eighth, not those of a two-group', () => {
    const sixteenths = (n: number, grouping?: number[]) =>
      buildNotation(
        drillOf(
          Array.from({ length: n }, () => 2),
          Array.from({ length: 2 * n }, (_, i) => hit(Math.floor(i / 2) + 1, i % 2, 'snare')),
          8,
          grouping,
        ),
      ).bars[0]!.layers[0]!.beams;
    expect(sixteenths(6)).toEqual([
      { notes: [0, 1, 2, 3, 4, 5], breaks: [1, 3] },
      { notes: [6, 7, 8, 9, 10, 11], breaks: [1, 3] },
    ]);
    const seven = sixteenths(7);
    expect(seven.map((b) => b.breaks)).toEqual([[], [], [1, 3]]);
  });

  it('spells a group holding tuplets beat by beat, with its brackets', () => {
    const model = buildNotation(
      drillOf([3, 3, 3, 1, 1, 1], [hit(1, 1, 'snare'), hit(4, 0, 'snare')], 8, [3, 3]),
    );
    const hands = model.bars[0]!.layers[0]!;
    expect(hands.tuplets.map((t) => t.events.map((i) => hands.events[i]!.beat))).toEqual([[1, 1]]);
    expect(spelledBar(drillOf([3, 3, 3, 1, 1, 1], [hit(4, 0, 'snare')], 8, [3, 3]))).toBe(
      'r8 r8 r8 | 4d',
    );
  });

  it('fills every beat exactly and writes every hit, on any grouping', () => {
    const grouped = fc
      .array(fc.integer({ min: 1, max: 4 }), { minLength: 1, maxLength: 4 })
      .chain((grouping) =>
        fc.record({
          grouping: fc.constant(grouping),
          slots: fc.constantFrom(1, 2, 4),
          unit: fc.constantFrom(8, 16),
        }),
      );
    // The struck slots are the set bits of `seed` (kick on every third slot, snare elsewhere).
    fc.assert(
      fc.property(grouped, fc.nat(), ({ grouping, slots, unit }, seed) => {
        const n = grouping.reduce((a, b) => a + b, 0);
        const beats = Array.from({ length: n }, () => slots);
        const hits = Array.from({ length: n * slots }, (_, i) => i)
          .filter((i) => ((seed >> (i % 30)) & 1) === 1)
          .map((i) => hit(Math.floor(i / slots) + 1, i % slots, i % 3 === 0 ? 'kick' : 'snare'));
        const model = buildNotation(drillOf(beats, hits, unit, grouping));
        const bar = model.bars[0]!;
        for (const layer of bar.layers) {
          expectTimed(layer, beats, unit);
          // Beams stay inside one group.
          const groupOf = (beat: number) => {
            let end = 0;
            return grouping.findIndex((g) => (end += g) >= beat);
          };
          for (const beam of layer.beams)
            expect(new Set(beam.notes.map((i) => groupOf(layer.events[i]!.beat))).size).toBe(1);
        }
        const written = bar.layers.flatMap((layer) =>
          layer.events.flatMap((e) => e.heads.map((h) => `${e.beat}:${e.slot}:${h.voice}`)),
        );
        expect(written.sort()).toEqual(hits.map((h) => `${h.beat}:${h.slot}:${h.voice}`).sort());
      }),
      { numRuns: 300 },
    );
  });

  it('counts 6/8 by dotted quarters and 7/8 by groups (see counting.spec.ts for sources)', () => {
    const counts = (source: NotationSource) =>
      buildNotation(source)
        .bars[0]!.beats.flatMap((b) => b.counts.map((c) => (c.strong ? `[${c.text}]` : c.text)))
        .join(' ');
    expect(counts(sixEight(1, []))).toBe('[1] & a [2] & a');
    expect(counts(drillOf([1, 1, 1, 1, 1, 1, 1], [], 8))).toBe('[1] 2 [1] 2 [1] 2 3');
  });
});
