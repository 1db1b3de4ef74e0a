import { describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, type Drill, type DrillHit } from '../index';

const SEEDS = Array.from({ length: 20 }, (_, i) => `role-${i}`);

const hitsOf = (drill: Drill, keep: (h: DrillHit) => boolean) =>
  drill.bars.flatMap((bar) => bar.hits.filter(keep).map((h) => ({ bar: bar.bar, ...h })));

describe('voice roles', () => {
  it('fills the defaults a teacher never has to set', () => {
    const card = parseRuleCard({
      voices: ['kick', 'snare', 'ride', 'hihatFoot', 'crash', 'tomHigh'],
      ostinato: { voice: 'ride', slots: [0, 2] },
    });
    expect(card.roles).toEqual({
      kick: 'anchor',
      snare: 'embellishment',
      ride: 'time',
      hihatFoot: 'time',
      crash: 'colour',
      tomHigh: 'embellishment',
    });
    expect(parseRuleCard({ roles: { kick: 'embellishment' } }).roles.kick).toBe('embellishment');
  });

  // common practice: the left foot keeps time on 2 and 4 under a ride pattern and plays nothing else.
  it('keeps a time layer to its pattern: the hi-hat foot plays 2 and 4 only', () => {
    const card = parseRuleCard({
      voices: ['kick', 'snare', 'ride', 'hihatFoot'],
      ostinato: { voice: 'ride', slots: [0, 2] },
      layers: [{ voice: 'hihatFoot', slots: [0], beats: [2, 4] }],
      density: 0.6,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    });
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      const foot = hitsOf(drill, (h) => h.voice === 'hihatFoot');
      expect(foot.map((h) => [h.bar, h.beat, h.slot])).toEqual(
        [1, 2, 3, 4].flatMap((bar) => [
          [bar, 2, 0],
          [bar, 4, 0],
        ]),
      );
      expect(foot.every((h) => h.source === 'ostinato')).toBe(true);
      expect(hitsOf(drill, (h) => h.voice === 'ride' && h.source !== 'ostinato')).toEqual([]);
    }
  });

  it('puts the kick on one in every bar unless a rule keeps it off', () => {
    const card = parseRuleCard({
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.4,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 4, landing: 'end' },
      ],
    });
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      const onOne = drill.bars.map((bar) =>
        bar.hits.some((h) => h.voice === 'kick' && h.beat === 1 && h.slot === 0),
      );
      // "Three bars off, land on the fourth": landing at the end of the cycle.
      expect(onOne).toEqual([false, false, false, true]);
    }
  });

  it('adds no embellishment that no fillHoles rule asks for; density still moves the kick', () => {
    const card = parseRuleCard({
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 1,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    });
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      expect(hitsOf(drill, (h) => h.voice === 'snare' && h.source === 'fill')).toEqual([]);
      expect(
        hitsOf(drill, (h) => h.voice === 'kick' && h.source === 'fill').length,
      ).toBeGreaterThan(0);
    }
  });

  it('ghosts embellishments, keeps them in the holes and off the downbeats kept free', () => {
    const card = parseRuleCard({
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 1,
      rules: [
        { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2 },
        { kind: 'fillHoles', voices: ['snare'], ghost: 1, accent: 0 },
      ],
    });
    for (const seed of SEEDS) {
      const drill = generateDrill(card, seed);
      const snares = hitsOf(drill, (h) => h.voice === 'snare');
      expect(snares.length).toBeGreaterThan(0);
      for (const h of snares) {
        expect(h.dynamic).toBe('ghost');
        expect([1, 3]).toContain(h.slot);
      }
    }
  });

  it('keeps extra notes off a Euclidean line so the figure stays clean', () => {
    const card = parseRuleCard({
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.8,
      rules: [{ kind: 'euclid', voice: 'kick', pulses: 3, steps: 8, span: 2 }],
    });
    for (const seed of SEEDS) {
      const kicks = hitsOf(generateDrill(card, seed), (h) => h.voice === 'kick');
      // E(3,8) over two beats, twice a bar: x..x..x. (Toussaint 2005, table of Euclidean rhythms).
      expect(kicks.map((h) => `${h.beat}.${h.slot}`).slice(0, 6)).toEqual([
        '1.0',
        '1.3',
        '2.2',
        '3.0',
        '3.3',
        '4.2',
      ]);
      expect(kicks.every((h) => h.source === 'euclid')).toBe(true);
    }
  });

  it('plays the colour crash on beat 1 of the drill only, in place of the time cymbal', () => {
    const card = parseRuleCard({
      voices: ['kick', 'snare', 'hihat', 'crash'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.5,
    });
    const drill = generateDrill(card, 'crash');
    const crashes = hitsOf(drill, (h) => h.voice === 'crash');
    expect(crashes.map((h) => [h.bar, h.beat, h.slot])).toEqual([[1, 1, 0]]);
    expect(
      hitsOf(drill, (h) => h.voice === 'hihat').filter(
        (h) => h.bar === 1 && h.beat === 1 && h.slot === 0,
      ),
    ).toEqual([]);
  });
});
