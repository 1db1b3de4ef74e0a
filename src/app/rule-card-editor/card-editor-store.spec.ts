import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { blankCard } from './card-draft';
import { CardEditorStore } from './card-editor-store';
import { PROBLEM_DELAY_MS } from './preview-timing';

/** Lets the preview run and its messages show (jsdom has no workers: the engine runs in place). */
async function settle(): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve, PROBLEM_DELAY_MS + 200));
  TestBed.tick();
}

describe('CardEditorStore', () => {
  let store: CardEditorStore;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideZonelessChangeDetection(), CardEditorStore],
    });
    store = TestBed.inject(CardEditorStore);
    store.seed.set('amber-101');
    store.load(blankCard());
  });

  it('is clean once loaded, dirty after an edit, clean again after undo', () => {
    expect(store.dirty()).toBe(false);
    store.edit((card) => (card.tempo = 100), 'tempo');
    expect(store.dirty()).toBe(true);
    expect(store.canUndo()).toBe(true);
    store.undo();
    expect(store.dirty()).toBe(false);
    expect(store.canRedo()).toBe(true);
    store.redo();
    expect(store.card().tempo).toBe(100);
  });

  it('keeps the last good drill, marked stale, while the card is invalid', async () => {
    TestBed.tick();
    await settle();
    const good = store.lastGood();
    expect(good).not.toBeNull();
    expect(store.stale()).toBe(false);

    store.edit((card) => (card.tempo = 999), 'tempo');
    TestBed.tick();
    await settle();
    expect(store.outcome()?.status).toBe('invalid');
    expect(store.lastGood()).toBe(good);
    expect(store.stale()).toBe(true);
    expect(store.issues('tempo').join(' ')).toMatch(/Tempo must be between 20 and 320/);
    expect(store.issues('bars')).toEqual([]);
  });

  it('pins a bar of the drill on show and keeps it through a new seed', async () => {
    TestBed.tick();
    await settle();
    const barOne = store.lastGood()!.bars[0]!;
    store.togglePin(1);
    expect(store.isPinned(1)).toBe(true);
    store.seed.set('birch-202');
    TestBed.tick();
    await settle();
    expect(store.outcome()?.status).toBe('ready');
    expect(store.lastGood()!.seed).toBe('birch-202');
    expect(store.lastGood()!.bars[0]!.hits).toEqual(barOne.hits);
    store.togglePin(1);
    expect(store.pinned()).toEqual([]);
  });

  it('undoes and redoes the title, tags and level with the card, in the order they were made', () => {
    store.load(blankCard(), { title: 'Groove one', tags: ['linear'], level: null });
    store.editMeta({ title: 'Groove' }, 'title');
    store.editMeta({ title: 'Groove tw' }, 'title');
    store.editMeta({ title: 'Groove two' }, 'title');
    store.edit((card) => (card.tempo = 100), 'tempo');
    store.editMeta({ tags: ['linear', 'release'] });
    store.editMeta({ level: 'advanced' });
    expect(store.dirty()).toBe(true);

    store.undo();
    expect(store.meta().level).toBeNull();
    expect(store.meta().tags).toEqual(['linear', 'release']);
    store.undo();
    expect(store.meta().tags).toEqual(['linear']);
    expect(store.card().tempo).toBe(100);
    store.undo();
    expect(store.card().tempo).toBe(blankCard().tempo);
    expect(store.meta().title).toBe('Groove two');
    // The typed title folds into one step, as a typed number does.
    store.undo();
    expect(store.meta()).toEqual({ title: 'Groove one', tags: ['linear'], level: null });
    expect(store.canUndo()).toBe(false);
    expect(store.dirty()).toBe(false);

    store.redo();
    store.redo();
    store.redo();
    store.redo();
    expect(store.meta()).toEqual({
      title: 'Groove two',
      tags: ['linear', 'release'],
      level: 'advanced',
    });
    expect(store.card().tempo).toBe(100);
    expect(store.canRedo()).toBe(false);
  });

  it('counts a changed title as unsaved until saved, and an undone one as saved again', () => {
    store.editMeta({ level: 'beginner' });
    expect(store.dirty()).toBe(true);
    store.markSaved();
    expect(store.dirty()).toBe(false);
    store.undo();
    expect(store.meta().level).toBeNull();
    expect(store.dirty()).toBe(true);
  });

  it('leaves the preview alone when only the title changes', () => {
    const card = store.card();
    store.editMeta({ title: 'Another name' }, 'title');
    store.undo();
    expect(store.card()).toBe(card);
  });

  it('shows a drill without waiting, but holds a refusal back while typing goes on', async () => {
    TestBed.tick();
    await settle();
    const good = store.outcome();
    expect(good?.status).toBe('ready');

    // Typing "120": the "1" the engine refuses is never shown, the 120 is.
    store.edit((card) => (card.tempo = 1), 'tempo');
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, PROBLEM_DELAY_MS / 4));
    TestBed.tick();
    expect(store.outcome()).toBe(good);
    store.edit((card) => (card.tempo = 120), 'tempo');
    TestBed.tick();
    // No wait beyond the engine's own: the engine runs in place here, so one tick is enough.
    await Promise.resolve();
    TestBed.tick();
    expect(store.outcome()?.status).toBe('ready');
    expect(store.outcome()).not.toBe(good);
    await settle();
    expect(store.outcome()?.status).toBe('ready');

    store.edit((card) => (card.tempo = 1), 'tempo');
    TestBed.tick();
    await settle();
    expect(store.outcome()?.status).toBe('invalid');
  });
});
