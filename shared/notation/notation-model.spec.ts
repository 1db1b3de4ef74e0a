import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DrillBar, DrillHit, VoiceId } from '../generator/drill';
import { buildNotation, type LayerBeat, type NotationSource } from './notation-model';
import { soundingLength } from './rhythm';

const HANDS: VoiceId[] = ['hihat', 'snare', 'tomFloor'];
const FEET: VoiceId[] = ['kick', 'hihatFoot'];

function hit(beat: number, slot: number, voice: VoiceId, extra: Partial<DrillHit> = {}): DrillHit {
  const hand = FEET.includes(voice) ? null : 'R';
  return { beat, slot, voice, dynamic: 'normal', hand, source: 'fill', ...extra };
}

function drillOf(beats: number[], hits: DrillHit[], unit = 4): NotationSource {
  const bar: DrillBar = { bar: 1, beats, tension: 0, hits };
  return {
    card: { meter: { beats: beats.length, unit }, voices: [...HANDS, ...FEET] },
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

/** Exact sounding length of one voice's beat, as `num/den` of a whole note. */
function layerLength(layer: LayerBeat): string {
  let num = 0;
  let den = 1;
  for (const e of layer.events) {
    const part = soundingLength(e.duration, layer.tuplet);
    num = num * part.den + part.num * den;
    den *= part.den;
    const g = gcd(num, den);
    [num, den] = [num / g, den / g];
  }
  return `${num}/${den}`;
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

describe('buildNotation', () => {
  it('mixed [4,4,5,5]: every voice fills each beat exactly; brackets only on quintuplet beats', () => {
    fc.assert(
      fc.property(hitsFor([4, 4, 5, 5]), (hits) => {
        const model = buildNotation(drillOf([4, 4, 5, 5], hits));
        expect(model.layers).toEqual(['hands', 'feet']);
        for (const beat of model.bars[0]!.beats) {
          for (const layer of beat.layers) {
            expect(layerLength(layer)).toBe('1/4');
            const offBeat = hits.some(
              (h) =>
                h.beat === beat.beat &&
                h.slot !== 0 &&
                (layer.layer === 'hands') === HANDS.includes(h.voice),
            );
            const expected = beat.subdivision === 5 && offBeat ? 5 : null;
            expect(layer.tuplet?.numNotes ?? null).toBe(expected);
          }
        }
      }),
    );
  });

  for (let n = 1; n <= 8; n++) {
    it(`every voice fills each beat exactly in a bar of ${n} per beat`, () => {
      fc.assert(
        fc.property(hitsFor([n, n]), (hits) => {
          const model = buildNotation(drillOf([n, n], hits));
          for (const beat of model.bars[0]!.beats) {
            for (const layer of beat.layers) expect(layerLength(layer)).toBe('1/4');
          }
        }),
        { numRuns: 60 },
      );
    });
  }

  it('beams group the flagged notes of one beat, never across beats', () => {
    fc.assert(
      fc.property(hitsFor([4, 3, 6, 2]), (hits) => {
        const model = buildNotation(drillOf([4, 3, 6, 2], hits));
        for (const beat of model.bars[0]!.beats) {
          for (const layer of beat.layers) {
            const flagged = layer.events.flatMap((e, i) =>
              e.kind === 'note' && e.duration.value >= 8 ? [i] : [],
            );
            expect(layer.beam).toEqual(flagged.length >= 2 ? flagged : []);
          }
        }
      }),
    );
  });

  it('puts each hit as a head of the chord at its instant, in its voice layer', () => {
    fc.assert(
      fc.property(hitsFor([4, 5, 3]), (hits) => {
        const model = buildNotation(drillOf([4, 5, 3], hits));
        const written = model.bars[0]!.beats.flatMap((beat) =>
          beat.layers.flatMap((layer) =>
            layer.events.flatMap((e) =>
              e.heads.map((head) => `${beat.beat}:${e.slot}:${head.voice}:${layer.layer}`),
            ),
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
    const hands = model.bars[0]!.beats[0]!.layers[0]!;
    expect(hands.events.map((e) => [e.kind, e.duration.value])).toEqual([
      ['note', 8],
      ['note', 8],
    ]);
    expect(hands.events[0]!.heads.map((h) => h.key)).toEqual(['c/5', 'g/5/x2']);
    const feet = model.bars[0]!.beats[0]!.layers[1]!;
    expect(feet.events.map((e) => [e.kind, e.duration.value])).toEqual([['rest', 4]]);
  });

  it('accents mark the chord, ghosts mark their own head', () => {
    const model = buildNotation(
      drillOf(
        [4],
        [hit(1, 1, 'snare', { dynamic: 'ghost' }), hit(1, 2, 'snare', { dynamic: 'accent' })],
      ),
    );
    const events = model.bars[0]!.beats[0]!.layers[0]!.events.filter((e) => e.kind === 'note');
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
