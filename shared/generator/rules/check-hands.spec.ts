import { describe, expect, it } from 'vitest';
import { canonicalCard } from '../canonical';
import type { VoiceId } from '../drill';
import { createGrid } from '../grid';
import { parseRuleCard } from '../parse';
import { stickingFaults, type StickingFault, type StickingNote } from './check-hands';

/** A card on one bar of 4/4 sixteenths (unless `beats` says otherwise). */
const cardOf = (raw: Record<string, unknown>) =>
  canonicalCard(parseRuleCard({ bars: 1, subdivision: 4, density: 0, ...raw }));

/** Cells from a row like 'hihat:R snare:L | . | kick' (one entry per instant). */
function cells(...row: string[]): StickingNote[][] {
  return row.map((cell) =>
    cell === '.'
      ? []
      : cell.split(' ').map((note) => {
          const [voice, hand, source] = note.split(':');
          return {
            voice: voice as VoiceId,
            hand: hand === 'R' || hand === 'L' ? hand : null,
            source: source ?? 'fill',
          };
        }),
  );
}

const rules = (faults: readonly StickingFault[]): string[] => faults.map((f) => f.rule);

/** Sixteen instants: the given ones, then rests. */
const bar = (...first: string[]): StickingNote[][] =>
  cells(...first, ...Array<string>(16 - first.length).fill('.'));

