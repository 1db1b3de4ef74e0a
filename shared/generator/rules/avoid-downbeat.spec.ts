import { describe, expect, it } from 'vitest';
import { createGrid, positionOf } from '../grid';
import { generateDrill, parseRuleCard, RuleConflictError } from '../index';
import type { AvoidDownbeatRule } from '../schema';
import { isResolutionBar, planAvoidDownbeat } from './avoid-downbeat';

const rule = (over: Partial<AvoidDownbeatRule>): AvoidDownbeatRule => ({
  kind: 'avoidDownbeat',
  voice: 'kick',
  resolveEvery: 0,
  anticipate: false,
  landing: 'start',
  ...over,
});

describe('avoidDownbeat', () => {
  it('resolves on bars 1, 1+N, 1+2N and never with N = 0', () => {
    const bars = [1, 2, 3, 4, 5, 6, 7];
    expect(bars.filter((b) => isResolutionBar(rule({ resolveEvery: 3 }), b))).toEqual([1, 4, 7]);
    expect(bars.filter((b) => isResolutionBar(rule({ resolveEvery: 1 }), b))).toEqual(bars);
    expect(bars.filter((b) => isResolutionBar(rule({ resolveEvery: 0 }), b))).toEqual([]);
  });

  it('must hit beat 1 in resolution bars and avoids it elsewhere', () => {
    const grid = createGrid(4, [4, 4, 4, 4]);
    const plan = planAvoidDownbeat(rule({ resolveEvery: 2 }), 0, grid);
    expect(plan.placements.map((p) => positionOf(grid, p.instant).bar)).toEqual([1, 3]);
    expect(plan.avoided.map((i) => positionOf(grid, i))).toEqual([
      { bar: 2, beat: 1, slot: 0 },
      { bar: 4, beat: 1, slot: 0 },
    ]);
  });

  it('anticipates on the last slot before each avoided downbeat, wrapping before bar 1', () => {
    const grid = createGrid(3, [4, 4, 3]);
    const plan = planAvoidDownbeat(rule({ anticipate: true }), 0, grid);
    expect(plan.placements.map((p) => positionOf(grid, p.instant))).toEqual([
      { bar: 3, beat: 3, slot: 2 }, // before bar 1: the drill loops
      { bar: 1, beat: 3, slot: 2 },
      { bar: 2, beat: 3, slot: 2 },
    ]);
  });

  it('keeps generated drills off the avoided downbeats', () => {
    const card = parseRuleCard({
      bars: 6,
      voices: ['kick', 'snare', 'hihat'],
      density: 0.9,
      rules: [{ kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 3, anticipate: true }],
    });
    for (let s = 0; s < 20; s++) {
      const drill = generateDrill(card, `seed-${s}`);
      const downbeatKicks = drill.bars.map((b) =>
        b.hits.some((h) => h.voice === 'kick' && h.beat === 1 && h.slot === 0),
      );
      expect(downbeatKicks).toEqual([true, false, false, true, false, false]);
    }
  });

  it('refuses a Euclidean kick on an avoided downbeat, naming both rules', () => {
    const card = parseRuleCard({
      voices: ['kick', 'snare'],
      rules: [
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 0 },
        { kind: 'euclid', voice: 'kick', pulses: 3, steps: 8 },
      ],
    });
    expect(() => generateDrill(card, 'x')).toThrow(RuleConflictError);
    expect(() => generateDrill(card, 'x')).toThrow(/avoidDownbeat.*Euclidean E\(3,8\) kick/);
  });

  it('tells two avoidDownbeat rules apart when they disagree', () => {
    const card = parseRuleCard({
      bars: 2,
      rules: [
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 0 },
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 1 },
      ],
    });
    expect(() => generateDrill(card, 'x')).toThrow(
      'The avoidDownbeat rule for the kick (rule 1) keeps the kick off beat 1 of bar 1, but the avoidDownbeat rule for the kick (rule 2) puts it there.',
    );
  });
});
