import { describe, expect, it } from 'vitest';
import { loopBarProblems, trainerProblems, wholeNumberProblem } from './playback-fields';

const TEMPO = { min: 20, max: 320 };

describe('wholeNumberProblem', () => {
  it('accepts whole numbers inside the range, ends included', () => {
    expect(wholeNumberProblem(20, TEMPO, 'Tempo', ' BPM')).toBeNull();
    expect(wholeNumberProblem(320, TEMPO, 'Tempo', ' BPM')).toBeNull();
  });

  it('refuses out-of-range, fractional and empty entries, naming the range', () => {
    expect(wholeNumberProblem(10000, TEMPO, 'Tempo', ' BPM')).toBe('Tempo must be 20–320 BPM.');
    expect(wholeNumberProblem(-5, TEMPO, 'Tempo', ' BPM')).toBe('Tempo must be 20–320 BPM.');
    expect(wholeNumberProblem(92.5, TEMPO, 'Tempo', ' BPM')).toBe(
      'Tempo must be a whole number, 20–320 BPM.',
    );
    expect(wholeNumberProblem(null, TEMPO, 'Tempo', ' BPM')).toBe(
      'Tempo: type a number, 20–320 BPM.',
    );
  });
});

describe('loopBarProblems', () => {
  it('keeps both ends inside the drill and in order, never swapping them', () => {
    expect(loopBarProblems(1, 4, 4)).toEqual({ from: null, to: null });
    expect(loopBarProblems(2, 2, 4)).toEqual({ from: null, to: null });
    expect(loopBarProblems(0, 999, 4)).toEqual({
      from: 'From bar must be 1–4.',
      to: 'To bar must be 1–4.',
    });
    expect(loopBarProblems(3, 2, 4)).toEqual({
      from: 'From bar 3 comes after To bar 2.',
      to: 'To bar must be 3 or later (the loop runs forward).',
    });
  });
});

describe('trainerProblems', () => {
  const draft = { start: 72, step: 4, every: 2, target: 92, direction: 'up' as const };

  it('accepts a ladder up to the target', () => {
    expect(trainerProblems(draft, TEMPO)).toEqual({
      start: null,
      step: null,
      every: null,
      target: null,
    });
  });

  it('refuses a start above the target when speeding up, and offers the way down', () => {
    expect(trainerProblems({ ...draft, start: 200, target: 60 }, TEMPO).start).toBe(
      'Speeding up starts below the target (60 BPM). Lower the start, or choose "Slow down".',
    );
  });

  it('accepts a descending ladder chosen on purpose, and refuses it the wrong way round', () => {
    const down = { ...draft, start: 200, target: 60, direction: 'down' as const };
    expect(trainerProblems(down, TEMPO).start).toBeNull();
    expect(trainerProblems({ ...down, start: 50 }, TEMPO).start).toBe(
      'Slowing down starts above the target (60 BPM). Raise the start, or choose "Speed up".',
    );
  });

  it('refuses equal tempos and out-of-range steps', () => {
    expect(trainerProblems({ ...draft, start: 92 }, TEMPO).start).toBe(
      'Start and target are both 92 BPM: nothing to train.',
    );
    expect(trainerProblems({ ...draft, step: 0, every: 65 }, TEMPO)).toMatchObject({
      step: 'Step must be 1–100 BPM.',
      every: 'Every must be 1–64 loops.',
    });
  });
});
