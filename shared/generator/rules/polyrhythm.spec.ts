import { describe, expect, it } from 'vitest';
import { createGrid, positionOf } from '../grid';
import { generateDrill, parseRuleCard, RuleCardError } from '../index';
import type { PolyrhythmRule } from '../schema';
import { placePolyrhythm } from './polyrhythm';

const rule = (over: Partial<PolyrhythmRule>): PolyrhythmRule => ({
  kind: 'polyrhythm',
  voices: ['kick'],
  against: 3,
  span: 3,
  ...over,
});

describe('polyrhythm', () => {
  // The grid for an a:b polyrhythm has lcm(a, b) pulses and the pattern repeats every cycle;
  // 3:4 on 12 pulses gives streams 0,4,8 and 0,3,6,9, composite 0,3,4,6,8,9 (IOIs 3-1-2-2-1-3).
  // Source: B. Selcoe, SeqFan mailing list (2015), on the lcm grid of polyrhythms; the
  // composite itself is textbook arithmetic.
  it('builds the 4:3 composite on the 12-pulse grid (3/4 in sixteenths)', () => {
    const card = parseRuleCard({
      meter: { beats: 3, unit: 4 },
      bars: 1,
      subdivision: 4,
      voices: ['kick', 'snare'],
      density: 0,
      rules: [
        { kind: 'polyrhythm', voices: ['kick'], against: 3, span: 3 },
        { kind: 'polyrhythm', voices: ['snare'], against: 4, span: 3 },
      ],
    });
    const [bar] = generateDrill(card, 'lcm').bars;
    const pulse = (h: { beat: number; slot: number }) => (h.beat - 1) * 4 + h.slot;
    const kick = bar?.hits.filter((h) => h.voice === 'kick').map(pulse);
    const snare = bar?.hits.filter((h) => h.voice === 'snare').map(pulse);
    expect(kick).toEqual([0, 4, 8]);
    expect(snare).toEqual([0, 3, 6, 9]);
    const composite = [...new Set(bar?.hits.map(pulse))].sort((a, b) => a - b);
    expect(composite).toEqual([0, 3, 4, 6, 8, 9]);
    const iois = composite.map((p, i) => (composite[i + 1] ?? 12) - p);
    expect(iois).toEqual([3, 1, 2, 2, 1, 3]);
  });

  it('runs across bar lines when the span does not divide the bar (polymeter)', () => {
    const grid = createGrid(3, [2, 2, 2, 2]);
    const hits = placePolyrhythm(rule({ against: 2, span: 3 }), 0, grid).map((p) =>
      positionOf(grid, p.instant),
    );
    // a hit every 1.5 beats through 12 beats: 0, 1.5, 3, 4.5, …, 10.5
    expect(hits).toHaveLength(8);
    expect(hits[3]).toEqual({ bar: 2, beat: 1, slot: 1 });
    expect(hits[7]).toEqual({ bar: 3, beat: 3, slot: 1 });
  });

  it('alternates the stream through its voices, restarting each cycle', () => {
    const grid = createGrid(1, [3, 3, 3, 3]);
    const voices = placePolyrhythm(
      rule({ voices: ['kick', 'snare'], against: 3, span: 2 }),
      0,
      grid,
    ).map((p) => p.voice);
    expect(voices).toEqual(['kick', 'snare', 'kick', 'kick', 'snare', 'kick']);
  });

  it('refuses points between slots and names a subdivision that works', () => {
    expect(() =>
      parseRuleCard({
        subdivision: 4,
        rules: [{ kind: 'polyrhythm', voices: ['kick'], against: 3, span: 2 }],
      }),
    ).toThrow(/3 hits over 2 beats fall between the slots of beat 1\. Use 3 or 6 slots per beat/);
    expect(() =>
      parseRuleCard({
        subdivision: 4,
        rules: [{ kind: 'polyrhythm', voices: ['kick'], against: 11, span: 1 }],
      }),
    ).toThrow(RuleCardError);
  });
});
