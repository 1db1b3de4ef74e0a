import { DestroyRef, Injectable, computed, inject, linkedSignal, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { ErrorStateMatcher } from '@angular/material/core';
import { debounceTime, distinctUntilChanged, switchMap } from 'rxjs';
import type { Drill, DrillBar } from '../../../shared/generator/index';
import { freshSeed } from '../drills/seed-words';
import { inputText } from '../rule-cards/input-text';
import { CardHistory } from './card-history';
import { PREVIEW_DEBOUNCE_MS } from './preview-timing';
import { blankCard, type CardDraft } from './card-draft';
import { issuesAt, type PreviewOutcome } from './card-preview-outcome';
import { previewRunner } from './preview-runner';

/**
 * The state of one editing session, shared by the editor's parts: the card being written, its
 * undo history, the seed and the live preview. Provided by the editor page (one per session).
 */
@Injectable()
export class CardEditorStore {
  private readonly runner = previewRunner();
  private history = new CardHistory<CardDraft>(blankCard());
  private readonly historyTick = signal(0);
  private readonly savedJson = signal(JSON.stringify(blankCard()));

  readonly card = signal<CardDraft>(blankCard());
  readonly seed = signal(freshSeed());
  /** Bars the teacher pinned in the preview, kept as drawn while the rest is regenerated. */
  readonly pinned = signal<readonly DrillBar[]>([]);
  readonly canUndo = computed(() => (this.historyTick(), this.history.canUndo));
  readonly canRedo = computed(() => (this.historyTick(), this.history.canRedo));
  readonly dirty = computed(() => JSON.stringify(this.card()) !== this.savedJson());

  /** The engine's answer for the card and seed, recomputed after the teacher pauses. */
  readonly outcome = toSignal<PreviewOutcome | null, null>(
    toObservable(
      computed(() => ({ card: this.card(), seed: this.seed(), keep: this.pinned() })),
    ).pipe(
      debounceTime(PREVIEW_DEBOUNCE_MS),
      distinctUntilChanged((a, b) => a.card === b.card && a.seed === b.seed && a.keep === b.keep),
      switchMap((input) => this.runner.run(input)),
    ),
    { initialValue: null },
  );

  /** The last drill the engine produced, kept on screen while the card is being fixed. */
  readonly lastGood = linkedSignal<PreviewOutcome | null, Drill | null>({
    source: this.outcome,
    computation: (outcome, previous) =>
      outcome?.status === 'ready' ? outcome.drill : (previous?.value ?? null),
  });
  /** True when the preview shows an older drill than the card now describes. */
  readonly stale = computed(() => this.lastGood() !== null && this.outcome()?.status !== 'ready');

  /** Pin a bar of the drill now shown (or unpin it). */
  togglePin(bar: number): void {
    const drill = this.lastGood();
    if (this.pinned().some((kept) => kept.bar === bar)) {
      this.pinned.update((kept) => kept.filter((b) => b.bar !== bar));
      return;
    }
    const shown = drill?.bars.find((b) => b.bar === bar);
    if (shown) this.pinned.update((kept) => [...kept, shown].sort((a, b) => a.bar - b.bar));
  }

  isPinned(bar: number): boolean {
    return this.pinned().some((kept) => kept.bar === bar);
  }

  constructor() {
    inject(DestroyRef).onDestroy(() => this.runner.dispose());
  }

  /** Start a session on `card` (as loaded or as saved): history and dirty state begin here. */
  load(card: CardDraft): void {
    this.history = new CardHistory(card);
    this.card.set(card);
    this.pinned.set([]);
    this.savedJson.set(JSON.stringify(card));
    this.historyTick.update((n) => n + 1);
  }

  /** The card has been saved as it is now. */
  markSaved(): void {
    this.savedJson.set(JSON.stringify(this.card()));
  }

  /**
   * Change the card. `group` names the field being typed in, so its keystrokes undo as one step.
   * The draft is copied first, so `change` may write into it freely.
   */
  edit(change: (draft: CardDraft) => void, group: string | null = null): void {
    const next = structuredClone(this.card());
    change(next);
    this.history.push(next, group);
    this.card.set(next);
    this.historyTick.update((n) => n + 1);
  }

  undo(): void {
    this.card.set(this.history.undo());
    this.historyTick.update((n) => n + 1);
  }

  redo(): void {
    this.card.set(this.history.redo());
    this.historyTick.update((n) => n + 1);
  }

  /** Engine messages about the field at `path` (and inside it). */
  issues(path: string): string[] {
    return issuesAt(this.outcome(), path);
  }

  /** A `mat-error` shows whenever the engine has something to say about `path`. */
  errorState(path: string): ErrorStateMatcher {
    return { isErrorState: () => this.issues(path).length > 0 };
  }
}

/** A typed number, or what was typed when it is not one (the engine then says what is wrong). */
export function typedNumber(typed: Event | string): number | undefined {
  const trimmed = inputText(typed).trim();
  if (trimmed === '') return undefined;
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : (trimmed as unknown as number);
}
