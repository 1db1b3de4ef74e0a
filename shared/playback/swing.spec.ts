import { describe, expect, it } from 'vitest';
import { rational, type Rational } from './rational';
import { swingFeel, swingRatio, swungOffset } from './swing';

const asText = (r: Rational) => `${r.num}/${r.den}`;

describe('swingRatio', () => {
  it('reads four-decimal ratios as the simplest fraction they round from', () => {
    expect(asText(swingRatio(0.5))).toBe('1/2');
    expect(asText(swingRatio(0.6667))).toBe('2/3');
    expect(asText(swingRatio(2 / 3))).toBe('2/3');
    expect(asText(swingRatio(0.6))).toBe('3/5');
    expect(asText(swingRatio(0.75))).toBe('3/4');
    expect(asText(swingRatio(0.58))).toBe('29/50');
    // Not every four-decimal value is a simple fraction: 0.6666 is not the triplet feel.
    expect(asText(swingRatio(0.6666))).not.toBe('2/3');
  });

  it('always lies within half a ten-thousandth of the decimal, with no simpler fraction there', () => {
    // Checked by brute force over every four-decimal ratio the card allows (0.5000–0.7500),
    // in integers: lo = (2n − 1) / 20000, hi = (2n + 1) / 20000.
    const faults: string[] = [];
    for (let n = 5000; n <= 7500; n += 1) {
      const { num, den } = swingRatio(n / 10_000);
      if (num * 20_000 < (2 * n - 1) * den || num * 20_000 > (2 * n + 1) * den) {
        faults.push(`${n}: ${num}/${den} is outside`);
      }
      for (let q = 1; q < den; q += 1) {
        const p = Math.ceil(((2 * n - 1) * q) / 20_000);
        if (p * 20_000 <= (2 * n + 1) * q) faults.push(`${n}: ${p}/${q} beats ${num}/${den}`);
      }
    }
    expect(faults).toEqual([]);
  });

  it('refuses a ratio outside the pair', () => {
    expect(() => swingRatio(1)).toThrow(RangeError);
    expect(() => swingRatio(Number.NaN)).toThrow(RangeError);
  });
});

describe('swingFeel', () => {
  it('counts the pairs in a beat: eighths in quarter beats, sixteenths in quarter or eighth beats', () => {
    expect(swingFeel({ unit: 8, ratio: 0.6 }, 4)?.pairsPerBeat).toBe(1);
    expect(swingFeel({ unit: 16, ratio: 0.6 }, 4)?.pairsPerBeat).toBe(2);
    expect(swingFeel({ unit: 16, ratio: 0.6 }, 8)?.pairsPerBeat).toBe(1);
    expect(swingFeel({ unit: 8, ratio: 0.6 }, 2)?.pairsPerBeat).toBe(2);
  });

  it('plays straight without swing, at 0.5, or when a pair would cross a beat', () => {
    expect(swingFeel(undefined, 4)).toBeNull();
    expect(swingFeel({ unit: 8, ratio: 0.5 }, 4)).toBeNull();
    expect(swingFeel({ unit: 8, ratio: 0.6667 }, 8)).toBeNull();
    expect(swingFeel({ unit: 16, ratio: 0.6667 }, 16)).toBeNull();
  });
});

describe('swungOffset', () => {
  const offsets = (slots: number, feel: ReturnType<typeof swingFeel>) =>
    Array.from({ length: slots }, (_, slot) => asText(swungOffset(slot, slots, feel)));
  const triplet8 = swingFeel({ unit: 8, ratio: 0.6667 }, 4);
  const triplet16 = swingFeel({ unit: 16, ratio: 0.6667 }, 4);

  it("puts the swung eighth's off-beat on the triplet's third", () => {
    expect(offsets(2, triplet8)).toEqual(['0/1', '2/3']);
  });

  it('moves the off-beat of each sixteenth pair, never the eighths', () => {
    expect(offsets(4, triplet16)).toEqual(['0/1', '1/3', '1/2', '5/6']);
    const sixty = swingFeel({ unit: 16, ratio: 0.6 }, 4);
    expect(offsets(4, sixty)).toEqual(['0/1', '3/10', '1/2', '4/5']);
  });

  it('interpolates finer slots linearly within the half of the pair they lie in', () => {
    // 32nds under swung sixteenths (2/3): the first half of each pair [0, 1/4] beat stretches to
    // [0, 1/3], the second [1/4, 1/2] squeezes to [1/3, 1/2]; the 32nds sit mid-way in each.
    expect(offsets(8, triplet16)).toEqual([
      '0/1',
      '1/6',
      '1/3',
      '5/12',
      '1/2',
      '2/3',
      '5/6',
      '11/12',
    ]);
    // Sixteenths under swung eighths (2/3): 0, 1/3, 2/3, 5/6.
    expect(offsets(4, triplet8)).toEqual(['0/1', '1/3', '2/3', '5/6']);
  });

  it('leaves tuplet grids as written', () => {
    for (const slots of [3, 5, 6, 7]) {
      expect(offsets(slots, triplet8)).toEqual(
        Array.from({ length: slots }, (_, s) => asText(rational(s, slots))),
      );
    }
  });

  it('is straight at 1/2 and keeps slot order at every ratio', () => {
    const half = { pairsPerBeat: 2, ratio: rational(1, 2) };
    expect(offsets(8, half)).toEqual(offsets(8, null));
    for (let n = 5000; n <= 7500; n += 125) {
      for (const unit of [8, 16]) {
        const feel = swingFeel({ unit, ratio: n / 10_000 }, 4);
        const times = Array.from({ length: 8 }, (_, s) => swungOffset(s, 8, feel));
        for (let s = 1; s < 8; s += 1) {
          const [a, b] = [times[s - 1]!, times[s]!];
          expect(a.num * b.den).toBeLessThan(b.num * a.den);
        }
        const last = times[7]!;
        expect(last.num).toBeLessThan(last.den);
      }
    }
  });
});
