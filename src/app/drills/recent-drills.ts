import { DOCUMENT } from '@angular/common';
import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';

import { AuthSession } from '../core/auth-session';

/** One drill this browser showed: enough to name it in a list and open it again. */
export interface RecentDrill {
  readonly cardId: string;
  /** The rule card's title when the drill was shown. */
  readonly title: string;
  readonly seed: string;
  /** When it was last shown, as an ISO 8601 timestamp. */
  readonly openedAt: string;
}

/** How many drills the list keeps; older ones drop off the end. */
export const RECENT_DRILLS_LIMIT = 20;

/** localStorage key prefix; the signed-in person's id follows, so accounts never see each other's. */
export const RECENT_DRILLS_KEY = 'tensile.recent-drills';

/** Ids, titles and seeds longer than this are not ours (or were tampered with) and are dropped. */
const MAX_FIELD_LENGTH = 200;

/**
 * The drills this browser opened recently, newest first, kept in localStorage per signed-in
 * person. Storage that is missing, full or unreadable degrades to an empty list, never an error:
 * the list is a convenience, not a record.
 */
@Injectable({ providedIn: 'root' })
export class RecentDrills {
  private readonly session = inject(AuthSession);
  private readonly storage = localStorageOf(inject(DOCUMENT).defaultView);
  /** Bumped after every write, and when another tab writes our key, so `entries` re-reads. */
  private readonly revision = signal(0);
  private readonly key = computed(() => {
    const id = this.session.user()?.id;
    return id === undefined ? null : `${RECENT_DRILLS_KEY}.${id}`;
  });

  /** Newest first, at most {@link RECENT_DRILLS_LIMIT}. */
  readonly entries = computed<readonly RecentDrill[]>(() => {
    this.revision();
    const key = this.key();
    return key && this.storage ? parseEntries(safeGet(this.storage, key)) : [];
  });

  constructor() {
    const view = inject(DOCUMENT).defaultView;
    const onStorage = (event: StorageEvent) => {
      if (event.key === null || event.key === this.key()) this.revision.update((n) => n + 1);
    };
    view?.addEventListener('storage', onStorage);
    inject(DestroyRef).onDestroy(() => view?.removeEventListener('storage', onStorage));
  }

  /** Put a drill at the top of the list (moving it up if it is already there). */
  record(drill: Omit<RecentDrill, 'openedAt'>, openedAt: Date = new Date()): void {
    const entry: RecentDrill = { ...drill, openedAt: openedAt.toISOString() };
    if (!isRecentDrill(entry)) return;
    const others = this.entries().filter((e) => e.cardId !== entry.cardId || e.seed !== entry.seed);
    this.write([entry, ...others].slice(0, RECENT_DRILLS_LIMIT));
  }

  /** Forget every recent drill of the signed-in person in this browser. */
  clear(): void {
    const key = this.key();
    if (!key || !this.storage) return;
    try {
      this.storage.removeItem(key);
    } catch {
      // Storage refused; nothing was stored that we could remove either.
    }
    this.revision.update((n) => n + 1);
  }

  private write(entries: readonly RecentDrill[]): void {
    const key = this.key();
    if (!key || !this.storage) return;
    try {
      this.storage.setItem(key, JSON.stringify(entries));
    } catch {
      // Full or blocked storage: the drill still plays, it just is not remembered.
    }
    this.revision.update((n) => n + 1);
  }
}

/** Reads stored text into entries, skipping anything malformed. */
export function parseEntries(text: string | null): readonly RecentDrill[] {
  if (!text) return [];
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return [];
  }
  return Array.isArray(value) ? value.filter(isRecentDrill).slice(0, RECENT_DRILLS_LIMIT) : [];
}

function isRecentDrill(value: unknown): value is RecentDrill {
  if (typeof value !== 'object' || value === null) return false;
  const { cardId, title, seed, openedAt } = value as Record<string, unknown>;
  return (
    [cardId, title, seed].every(
      (field) =>
        typeof field === 'string' && field.trim() !== '' && field.length <= MAX_FIELD_LENGTH,
    ) &&
    typeof openedAt === 'string' &&
    !Number.isNaN(Date.parse(openedAt))
  );
}

function localStorageOf(view: Window | null): Storage | null {
  try {
    // Reading the property itself throws where storage is disabled for the site.
    return view?.localStorage ?? null;
  } catch {
    return null;
  }
}

function safeGet(storage: Storage, key: string): string | null {
  try {
    return storage.getItem(key);
  } catch {
    return null;
  }
}
