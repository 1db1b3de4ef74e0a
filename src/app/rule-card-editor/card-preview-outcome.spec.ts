import { describe, expect, it } from 'vitest';
import { blankCard } from './card-draft';
import { conflictFor, issuesAt, previewOutcome, unplacedIssues } from './card-preview-outcome';

describe('previewOutcome', () => {
  it('generates the blank card', () => {
    const outcome = previewOutcome(blankCard(), 'amber-101');
    expect(outcome.status).toBe('ready');
    if (outcome.status === 'ready') expect(outcome.drill.bars).toHaveLength(4);
  });

  it('places an out-of-range tempo beside the tempo field only', () => {
    const outcome = previewOutcome({ ...blankCard(), tempo: 999 }, 'amber-101');
    expect(outcome.status).toBe('invalid');
    expect(issuesAt(outcome, 'tempo').join(' ')).toMatch(/Tempo must be between 20 and 320/);
    expect(issuesAt(outcome, 'bars')).toEqual([]);
    expect(unplacedIssues(outcome, ['tempo'])).toEqual([]);
  });

  it('places a rule problem on that rule', () => {
    const card = blankCard();
    const outcome = previewOutcome(
      { ...card, rules: [{ kind: 'euclid', voice: 'kick', pulses: 9, steps: 8 }] },
      'amber-101',
    );
    expect(issuesAt(outcome, 'rules[0]').join(' ')).toMatch(/more pulses than steps/);
    expect(issuesAt(outcome, 'rules[1]')).toEqual([]);
  });

  it('names the rules of a conflict', () => {
    // A backbeat on the ostinato's own slots cannot coexist with a linear rule (drill contract).
    const outcome = previewOutcome(
      {
        ...blankCard(),
        ostinato: { voice: 'hihat', slots: [0], dynamic: 'normal' },
        rules: [
          { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
          { kind: 'linear', maxOverlaps: 0 },
        ],
      },
      'amber-101',
    );
    expect(outcome.status).toBe('conflict');
    expect(conflictFor(outcome, 'linear')).toMatch(/\S/);
    expect(conflictFor(outcome, 'euclid')).toBeNull();
  });
});
