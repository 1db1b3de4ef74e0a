import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { soundingLength, spellBeat, spellGroup, type BeatRhythm } from './rhythm';

/** Exact sum of the events' sounding lengths, as num/den of a whole note. */
function beatLength(rhythm: Pick<BeatRhythm, 'events'> & { tuplet?: BeatRhythm['tuplet'] }): {
  num: number;
  den: number;
} {
  let num = 0;
  let den = 1;
  for (const event of rhythm.events) {
    const part = soundingLength(event.duration, rhythm.tuplet ?? null);
    num = num * part.den + part.num * den;
    den *= part.den;
    const g = gcd(num, den);
    num /= g;
    den /= g;
  }
  return { num, den };
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** Written spelling as `8 8` / `8d 16` / `r16 8` for readable expectations. */
function spelled(rhythm: Pick<BeatRhythm, 'events'>): string {
  return rhythm.events
    .map((e) => `${e.kind === 'rest' ? 'r' : ''}${e.duration.value}${e.duration.dots ? 'd' : ''}`)
    .join(' ');
}

const onsetSets = (subdivision: number) =>
  fc.uniqueArray(fc.integer({ min: 0, max: subdivision - 1 }), { maxLength: subdivision });

describe('spellBeat: durations', () => {
  for (let subdivision = 1; subdivision <= 8; subdivision++) {
    it(`sum exactly to the beat for any hits in a beat of ${subdivision}`, () => {
      fc.assert(
        fc.property(onsetSets(subdivision), fc.constantFrom(2, 4, 8), (onsets, unit) => {
          const rhythm = spellBeat(subdivision, onsets, unit);
          expect(beatLength(rhythm)).toEqual({ num: 1, den: unit });
        }),
      );
    });

    it(`put a note at every hit and nowhere else in a beat of ${subdivision}`, () => {
      fc.assert(
        fc.property(onsetSets(subdivision), (onsets) => {
          const rhythm = spellBeat(subdivision, onsets, 4);
          const factor = subdivision / rhythm.grid;
          const noteSlots = rhythm.events
            .filter((e) => e.kind === 'note')
            .map((e) => e.gridSlot * factor);
          expect(noteSlots).toEqual([...onsets].sort((a, b) => a - b));
          // Events follow one another without gaps or overlaps on the written grid.
          let at = 0;
          for (const event of rhythm.events) {
            expect(event.gridSlot).toBe(at);
            at += event.length;
          }
          expect(at).toBe(rhythm.grid);
        }),
      );
    });
  }

  it('brackets exactly the grids of 3, 5, 6 and 7 with their number (2, 4, 8 need none)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 8 }).chain((n) => fc.tuple(fc.constant(n), onsetSets(n))),
        ([n, onsets]) => {
          const rhythm = spellBeat(n, onsets, 4);
          if ([3, 5, 6, 7].includes(rhythm.grid)) {
            expect(rhythm.tuplet?.numNotes).toBe(rhythm.grid);
            expect(rhythm.tuplet?.notesOccupied).toBe(rhythm.grid === 3 ? 2 : 4);
          } else {
            expect(rhythm.tuplet).toBeNull();
          }
        },
      ),
    );
  });
});

