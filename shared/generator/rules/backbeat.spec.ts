import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../index';
import { createGrid, positionOf } from '../grid';
import { placeBackbeat } from './backbeat';
import type { BackbeatRule } from '../schema';

const rule = (over: Partial<BackbeatRule>): BackbeatRule => ({
  kind: 'backbeat',
  voice: 'snare',
  beats: [2, 4],
  shift: 0,
  dynamic: 'accent',
  ...over,
});
const where = (grid: ReturnType<typeof createGrid>, r: BackbeatRule) =>
  placeBackbeat(r, 0, grid).map((p) => positionOf(grid, p.instant));

describe('backbeat', () => {
  const grid = createGrid(2, [4, 4, 4, 4]);

  it('plays the listed beats of every bar', () => {
    expect(where(grid, rule({}))).toEqual([
      { bar: 1, beat: 2, slot: 0 },
      { bar: 1, beat: 4, slot: 0 },
      { bar: 2, beat: 2, slot: 0 },
      { bar: 2, beat: 4, slot: 0 },
    ]);
  });

  // common practice: a backbeat "pushed" by a sixteenth sits on the "a" of the beat before.
  it('moves a backbeat on 2 one sixteenth early onto the last sixteenth of beat 1', () => {
    expect(where(grid, rule({ beats: [2], shift: -1 }))[0]).toEqual({ bar: 1, beat: 1, slot: 3 });
  });

  it('counts a shift in the slots of each beat it crosses (mixed subdivisions)', () => {
    const mixed = createGrid(1, [4, 3, 4]);
    // 5 slots late from beat 1: 4 sixteenths reach beat 2, one triplet more.
    expect(where(mixed, rule({ beats: [1], shift: 5 }))[0]).toEqual({ bar: 1, beat: 2, slot: 1 });
    // 2 slots early from beat 3: two triplets back into beat 2.
    expect(where(mixed, rule({ beats: [3], shift: -2 }))[0]).toEqual({ bar: 1, beat: 2, slot: 1 });
  });

  it('crosses bar lines and wraps around the drill ends (drills loop)', () => {
    expect(where(grid, rule({ beats: [1], shift: -1 }))).toEqual([
      { bar: 2, beat: 4, slot: 3 }, // bar 1's push wraps to the end of the last bar
      { bar: 1, beat: 4, slot: 3 },
    ]);
    expect(where(grid, rule({ beats: [4], shift: 4, bars: [2] }))).toEqual([
      { bar: 1, beat: 1, slot: 0 },
    ]);
  });

  it('keeps to the listed bars', () => {
    expect(where(grid, rule({ bars: [2] })).map((p) => p.bar)).toEqual([2, 2]);
  });

  // An anticipated bass figure of our own (the anticipated-bass preset's): kick on the "a" of 1,
  // "&" of 2, "a" of 3 and "&" of 4, written here as two shifted backbeat rules.
  it('writes an anticipated bass figure with shifted backbeats', () => {
    const card = parseRuleCard({
      bars: 2,
      voices: ['kick', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0] },
      density: 0,
      rules: [
        { kind: 'backbeat', voice: 'kick', beats: [1, 3], shift: 3, dynamic: 'normal' },
        { kind: 'backbeat', voice: 'kick', beats: [2, 4], shift: 2, dynamic: 'normal' },
        // The figure leaves the downbeat to the bass player: keep the kick's anchor off it.
        { kind: 'avoidDownbeat', voice: 'kick' },
      ],
    });
    const drill = generateDrill(card, 'anticipated');
    for (const bar of drill.bars) {
      const kicks = bar.hits.filter((h) => h.voice === 'kick').map((h) => [h.beat, h.slot]);
      expect(kicks).toEqual([
        [1, 3],
        [2, 2],
        [3, 3],
        [4, 2],
      ]);
    }
  });
});
