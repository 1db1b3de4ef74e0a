import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalCard } from '../canonical';
import type { HitSource, VoiceId } from '../drill';
import { createGrid } from '../grid';
import { checkDrill, generateDrill, parseRuleCard, RuleConflictError } from '../index';
import { stickingFaults } from '../rules/check-hands';
import { assignHands, assignHandsRepairing, type WorkHit } from './assign';

const hit = (voice: VoiceId, source: HitSource = 'fill'): WorkHit => ({
  voice,
  source,
  dynamic: 'normal',
  rule: 0,
  hand: null,
});

const cardOf = (raw: Record<string, unknown>) =>
  canonicalCard(parseRuleCard({ bars: 1, density: 0, ...raw }));

const handsOf = (cells: readonly (readonly WorkHit[])[]): string =>
  cells.map((cell) => cell.map((h) => h.hand ?? '-').join('') || '.').join(' ');

describe('assignHands', () => {
  it('leads with the right hand on the time; the left hand plays what meets it', () => {
    const card = cardOf({
      subdivision: 2,
      meter: { beats: 1, unit: 4 },
      voices: ['snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0] },
    });
    const cells = [[hit('hihat', 'ostinato'), hit('snare', 'backbeat')], [hit('snare')]];
    expect(assignHands(card, createGrid(1, [2]), cells)).toBeNull();
    expect(handsOf(cells)).toBe('RL L');
  });

  it('shares a time too fast for one hand between the hands: sixteenths at 130 BPM', () => {
    const card = cardOf({
      tempo: 130,
      voices: ['hihat'],
      ostinato: { voice: 'hihat', slots: [0, 1, 2, 3] },
    });
    const cells = Array.from({ length: 16 }, () => [hit('hihat', 'ostinato')]);
    expect(assignHands(card, createGrid(1, [4, 4, 4, 4]), cells)).toBeNull();
    expect(handsOf(cells.slice(0, 4))).toBe('R L R L');
  });

  it('gives feet no hand and refuses three hands at once', () => {
    const card = cardOf({ voices: ['kick', 'hihatFoot', 'snare', 'ride', 'tomFloor'] });
    const grid = createGrid(1, [1]);
    const feet = [[hit('kick'), hit('hihatFoot')]];
    expect(assignHands(card, grid, feet)).toBeNull();
    expect(handsOf(feet)).toBe('--');
    const three = [[hit('snare'), hit('ride'), hit('tomFloor')]];
    expect(assignHands(card, grid, three)).toEqual({ instant: 0, reason: 'tooManyHands' });
  });

  it('carries the sticking over the seam: an even run alternates round the loop', () => {
    // Three beats of sixteenths at 200 BPM (75 ms apart): hand to hand, 150 ms per hand.
    const card = cardOf({ tempo: 200, voices: ['snare'], meter: { beats: 3, unit: 4 } });
    const cells = Array.from({ length: 12 }, () => [hit('snare')]);
    expect(assignHands(card, createGrid(1, [4, 4, 4]), cells)).toBeNull();
    expect(handsOf(cells).replaceAll(' ', '')).toBe('RLRLRLRLRLRL');
  });

  it('refuses an odd run of fast single strokes that cannot alternate round the loop', () => {
    // 15 quintuplet strokes a bar at 150 BPM (80 ms apart): one hand must play two in a row.
    const card = cardOf({
      tempo: 150,
      voices: ['snare'],
      subdivision: 5,
      meter: { beats: 3, unit: 4 },
    });
    const cells = Array.from({ length: 15 }, () => [hit('snare')]);
    expect(assignHands(card, createGrid(1, [5, 5, 5]), cells)).toEqual({
      instant: 14,
      reason: 'tooFast',
    });
    // At 140 BPM (86 ms apart) a double may close the loop, when the card asks for doubles.
    const at140 = { tempo: 140, voices: ['snare'], subdivision: 5, meter: { beats: 3, unit: 4 } };
    const grid = createGrid(1, [5, 5, 5]);
    expect(assignHands(cardOf(at140), grid, cells)).toEqual({ instant: 14, reason: 'tooFast' });
    const doubles = cardOf({ ...at140, sticking: { doubles: true } });
    expect(assignHands(doubles, grid, cells)).toBeNull();
    expect(stickingFaults(doubles, grid, cells)).toEqual([]);
  });

  it('starts runs with the leading side on the strong positions, hand to hand', () => {
    const card = cardOf({ tempo: 90, voices: ['snare'] });
    const cells = Array.from({ length: 16 }, () => [hit('snare')]);
    expect(assignHands(card, createGrid(1, [4, 4, 4, 4]), cells)).toBeNull();
    expect(handsOf(cells.slice(0, 8))).toBe('R L R L R L R L');
    // A left-handed player leads with the left.
    const left = cardOf({ tempo: 90, voices: ['snare'], hand: 'left' });
    expect(assignHands(left, createGrid(1, [4, 4, 4, 4]), cells)).toBeNull();
    expect(handsOf(cells.slice(0, 4))).toBe('L R L R');
  });

  // The issue: every hand note outside the ostinato went to the left hand, L L L at 170 BPM.
  it('never gives one hand three sixteenths in a row at 170 BPM without doubles', () => {
    const card = cardOf({
      tempo: 170,
      voices: ['hihat', 'snare', 'tomHigh'],
      ostinato: { voice: 'hihat', slots: [0] },
    });
    const beat = () => [
      [hit('hihat', 'ostinato')],
      [hit('snare')],
      [hit('tomHigh')],
      [hit('snare')],
    ];
    const cells = [...beat(), ...beat(), ...beat(), ...beat()];
    expect(assignHands(card, createGrid(1, [4, 4, 4, 4]), cells)).toBeNull();
    expect(handsOf(cells)).toBe('R L R L R L R L R L R L R L R L');
  });
});

describe('assignHandsRepairing', () => {
  it('removes fill strokes the limbs cannot play, and sticks the rest as assignHands does', () => {
    // Sixteenths of fill on the snare at 170 BPM over a right-hand ride on every beat, and a
    // kick fill on every sixteenth: the kick keeps one stroke in three at most.
    const card = cardOf({
      tempo: 170,
      voices: ['kick', 'snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0] },
    });
    const grid = createGrid(1, [4, 4, 4, 4]);
    const cells = Array.from({ length: 16 }, (_, i) =>
      i % 4 === 0 ? [hit('ride', 'ostinato'), hit('kick')] : [hit('snare'), hit('kick')],
    );
    expect(assignHandsRepairing(card, grid, cells)).toBeNull();
    const again = cells.map((cell) => cell.map((h) => ({ ...h, hand: null })));
    expect(assignHands(card, grid, again)).toBeNull();
    expect(handsOf(again)).toBe(handsOf(cells));
    expect(stickingFaults(card, grid, cells)).toEqual([]);
    expect(cells.flat().filter((h) => h.voice === 'ride')).toHaveLength(4);
    expect(cells.flat().filter((h) => h.voice === 'kick').length).toBeLessThan(16);
  });
});

describe('assignHandsRepairing, any notes', () => {
  const VOICES: readonly VoiceId[] = ['ride', 'snare', 'tomFloor', 'hihat', 'kick', 'hihatFoot'];
  const arb = fc.record({
    bars: fc.integer({ min: 1, max: 3 }),
    slots: fc.integer({ min: 2, max: 8 }),
    tempo: fc.integer({ min: 40, max: 300 }),
    lead: fc.constantFrom('right', 'left', 'alternate'),
    hand: fc.constantFrom('right', 'left'),
    doubles: fc.boolean(),
    notes: fc.array(fc.subarray([...VOICES], { maxLength: 3 }), { minLength: 64, maxLength: 64 }),
    ride: fc.subarray([0, 1, 2, 3, 4, 5, 6, 7], { minLength: 1, maxLength: 2 }),
  });
  it('ends as assignHands sticks the cells it leaves, and those pass the rules', () => {
    fc.assert(
      fc.property(arb, ({ bars, slots, tempo, lead, hand, doubles, notes, ride }) => {
        const ostinato = { voice: 'ride', slots: ride.filter((s) => s < slots) };
        const card = cardOf({
          bars,
          tempo,
          hand,
          subdivision: slots,
          voices: [...VOICES],
          ...(ostinato.slots.length > 0 ? { ostinato } : {}),
          sticking: { lead, doubles },
        });
        const grid = createGrid(bars, [slots, slots, slots, slots]);
        const cells = Array.from({ length: grid.instants }, (_, i) => {
          const time = ostinato.slots.includes(i % slots) ? [hit('ride', 'ostinato')] : [];
          const more = (notes[i % notes.length] ?? []).filter((v) => !time.length || v !== 'ride');
          return [...time, ...more.map((v) => hit(v))];
        });
        const failure = assignHandsRepairing(card, grid, cells);
        if (failure) return; // the ride alone is more than the hands can play
        expect(stickingFaults(card, grid, cells)).toEqual([]);
        const again = cells.map((cell) => cell.map((h) => ({ ...h, hand: null })));
        expect(assignHands(card, grid, again)).toBeNull();
        expect(handsOf(again)).toBe(handsOf(cells));
      }),
      { numRuns: Number(process.env['FC_RUNS'] ?? 1000) / 4 },
    );
  });
});

describe('generateDrill sticking', () => {
  it('refuses cards whose obligations need three hands, or a foot or hand too fast', () => {
    const threeHands = parseRuleCard({
      voices: ['snare', 'ride', 'tomFloor'],
      ostinato: { voice: 'ride', slots: [0] },
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2] },
        { kind: 'backbeat', voice: 'tomFloor', beats: [2] },
      ],
    });
    expect(() => generateDrill(threeHands, 'x')).toThrow(/only two hands/);
    const tooFast = parseRuleCard({
      tempo: 300,
      voices: ['snare', 'ride'],
      ostinato: { voice: 'ride', slots: [0, 1, 2, 3] },
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2], shift: 1 }],
    });
    expect(() => generateDrill(tooFast, 'x')).toThrow(RuleConflictError);
    const kick = parseRuleCard({
      tempo: 100,
      voices: ['kick', 'hihat'],
      rules: [{ kind: 'euclid', voice: 'kick', pulses: 3, steps: 4, span: 1 }],
    });
    expect(() => generateDrill(kick, 'x')).toThrow(/faster than one foot can/);
  });

  it('tells a teacher when the time and the figures cannot keep a hand each', () => {
    // The right hand keeps the hi-hat on the beats; a ride on the eighths has to go to the left,
    // and a bell on the off sixteenths fits neither hand at 130 BPM.
    const card = parseRuleCard({
      tempo: 130,
      voices: ['hihat', 'ride', 'rideBell'],
      ostinato: { voice: 'hihat', slots: [0] },
      rules: [
        { kind: 'polyrhythm', voices: ['ride'], against: 2, span: 1 },
        { kind: 'euclid', voice: 'rideBell', pulses: 2, steps: 4, rotation: 1, span: 1 },
      ],
    });
    expect(() => generateDrill(card, 'x')).toThrow(
      /The hi-hat time, the polyrhythm on the ride and the euclid on the ride bell cannot each keep to one hand/,
    );
  });

  it('plays a 4:3 on one ride cymbal with one hand', () => {
    const card = parseRuleCard({
      meter: { beats: 3, unit: 4 },
      tempo: 66,
      voices: ['kick', 'snare', 'ride'],
      density: 0.4,
      rules: [{ kind: 'polyrhythm', voices: ['ride'], against: 4, span: 3 }],
    });
    for (const seed of ['a', 'b', 'c', 'd']) {
      const drill = generateDrill(card, seed);
      expect(checkDrill(card, drill)).toEqual([]);
      const hands = drill.bars.flatMap((bar) =>
        bar.hits.filter((h) => h.source === 'polyrhythm').map((h) => h.hand),
      );
      expect(hands).toHaveLength(16);
      expect(new Set(hands)).toEqual(new Set(['R']));
    }
  });
});
