import { DestroyRef, Injectable, computed, inject, linkedSignal, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { ErrorStateMatcher } from '@angular/material/core';
import { distinctUntilChanged, map, of, switchMap, timer } from 'rxjs';
import type { Drill, DrillBar } from '../../../shared/generator/index';
import { freshSeed } from '../drills/seed-words';
import { inputText } from '../rule-cards/input-text';
import type { CardLevel } from '../rule-cards/rule-cards-api';
import { CardHistory } from './card-history';
import { PROBLEM_DELAY_MS } from './preview-timing';
import { blankCard, type CardDraft } from './card-draft';
import { issuesAt, type PreviewOutcome } from './card-preview-outcome';
import { previewRunner } from './preview-runner';

/** What the editor says about the card besides its rules: its title, tags and level. */
export interface CardMeta {
  readonly title: string;
  readonly tags: readonly string[];
  readonly level: CardLevel | null;
}

export const BLANK_META: CardMeta = { title: 'Untitled card', tags: [], level: null };

/** One step of the session's history: everything the editor edits. */
interface Snapshot {
  readonly card: CardDraft;
  readonly meta: CardMeta;
}

/**
 * The state of one editing session, shared by the editor's parts: the card being written with
 * its title, tags and level, their undo history, the seed and the live preview. Provided by the
 * editor page (one per session).
 */
@Injectable()
export class CardEditorStore {
  private readonly runner = previewRunner();
  private history = new CardHistory<Snapshot>({ card: blankCard(), meta: BLANK_META });
  private readonly historyTick = signal(0);
  private readonly savedJson = signal(JSON.stringify({ card: blankCard(), meta: BLANK_META }));

  readonly card = signal<CardDraft>(blankCard());
  readonly meta = signal<CardMeta>(BLANK_META);
  readonly seed = signal(freshSeed());
  /** Bars the teacher pinned in the preview, kept as drawn while the rest is regenerated. */
  readonly pinned = signal<readonly DrillBar[]>([]);
  readonly canUndo = computed(() => (this.historyTick(), this.history.canUndo));
  readonly canRedo = computed(() => (this.historyTick(), this.history.canRedo));
  readonly dirty = computed(
    () => JSON.stringify({ card: this.card(), meta: this.meta() }) !== this.savedJson(),
  );

  /**
   * The engine's answer for the card and seed. Every edit goes to the engine at once (it runs in
   * a worker, so typing does not wait for it, and an edit made while it works ends that run); a
   * drill shows as soon as it is ready, while a refusal waits PROBLEM_DELAY_MS for the next
   * keystroke, so typing "120" does not flash a message about tempo 1 or 12.
   */
  readonly outcome = toSignal<PreviewOutcome | null, null>(
    toObservable(
      computed(() => ({ card: this.card(), seed: this.seed(), keep: this.pinned() })),
    ).pipe(
      distinctUntilChanged((a, b) => a.card === b.card && a.seed === b.seed && a.keep === b.keep),
      switchMap((input) =>
        this.runner
          .run(input)
          .pipe(
            switchMap((outcome) =>
              outcome.status === 'ready'
                ? of(outcome)
                : timer(PROBLEM_DELAY_MS).pipe(map(() => outcome)),
            ),
          ),
      ),
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
  load(card: CardDraft, meta: CardMeta = BLANK_META): void {
    this.history = new CardHistory({ card, meta });
    this.card.set(card);
    this.meta.set(meta);
    this.pinned.set([]);
    this.savedJson.set(JSON.stringify({ card, meta }));
    this.historyTick.update((n) => n + 1);
  }

  /** The card and its title, tags and level have been saved as they are now. */
  markSaved(): void {
    this.savedJson.set(JSON.stringify({ card: this.card(), meta: this.meta() }));
  }

  /**
   * Change the card. `group` names the field being typed in, so its keystrokes undo as one step.
   * The draft is copied first, so `change` may write into it freely.
   */
  edit(change: (draft: CardDraft) => void, group: string | null = null): void {
    const next = structuredClone(this.card());
    change(next);
    this.record({ card: next, meta: this.meta() }, group);
  }

  /** Change the title, tags or level, as one undo step (or one per typed field, as `edit`). */
  editMeta(change: Partial<CardMeta>, group: string | null = null): void {
    this.record({ card: this.card(), meta: { ...this.meta(), ...change } }, group);
  }

  undo(): void {
    this.show(this.history.undo());
  }

  redo(): void {
    this.show(this.history.redo());
  }

  private record(next: Snapshot, group: string | null): void {
    this.history.push(next, group);
    this.show(next);
  }

  private show({ card, meta }: Snapshot): void {
    // A part that did not change keeps its identity (signals then do not notify), so undoing a
    // title does not regenerate the preview.
    this.card.set(card);
    this.meta.set(meta);
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
