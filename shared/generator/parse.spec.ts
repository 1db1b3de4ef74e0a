import { describe, expect, it } from 'vitest';
import { parseRuleCard, RuleCardError } from './index';

function errorOf(input: unknown): RuleCardError {
  try {
    parseRuleCard(input);
  } catch (error) {
    if (error instanceof RuleCardError) return error;
    throw error;
  }
  throw new Error('expected a RuleCardError');
}

describe('parseRuleCard', () => {
  it('fills every default', () => {
    expect(parseRuleCard({})).toEqual({
      meter: { beats: 4, unit: 4 },
      bars: 4,
      subdivision: 4,
      tempo: 90,
      voices: ['kick', 'snare', 'hihat'],
      layers: [],
      roles: { kick: 'anchor', snare: 'embellishment', hihat: 'embellishment' },
      hand: 'right',
      sticking: { lead: 'right', doubles: false },
      measure: 'lhl',
      density: 0.3,
      rules: [],
    });
    expect(
      parseRuleCard({ rules: [{ kind: 'backbeat', voice: 'snare', beats: [4, 2] }] }).rules[0],
    ).toEqual({
      kind: 'backbeat',
      voice: 'snare',
      beats: [2, 4],
      shift: 0,
      dynamic: 'accent',
    });
  });

  it('refuses unknown fields and names the likely intended one', () => {
    expect(errorOf({ tempoo: 90 }).message).toBe('Unknown field "tempoo". Did you mean "tempo"?');
    expect(errorOf({ tempoo: 90 }).path).toBe('tempoo');
    const rule = errorOf({ rules: [{ kind: 'avoidDownbeat', voice: 'kick', resolveEvry: 2 }] });
    expect(rule.message).toBe(
      'Rule 1 (avoidDownbeat): Unknown field "resolveEvry". Did you mean "resolveEvery"?',
    );
    expect(rule.path).toBe('rules[0].resolveEvry');
    expect(
      errorOf({ rules: [{ kind: 'backbeat', voice: 'snare', beats: [2], shfit: 1 }] }).message,
    ).toMatch(/Unknown field "shfit". Did you mean "shift"\?/);
    expect(errorOf({ meter: { beats: 4, unit: 4, groupng: [2, 2] } }).message).toMatch(
      /"groupng". Did you mean "grouping"/,
    );
    expect(errorOf({ colour: 'red' }).message).toMatch(
      /Unknown field "colour". Allowed here: "meter"/,
    );
  });

  it('groups compound and odd meters by default, and checks a given grouping', () => {
    const grouping = (beats: number, unit: number) =>
      parseRuleCard({ meter: { beats, unit } }).meter.grouping;
    // Compound meters in dotted-quarter beats of three eighths; 7/8 as 2+2+3 (common practice).
    expect(grouping(6, 8)).toEqual([3, 3]);
    expect(grouping(12, 8)).toEqual([3, 3, 3, 3]);
    expect(grouping(15, 8)).toEqual([3, 3, 3, 3, 3]);
    expect(grouping(7, 8)).toEqual([2, 2, 3]);
    expect(grouping(4, 4)).toBeUndefined();
    expect(
      parseRuleCard({ meter: { beats: 7, unit: 8, grouping: [3, 2, 2] } }).meter.grouping,
    ).toEqual([3, 2, 2]);
    expect(errorOf({ meter: { beats: 7, unit: 8, grouping: [3, 3] } }).message).toMatch(
      /grouping 3\+3 adds up to 6 beats, but the meter has 7/,
    );
  });

  it('names the field and its range in plain words', () => {
    const error = errorOf({ tempo: 400 });
    expect(error.message).toBe('Tempo must be between 20 and 320 beats per minute (got 400).');
    expect(error.path).toBe('tempo');
    expect(error.code).toBe('invalid_card');
    expect(errorOf({ bars: 0 }).message).toBe(
      'The number of bars must be between 1 and 64 (got 0).',
    );
    expect(errorOf({ meter: { beats: 4, unit: 3 } }).message).toMatch(
      /beat unit .* must be 2, 4, 8 or 16 \(got 3\)/,
    );
    expect(errorOf({ subdivision: 9 }).message).toBe(
      'Slots per beat must be between 1 and 8 in the subdivision (2 = eighths, 4 = sixteenths) (got 9).',
    );
    expect(errorOf({ density: 1.5 }).message).toBe(
      'The density must be a number between 0 and 1 (got 1.5).',
    );
    expect(errorOf({ tempo: 92.5 }).message).toBe('Tempo must be a whole number (got 92.5).');
  });

  it('says which rule is wrong', () => {
    const error = errorOf({
      rules: [{ kind: 'linear' }, { kind: 'backbeat', voice: 'snare', beats: [2], shift: 99 }],
    });
    expect(error.path).toBe('rules[1].shift');
    expect(error.message).toBe(
      'Rule 2 (backbeat): The backbeat shift must be between -32 and 32 slots (got 99).',
    );
    expect(errorOf({ rules: [{ kind: 'swing' }] }).message).toMatch(
      /Unknown rule kind \(got "swing"\)/,
    );
  });

  it('checks fields against each other', () => {
    expect(errorOf({ subdivision: [4, 4, 3] }).message).toMatch(
      /lists 3 beats, but the meter has 4/,
    );
    expect(
      errorOf({ subdivision: [4, 3, 4, 4], ostinato: { voice: 'hihat', slots: [0, 3] } }).message,
    ).toBe(
      'The ostinato plays slot 3 of every beat, but beat 2 has only 3 slots (numbered 0 to 2).',
    );
    expect(
      errorOf({
        voices: ['kick', 'hihat'],
        rules: [{ kind: 'backbeat', voice: 'snare', beats: [2] }],
      }).message,
    ).toMatch(
      /Rule 1 \(backbeat\) uses the snare, which is not among the card's voices \(kick and hi-hat\)/,
    );
    expect(errorOf({ rules: [{ kind: 'backbeat', voice: 'snare', beats: [5] }] }).message).toMatch(
      /only 4 beats/,
    );
    expect(
      errorOf({
        rules: [
          { kind: 'tension', curve: [0.1] },
          { kind: 'tension', curve: [0.2] },
        ],
      }).message,
    ).toMatch(/only one tension rule/);
    expect(
      errorOf({ rules: [{ kind: 'euclid', voice: 'kick', pulses: 9, steps: 8 }] }).message,
    ).toMatch(/more pulses than steps/);
  });

  it('accepts a per-beat subdivision mixing tuplets', () => {
    const card = parseRuleCard({
      meter: { beats: 3, unit: 4 },
      subdivision: [4, 5, 3],
      ostinato: { voice: 'hihat', slots: [0] },
    });
    expect(card.subdivision).toEqual([4, 5, 3]);
  });
});
