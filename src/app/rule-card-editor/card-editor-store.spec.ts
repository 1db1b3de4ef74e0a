import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { beforeEach, describe, expect, it } from 'vitest';
import { blankCard } from './card-draft';
import { CardEditorStore } from './card-editor-store';
import { PREVIEW_DEBOUNCE_MS } from './preview-timing';

/** Lets the debounced preview run (jsdom has no workers, so the engine runs in place). */
async function settle(): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve, PREVIEW_DEBOUNCE_MS + 200));
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
});
