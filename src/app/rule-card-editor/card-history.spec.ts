import { describe, expect, it } from 'vitest';
import { CardHistory } from './card-history';

describe('CardHistory', () => {
  it('undoes and redoes edits in order', () => {
    const history = new CardHistory(1);
    history.push(2);
    history.push(3);
    expect(history.undo()).toBe(2);
    expect(history.undo()).toBe(1);
    expect(history.canUndo).toBe(false);
    expect(history.undo()).toBe(1);
    expect(history.redo()).toBe(2);
    expect(history.redo()).toBe(3);
    expect(history.canRedo).toBe(false);
  });

  it('folds keystrokes in one field into one step', () => {
    const history = new CardHistory('');
    history.push('1', 'tempo');
    history.push('12', 'tempo');
    history.push('120', 'tempo');
    history.push('x', 'bars');
    expect(history.undo()).toBe('120');
    expect(history.undo()).toBe('');
  });

  it('drops the redo steps once a new edit is made', () => {
    const history = new CardHistory('a');
    history.push('b');
    history.undo();
    history.push('c');
    expect(history.canRedo).toBe(false);
    expect(history.undo()).toBe('a');
  });

  it('starts a new step for the same field after an undo', () => {
    const history = new CardHistory(0);
    history.push(1, 'bars');
    history.undo();
    history.push(2, 'bars');
    history.push(3, 'bars');
    expect(history.undo()).toBe(0);
  });
});
