import { describe, expect, it } from 'vitest';
import { bjorklund, rotateLeft, show } from './bjorklund';
import { readCard } from './card';
import { reasonAbout } from './feasibility';
import { Grid } from './grid';
import { planOf, type Plan } from './plan';

/** The oracle's own arithmetic, checked against outside facts before it judges the engine. */

const planFor = (card: Record<string, unknown>): Plan => planOf(readCard(card, card));
const where = (plan: Plan, part: string, voice?: string): string[] =>
  plan.wants
    .filter((w) => w.part === part && (voice === undefined || w.voice === voice))
    .sort((a, b) => a.index - b.index)
    .map((w) => {
      const p = plan.grid.place(w.index);
      return `${p.bar}:${p.beat}.${p.slot}`;
    });
const base = { meter: { beats: 4, unit: 4 }, subdivision: 4, tempo: 90 };

describe('Bjorklund', () => {
  // G. T. Toussaint, "The Euclidean Algorithm Generates Traditional Musical Rhythms", BRIDGES
  // 2005, section 2 (Bjorklund's algorithm) and its list of Euclidean rhythms in world music, as
  // reproduced in open implementations. (The paper's E(5,16) is misprinted with 17 symbols; the
  // 16-symbol bossa-nova pattern is used here.)
  it.each([
    [3, 8, 'x..x..x.'],
    [5, 8, 'x.xx.xx.'],
    [5, 16, 'x..x..x..x..x...'],
    [7, 16, 'x..x.x.x..x.x.x.'],
    [2, 5, 'x.x..'],
    [3, 4, 'x.xx'],
  ])('E(%i,%i) = %s (Toussaint 2005)', (pulses, steps, pattern) => {
    expect(show(bjorklund(pulses, steps))).toBe(pattern);
  });

  it('has the pulses and steps it was asked for, for every pair up to 32 steps', () => {
    for (let steps = 1; steps <= 32; steps++)
      for (let pulses = 0; pulses <= steps; pulses++) {
        const pattern = bjorklund(pulses, steps);
        expect(pattern.length).toBe(steps);
        expect(pattern.filter(Boolean).length).toBe(pulses);
        if (pulses > 0) expect(pattern[0]).toBe(true);
      }
  });

  it('rotates left: the pattern starts that many steps later (the drill contract)', () => {
    expect(show(rotateLeft(bjorklund(3, 8), 1))).toBe('..x..x.x');
    expect(show(rotateLeft(bjorklund(3, 8), 3))).toBe('x..x.x..');
    expect(show(rotateLeft(bjorklund(3, 8), 11))).toBe('x..x.x..');
  });
});

