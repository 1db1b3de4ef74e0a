import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  countPositions,
  fittingSyllableSize,
  spreadPositions,
  SYLLABLE_GAP,
  SYLLABLE_SIZE,
  syllableWidth,
} from './count-positions';

const beat = (subdivision: number, written: Record<number, number>) => ({
  subdivision,
  written: new Map(Object.entries(written).map(([slot, x]) => [Number(slot), x])),
});

describe('countPositions', () => {
  it('puts a syllable under the note written on its slot', () => {
    const [xs] = countPositions([beat(4, { 0: 100, 1: 120, 2: 150, 3: 170 })], 90, 200);
    expect(xs).toEqual([100, 120, 150, 170]);
  });

  it('places an unwritten quintuplet slot ("ka") between the notes on either side', () => {
    // Hits on slots 0, 2, 3, 4: the first note lasts two slots, so nothing is written on slot 1.
    const [xs] = countPositions([beat(5, { 0: 100, 2: 140, 3: 160, 4: 180 })], 90, 200);
    expect(xs).toEqual([100, 120, 140, 160, 180]);
  });

  it('spreads slots under a long note up to the next beat, and the last beat up to the bar end', () => {
    // Two beats of sixteenths, each a single quarter note: 0 at 100 and 200, bar end at 300.
    const xs = countPositions([beat(4, { 0: 100 }), beat(4, { 0: 200 })], 90, 300);
    expect(xs).toEqual([
      [100, 125, 150, 175],
      [200, 225, 250, 275],
    ]);
  });

  it('interpolates in time across beats of different subdivisions', () => {
    // Beat 1 in triplets with only its downbeat written, beat 2 in sixteenths from x = 190.
    const xs = countPositions([beat(3, { 0: 100 }), beat(4, { 0: 190, 2: 230 })], 90, 270);
    expect(xs[0]).toEqual([100, 130, 160]);
    expect(xs[1]).toEqual([190, 210, 230, 250]);
  });

  it('starts from the note area when no downbeat is written (a bar with no voice)', () => {
    const [xs] = countPositions([beat(2, {})], 80, 120);
    expect(xs).toEqual([80, 100]);
  });

  it('gives every slot one x, in time order, inside the bar, matching every written note', () => {
    const bar = fc
      .array(fc.integer({ min: 1, max: 8 }), { minLength: 1, maxLength: 7 })
      .chain((subdivisions) =>
        fc.tuple(
          fc.constant(subdivisions),
          fc.array(fc.boolean(), {
            minLength: subdivisions.reduce((a, b) => a + b, 0),
            maxLength: subdivisions.reduce((a, b) => a + b, 0),
          }),
        ),
      );
    fc.assert(
      fc.property(bar, ([subdivisions, writtenFlags]) => {
        // Written notes at strictly increasing x, 10 px a slot from x = 100.
        let k = 0;
        const beats = subdivisions.map((sub) => {
          const written: Record<number, number> = {};
          for (let slot = 0; slot < sub; slot++) {
            if (writtenFlags[k]) written[slot] = 100 + 10 * k;
            k++;
          }
          return beat(sub, written);
        });
        const end = 100 + 10 * k;
        const xs = countPositions(beats, 100, end);
        const flat = xs.flat();
        expect(flat).toHaveLength(k);
        for (let i = 1; i < flat.length; i++) expect(flat[i]!).toBeGreaterThan(flat[i - 1]!);
        for (const x of flat) {
          expect(x).toBeGreaterThanOrEqual(100);
          expect(x).toBeLessThan(end);
        }
        beats.forEach((b, i) => b.written.forEach((x, slot) => expect(xs[i]![slot]).toBe(x)));
      }),
    );
  });
});

describe('fittingSyllableSize', () => {
  it('keeps the full size where syllables have room and shrinks them in a tight beat', () => {
    const texts = ['1', 'e', '&', 'a'];
    expect(fittingSyllableSize(texts, [0, 20, 40, 60], 20)).toBe(SYLLABLE_SIZE);
    const tight = fittingSyllableSize(texts, [0, 12, 24, 36], 20);
    expect(tight).toBeLessThan(SYLLABLE_SIZE);
    expect(tight).toBeGreaterThanOrEqual(10);
    expect(fittingSyllableSize(texts, [0, 2, 4, 6], 20)).toBe(10);
  });

  it('gives every pair at the chosen size its clear gap when it does not hit the floor', () => {
    fc.assert(
      fc.property(
        fc.array(fc.constantFrom('1', 'e', '&', 'a', 'trip', 'let', '5'), {
          minLength: 2,
          maxLength: 8,
        }),
        fc.integer({ min: 8, max: 40 }),
        (texts, step) => {
          const xs = texts.map((_, i) => i * step);
          const size = fittingSyllableSize(texts, xs, 40);
          if (size === 10) return;
          texts.slice(1).forEach((t, i) => {
            const clear = step - (syllableWidth(t, size) + syllableWidth(texts[i]!, size)) / 2;
            expect(clear).toBeGreaterThanOrEqual(SYLLABLE_GAP - 1e-9);
          });
        },
      ),
    );
  });
});

describe('spreadPositions', () => {
  it('moves tightly set syllables apart by the least amount, keeping the others', () => {
    // Slots at 100, 104, 108 ("e & a" jammed under a dotted eighth beside a sixteenth).
    expect(spreadPositions([80, 100, 104, 108, 160], 70, 200, 17)).toEqual([
      80, 100, 117, 134, 160,
    ]);
  });

  it('pulls syllables back from the bar end, keeping the gap', () => {
    expect(spreadPositions([100, 190, 195], 90, 200, 17)).toEqual([100, 183, 200]);
  });

  it('keeps each pair its own gap when given one per pair', () => {
    expect(spreadPositions([0, 5, 10], 0, 100, [8, 12])).toEqual([0, 8, 20]);
  });

  it('spreads evenly when the bar is too short for the gap everywhere', () => {
    expect(spreadPositions([0, 1, 2, 3, 4], 0, 40, 17)).toEqual([0, 10, 20, 30, 40]);
  });

  it('always leaves at least the gap (or the even share) between neighbours, in order', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 400 }), { minLength: 1, maxLength: 24 }),
        (raw) => {
          const xs = [...raw].sort((a, b) => a - b);
          const out = spreadPositions(xs, 0, 400, 17);
          const need = Math.min(17, 400 / Math.max(xs.length - 1, 1));
          for (let i = 1; i < out.length; i++)
            expect(out[i]! - out[i - 1]!).toBeGreaterThanOrEqual(need - 1e-9);
          expect(Math.max(...out)).toBeLessThanOrEqual(400);
        },
      ),
    );
  });
});