describe('spellBeat: simplest readable spelling (common practice)', () => {
  const cases: [number, number[], string][] = [
    [4, [0, 1, 2, 3], '16 16 16 16'],
    [4, [0, 2], '8 8'],
    [4, [0, 3], '8d 16'],
    [4, [0, 1, 3], '16 8 16'],
    [4, [0, 1], '16 8d'],
    [4, [2], 'r8 8'],
    [4, [3], 'r8 r16 16'],
    [4, [0], '4'],
    [4, [], 'r4'],
    [2, [1], 'r8 8'],
    [3, [0, 2], '4 8'],
    [3, [1], 'r8 4'],
    // Quintuplets and septuplets in their grid value, their neighbouring rests combined by the
    // tuplet's own grid (E. Gould, "Behind Bars", Faber Music 2011, ch. "Tuplets"; from memory).
    [5, [0, 2, 4], '16 r16 16 r16 16'],
    [5, [0, 2, 3], '16 r16 16 16 r16'],
    [5, [1, 3], 'r16 16 r16 16 r16'],
    // Its rests combine inside its 2+3 (or 3+2) groups, never across them (Gould, ch.
    // "Tuplets", from memory; a three-sixteenth group's sixteenth and eighth rest: common
    // practice).
    [5, [0, 3], '16 r8 16 r16'],
    [5, [0, 2], '16 r16 16 r8'],
    [5, [0, 1, 3], '16 16 r16 16 r16'],
    [5, [0, 4], '16 r16 r8 16'],
    [5, [1], 'r16 16 r8 r16'],
    [6, [0, 3], '8 8'],
    [6, [0, 2, 4], '8 8 8'],
    [6, [0, 1, 2, 3, 4, 5], '16 16 16 16 16 16'],
    [7, [0, 6], '16 r16 r8 r8 16'],
    [5, [0, 1], '16 16 r8 r16'],
    // Never a quarter rest under the 5 or the 7 (it would read as a whole beat): eighths at most.
    [5, [4], 'r8 r8 16'],
    [5, [], 'r4'],
    [7, [4], 'r8 r8 16 r16 r16'],
    [7, [0], '4'],
    [6, [0, 1, 3], '16 16 r16 16 r16 r16'],
    [8, [0, 4], '8 8'],
    [8, [0, 3, 4, 6], '16d 32 16 16'],
  ];
  for (const [n, onsets, expected] of cases) {
    it(`${n} per beat, hits on ${onsets.join(',') || 'none'} → ${expected}`, () => {
      expect(spelled(spellBeat(n, onsets, 4))).toBe(expected);
    });
  }

  it('keeps the bracket only where the notes need it', () => {
    expect(spellBeat(6, [0, 2, 4], 4).tuplet).toEqual({ numNotes: 3, notesOccupied: 2 });
    expect(spellBeat(6, [0, 3], 4).tuplet).toBeNull();
    expect(spellBeat(5, [0], 4).tuplet).toBeNull();
    expect(spellBeat(5, [0, 2], 4).tuplet).toEqual({ numNotes: 5, notesOccupied: 4 });
  });

  it('writes the beat in its own value: eighths in a half-note beat are quarters', () => {
    expect(spelled(spellBeat(2, [0, 1], 2))).toBe('4 4');
    expect(spelled(spellBeat(4, [0, 2], 8))).toBe('16 16');
  });
});

describe('spellGroup: a group of a grouped eighth meter as one unit', () => {
  const groupCase = fc
    .record({
      beats: fc.integer({ min: 1, max: 4 }),
      slots: fc.constantFrom(1, 2, 4, 8),
      unit: fc.constantFrom(8, 16),
    })
    .chain((g) =>
      fc.record({
        beats: fc.constant(g.beats),
        slots: fc.constant(g.slots),
        unit: fc.constant(g.unit),
        onsets: fc.uniqueArray(fc.integer({ min: 0, max: g.beats * g.slots - 1 }), {
          maxLength: g.beats * g.slots,
        }),
      }),
    );

  it('fills the group exactly, with a note at every hit and nowhere else', () => {
    fc.assert(
      fc.property(groupCase, ({ beats, slots, unit, onsets }) => {
        const rhythm = spellGroup(beats, slots, onsets, unit);
        const g = gcd(beats, unit);
        expect(beatLength(rhythm)).toEqual({ num: beats / g, den: unit / g });
        const factor = slots / rhythm.grid;
        expect(
          rhythm.events.filter((e) => e.kind === 'note').map((e) => e.gridSlot * factor),
        ).toEqual([...onsets].sort((a, b) => a - b));
        let at = 0;
        for (const event of rhythm.events) {
          expect(event.gridSlot).toBe(at);
          at += event.length;
        }
        expect(at).toBe(beats * rhythm.grid);
      }),
    );
  });

  // Common practice; E. Gould, "Behind Bars" (Faber Music 2011), rests in compound time (from
  // memory): a whole dotted-quarter rest, a quarter rest for the first two eighths of a beat,
  // never for the last two.
  it.each([
    [3, 1, [], 'r4d'],
    [3, 1, [2], 'r4 8'],
    [3, 2, [0, 1], '16 16 r8 r8'],
    [3, 2, [0, 3], '8d 16 r8'],
    [2, 1, [], 'r4'],
    [2, 1, [1], 'r8 8'],
    [4, 1, [3], 'r4 r8 8'],
    [4, 1, [1], 'r8 8 r4'],
  ] as [number, number, number[], string][])(
    'a group of %i beats of %i, hits on %j → %s',
    (beats, slots, onsets, expected) => {
      expect(spelled(spellGroup(beats, slots, onsets, 8))).toBe(expected);
    },
  );

  // Common practice: a meter counted eighth by eighth (7/8 as 2+2+3) shows every counted eighth,
  // so a note crossing one is split with a rest (drum notes do not sustain, so no tie).
  it.each([
    [2, 2, [0, 3], '8 r16 16'],
    [3, 2, [0, 3], '8 r16 16 r8'],
    [3, 2, [0, 5], '4 r16 16'],
    [2, 2, [0], '4'],
    [3, 2, [0], '4d'],
    [3, 2, [0, 4], '4 8'],
  ] as [number, number, number[], string][])(
    'counted by the eighth, a group of %i beats of %i, hits on %j → %s',
    (beats, slots, onsets, expected) => {
      expect(spelled(spellGroup(beats, slots, onsets, 8, true))).toBe(expected);
    },
  );
});