describe('grid arithmetic', () => {
  it('places a rational number of beats on a slot, or between slots', () => {
    const grid = new Grid([2, 3, 4], 2);
    expect(grid.atBeats(1, 2)).toBe(grid.index(1, 1, 1)); // ½ beat: beat 1's second eighth
    expect(grid.atBeats(4, 3)).toBe(grid.index(1, 2, 1)); // 1⅓ beats: beat 2's second triplet
    expect(grid.atBeats(3, 2)).toBeNull(); // 1½ beats: between beat 2's triplets
    expect(grid.atBeats(9, 4)).toBe(grid.index(1, 3, 1)); // 2¼ beats: beat 3's "e"
    expect(grid.atBeats(7, 2)).toBe(grid.index(2, 1, 1)); // 3½ beats: bar 2, beat 1's "&"
    expect(grid.place(grid.totalSlots + 1)).toEqual({ bar: 1, beat: 1, slot: 1 }); // wraps
  });

  it('shifts a backbeat slot by slot, in the slots of the beat it crosses into, wrapping', () => {
    // Late backbeat over the bar line: beat 4 moved 6 sixteenths lands on the "&" of the next 1.
    const late = planFor({
      ...base,
      bars: 2,
      voices: ['snare'],
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [4], shift: 6 }],
    });
    expect(where(late, 'backbeat')).toEqual(['1:1.2', '2:1.2']);
    // Mixed grid [2, 3, 4]: beat 2 one slot early is beat 1's last eighth; four slots late
    // crosses beat 2's three triplets into beat 3's second sixteenth.
    const mixed = planFor({
      meter: { beats: 3, unit: 4 },
      subdivision: [2, 3, 4],
      bars: 1,
      voices: ['snare', 'rim'],
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2], shift: -1 },
        { kind: 'backbeat', voice: 'rim', beats: [2], shift: 4 },
        { kind: 'backbeat', voice: 'rim', beats: [1], shift: -3 },
      ],
    });
    expect(where(mixed, 'backbeat', 'snare')).toEqual(['1:1.1']);
    expect(where(mixed, 'backbeat', 'rim')).toEqual(['1:3.1', '1:3.1']);
  });

  it('spaces a polyrhythm evenly and runs its cycles across bar lines, cut at the drill end', () => {
    // 4 over 3 in sixteenths: one note every three sixteenths (common practice).
    const fourThree = planFor({
      ...base,
      meter: { beats: 3, unit: 4 },
      bars: 1,
      voices: ['kick', 'snare'],
      rules: [{ kind: 'polyrhythm', voices: ['kick', 'snare'], against: 4, span: 3 }],
    });
    expect(where(fourThree, 'polyrhythm')).toEqual(['1:1.0', '1:1.3', '1:2.2', '1:3.1']);
    expect(where(fourThree, 'polyrhythm', 'snare')).toEqual(['1:1.3', '1:3.1']);
    // 2 over 3 in one 4/4 bar of eighths: the second cycle starts on beat 4; its second note
    // (beat 5 and a half) lies past the drill's end and is not played.
    const polymeter = planFor({
      ...base,
      subdivision: 2,
      bars: 1,
      voices: ['tomFloor'],
      rules: [{ kind: 'polyrhythm', voices: ['tomFloor'], against: 2, span: 3 }],
    });
    expect(where(polymeter, 'polyrhythm')).toEqual(['1:1.0', '1:2.1', '1:4.0']);
  });

  it('spreads a Euclidean rhythm over its span, rotated, repeating', () => {
    // E(3,8) over two beats of sixteenths is the tresillo (Toussaint 2005): 3 + 3 + 2.
    const tresillo = planFor({
      ...base,
      bars: 1,
      voices: ['kick'],
      rules: [{ kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, span: 2 }],
    });
    expect(where(tresillo, 'euclid')).toEqual([
      '1:1.0',
      '1:1.3',
      '1:2.2',
      '1:3.0',
      '1:3.3',
      '1:4.2',
    ]);
    const turned = planFor({
      ...base,
      bars: 1,
      voices: ['kick'],
      rules: [{ kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, span: 4, rotation: 1 }],
    });
    // ..x..x.x over a bar of eighths (two sixteenths a step)
    expect(where(turned, 'euclid')).toEqual(['1:2.0', '1:3.2', '1:4.2']);
  });

  it('resolves avoided downbeats at the start or the end of each cycle, anticipating with wrap', () => {
    const start = planFor({
      ...base,
      bars: 4,
      voices: ['kick'],
      rules: [{ kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2, anticipate: true }],
    });
    expect([...start.resolutionBars.get('kick')!]).toEqual([1, 3]);
    expect(where(start, 'avoidDownbeat')).toEqual(['1:1.0', '1:4.3', '3:1.0', '3:4.3']);
    const end = planFor({
      ...base,
      bars: 8,
      voices: ['kick'],
      rules: [
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4, landing: 'end', anticipate: true },
      ],
    });
    expect([...end.resolutionBars.get('kick')!]).toEqual([4, 8]);
    // bar 1 is avoided: its anticipation is the drill's very last slot
    expect(where(end, 'avoidDownbeat')).toContain('8:4.3');
    expect(end.silent.map((s) => end.grid.place(s.index).bar)).toEqual([1, 2, 3, 5, 6, 7]);
  });

  it('rests hand time layers in a phrase fill and lets the crash replace the cymbal on landing', () => {
    const plan = planFor({
      ...base,
      bars: 4,
      voices: ['kick', 'snare', 'hihat', 'hihatFoot', 'crash', 'tomFloor'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      layers: [{ voice: 'hihatFoot', slots: [0], beats: [2, 4] }],
      rules: [{ kind: 'phrase', every: 2, fillBeats: 2 }],
    });
    expect(plan.fillBars).toEqual([2, 4]);
    expect([...plan.landingBars].sort()).toEqual([1, 3]);
    expect(where(plan, 'phrase')).toEqual(['1:1.0', '1:1.0', '3:1.0', '3:1.0']);
    const hihat = where(plan, 'ostinato', 'hihat');
    expect(hihat).not.toContain('2:3.0'); // the fill window rests the hi-hat
    expect(hihat).not.toContain('1:1.0'); // the landing crash replaces it
    expect(hihat).toContain('2:2.2');
    expect(where(plan, 'ostinato', 'hihatFoot')).toContain('2:4.0'); // feet keep time
  });
});

describe('feasibility reasoner', () => {
  const groove = { ...base, bars: 2, voices: ['kick', 'snare', 'hihat'] };
  it('proves the drill contract’s impossible examples impossible', () => {
    // linear 0 with a backbeat on the ostinato's slots (the drill contract)
    expect(
      reasonAbout(
        planFor({
          ...groove,
          ostinato: { voice: 'hihat', slots: [0, 2] },
          rules: [
            { kind: 'linear', maxOverlaps: 0 },
            { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
          ],
        }),
      ).impossible.length,
    ).toBeGreaterThan(0);
    // a Euclidean kick on an avoided downbeat (the drill contract)
    expect(
      reasonAbout(
        planFor({
          ...groove,
          rules: [
            { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 0 },
            { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8 },
          ],
        }),
      ).impossible.length,
    ).toBeGreaterThan(0);
    // three hand voices at one instant
    expect(
      reasonAbout(
        planFor({
          ...groove,
          voices: ['snare', 'hihat', 'tomFloor'],
          ostinato: { voice: 'hihat', slots: [0] },
          rules: [
            { kind: 'backbeat', voice: 'snare', beats: [2] },
            { kind: 'backbeat', voice: 'tomFloor', beats: [2] },
          ],
        }),
      ).impossible.length,
    ).toBeGreaterThan(0);
  });

  it('finds nothing wrong with a plain groove', () => {
    const plan = planFor({
      ...groove,
      ostinato: { voice: 'hihat', slots: [0, 2] },
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2, anticipate: true },
      ],
    });
    expect(reasonAbout(plan)).toEqual({ impossible: [], policy: [] });
  });
});