describe('stickingFaults', () => {
  const grid = createGrid(1, [4, 4, 4, 4]);

  it('passes a plain groove: right hand on the hi-hat, left on the backbeat', () => {
    const card = cardOf({
      tempo: 100,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
    });
    const hh = 'hihat:R:ostinato';
    const groove = bar(
      `${hh} kick:-:ostinato`,
      '.',
      hh,
      '.',
      `${hh} snare:L:backbeat`,
      '.',
      hh,
      '.',
      `${hh} kick`,
      '.',
      hh,
      '.',
      `${hh} snare:L:backbeat`,
      'snare:L',
      hh,
      '.',
    );
    expect(stickingFaults(card, grid, groove)).toEqual([]);
    // The same hi-hat notes as a fill, not time: the right hand crosses while the left is free.
    const loose = groove.map((cell) => cell.map((note) => ({ ...note, source: 'fill' })));
    expect(rules(stickingFaults(card, grid, loose))).toContain('crossing');
  });

  it('wants hands on hand voices, none on feet, and two hands at most on different voices', () => {
    const card = cardOf({ voices: ['kick', 'snare', 'hihat', 'tomFloor'] });
    expect(rules(stickingFaults(card, grid, bar('kick:R')))).toEqual(['limbs']);
    expect(rules(stickingFaults(card, grid, bar('snare')))).toEqual(['limbs']);
    expect(rules(stickingFaults(card, grid, bar('snare:R hihat:R')))).toContain('limbs');
    expect(rules(stickingFaults(card, grid, bar('snare:R hihat:L tomFloor:R')))).toContain('limbs');
  });

  // The case: the same hand on three sixteenths in a row at 170 BPM.
  it('refuses single strokes of one hand at 8 a second or faster, round the loop too', () => {
    const card = cardOf({ tempo: 170, voices: ['snare'] });
    const faults = stickingFaults(card, grid, bar('snare:L', 'snare:L', 'snare:L'));
    expect(faults.filter((f) => f.rule === 'rate').map((f) => f.instant)).toEqual([1, 2]);
    expect(faults[0]?.message).toMatch(/does not ask for doubles/);
    // 119 BPM: every sixteenth on one hand is slower than 8 a second.
    const slower = cardOf({
      tempo: 119,
      voices: ['hihat'],
      ostinato: { voice: 'hihat', slots: [0, 1, 2, 3] },
    });
    const line = cells(...Array<string>(16).fill('hihat:R:ostinato'));
    expect(stickingFaults(slower, grid, line)).toEqual([]);
    // The seam: the last sixteenth runs into the first.
    const seam = cardOf({ tempo: 130, voices: ['snare'] });
    const round = cells('snare:R', ...Array<string>(14).fill('.'), 'snare:R');
    const [fault] = stickingFaults(seam, grid, round);
    expect(fault?.instant).toBe(0);
    expect(fault?.message).toMatch(/from the last bar into the first/);
  });

  it('allows a double when the card asks for doubles, never a triple nor a pair above 12 a second', () => {
    const card = cardOf({ tempo: 150, voices: ['snare'], sticking: { doubles: true } });
    expect(stickingFaults(card, grid, bar('snare:R', 'snare:R', 'snare:L', 'snare:L'))).toEqual([]);
    expect(rules(stickingFaults(card, grid, bar('snare:R', 'snare:R', 'snare:R')))).toContain(
      'rate',
    );
    const fast = cardOf({ tempo: 200, voices: ['snare'], sticking: { doubles: true } });
    expect(stickingFaults(fast, grid, bar('snare:R', 'snare:R'))[0]?.message).toMatch(/12 notes/);
  });

  it('limits each foot: doubles always, never three sixteenths in a row at 90 BPM', () => {
    const card = cardOf({ tempo: 90, voices: ['kick', 'snare'] });
    expect(stickingFaults(card, grid, bar('kick', 'kick'))).toEqual([]);
    const triple = stickingFaults(card, grid, bar('kick', 'kick', 'kick'));
    expect(triple.map((f) => f.code)).toEqual(['feet']);
    expect(
      stickingFaults(cardOf({ tempo: 89, voices: ['kick'] }), grid, bar('kick', 'kick', 'kick')),
    ).toEqual([]);
  });

  it('keeps the time on the leading hand for its whole pattern', () => {
    const raw = {
      tempo: 100,
      voices: ['snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0] },
    };
    const time = ['hihat:R:ostinato', '.', '.', '.'];
    const line = cells(...time, ...time, 'hihat:L:ostinato', '.', '.', '.', ...time);
    expect(rules(stickingFaults(cardOf(raw), grid, line))).toEqual(['time']);
    // Leading with the left hand (open-handed), the same notes must all be on the left.
    const left = cardOf({ ...raw, sticking: { lead: 'left' } });
    expect(rules(stickingFaults(left, grid, line)).filter((r) => r === 'time')).toHaveLength(3);
    // With alternate sticking the time may change hands (no time rule; the right hand on the
    // hi-hat while the left is idle is then a plain crossing).
    const alternate = cardOf({ ...raw, sticking: { lead: 'alternate' } });
    expect(rules(stickingFaults(alternate, grid, line))).not.toContain('time');
  });

  it('keeps a 4:3 on one ride cymbal on one hand', () => {
    const card = cardOf({
      meter: { beats: 3, unit: 4 },
      tempo: 66,
      voices: ['snare', 'ride'],
      rules: [{ kind: 'polyrhythm', voices: ['ride'], against: 4, span: 3 }],
    });
    const three = createGrid(1, [4, 4, 4]);
    const ride = (hand: string) => `ride:${hand}:polyrhythm`;
    const alternated = cells(
      ride('R'),
      '.',
      '.',
      ride('L'),
      '.',
      '.',
      ride('R'),
      '.',
      '.',
      ride('L'),
      '.',
      '.',
    );
    expect(rules(stickingFaults(card, three, alternated))).toEqual(['figure', 'figure']);
    const one = cells(
      ride('R'),
      '.',
      '.',
      ride('R'),
      '.',
      '.',
      ride('R'),
      '.',
      '.',
      ride('R'),
      '.',
      '.',
    );
    expect(stickingFaults(card, three, one)).toEqual([]);
  });

  it('refuses the left hand running high tom, floor tom, high tom while the right waits', () => {
    const card = cardOf({
      tempo: 72,
      voices: ['kick', 'hihat', 'tomHigh', 'tomFloor'],
      ostinato: { voice: 'hihat', slots: [0] },
    });
    const beat = ['hihat:R:ostinato', 'tomHigh:L', 'tomFloor:L', 'tomHigh:L'];
    const faults = stickingFaults(card, grid, cells(...beat, ...beat, ...beat, ...beat));
    expect(faults.filter((f) => f.rule === 'crossing')).toHaveLength(4);
    // R L L L in each beat: three notes of a run on the left hand while the right is free.
    expect(faults.filter((f) => f.rule === 'run')).toHaveLength(4);
    // The teacher's sticking: R L R L.
    const teacher = ['hihat:R:ostinato', 'tomHigh:L', 'tomFloor:R', 'tomHigh:L'];
    expect(
      stickingFaults(card, grid, cells(...teacher, ...teacher, ...teacher, ...teacher)),
    ).toEqual([]);
  });

  it('lets a hand reach its far side while the other hand is busy, never with the arms crossed both ways', () => {
    const card = cardOf({ tempo: 80, voices: ['snare', 'hihat', 'tomFloor', 'ride'] });
    // Both hands round the floor tom: R L R L.
    expect(
      stickingFaults(card, grid, bar('snare:R', 'snare:L', 'tomFloor:R', 'tomFloor:L')),
    ).toEqual([]);
    // The right hand on the hi-hat and the left on the ride at once.
    const tangled = stickingFaults(card, grid, bar('hihat:R ride:L'));
    expect(tangled.map((f) => f.rule)).toContain('crossing');
    expect(tangled[0]?.message).toMatch(/cross both ways/);
    // The left hand reaching under to the floor tom right after a crossed hi-hat stroke.
    const under = stickingFaults(card, grid, bar('hihat:R', 'tomFloor:L', 'snare:R'));
    expect(under.map((f) => f.message).join()).toMatch(/right before the left hand/);
  });

  it('mirrors the far sides for a left-handed player', () => {
    const card = cardOf({
      hand: 'left',
      tempo: 80,
      voices: ['snare', 'hihat', 'tomFloor', 'ride'],
    });
    // On a left-handed kit the ride is the left hand's own side.
    expect(stickingFaults(card, grid, bar('ride:L'))).toEqual([]);
    expect(rules(stickingFaults(card, grid, bar('ride:R')))).toEqual(['crossing']);
  });
});
