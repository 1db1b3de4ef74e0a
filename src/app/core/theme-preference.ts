import { DOCUMENT } from '@angular/common';
import { Injectable, computed, effect, inject, signal } from '@angular/core';

/** 'system' follows `prefers-color-scheme`; the other two pin a scheme. */
export type ColorSchemeChoice = 'system' | 'light' | 'dark';

/** localStorage key for the scheme choice. */
export const COLOR_SCHEME_KEY = 'tensile.color-scheme';

/**
 * The light/dark choice, persisted in localStorage and applied as a class on <html>
 * (styles.scss maps the class to `color-scheme`, which drives every light-dark() token).
 */
@Injectable({ providedIn: 'root' })
export class ThemePreference {
  private readonly document = inject(DOCUMENT);
  private readonly media = this.document.defaultView?.matchMedia?.('(prefers-color-scheme: dark)');
  private readonly systemDark = signal(this.media?.matches ?? false);

  /** What the person chose. */
  readonly choice = signal<ColorSchemeChoice>(readChoice(this.document));
  /** The scheme actually shown. */
  readonly effective = computed(() =>
    this.choice() === 'system' ? (this.systemDark() ? 'dark' : 'light') : this.choice(),
  );

  constructor() {
    this.media?.addEventListener?.('change', (event) => this.systemDark.set(event.matches));
    effect(() => applyChoice(this.document, this.choice()));
  }

  /** Flips between light and dark, pinning the opposite of what is shown now. */
  toggle(): void {
    this.choice.set(this.effective() === 'dark' ? 'light' : 'dark');
  }
}

function readChoice(document: Document): ColorSchemeChoice {
  try {
    const saved = document.defaultView?.localStorage.getItem(COLOR_SCHEME_KEY);
    return saved === 'light' || saved === 'dark' ? saved : 'system';
  } catch {
    return 'system'; // storage blocked (private mode, strict settings)
  }
}

/** Applies a choice to <html> and storage; exported so main.ts can apply it before first paint. */
export function applyChoice(document: Document, choice: ColorSchemeChoice): void {
  const root = document.documentElement.classList;
  root.toggle('tensile-light', choice === 'light');
  root.toggle('tensile-dark', choice === 'dark');
  try {
    const storage = document.defaultView?.localStorage;
    if (choice === 'system') storage?.removeItem(COLOR_SCHEME_KEY);
    else storage?.setItem(COLOR_SCHEME_KEY, choice);
  } catch {
    // Storage blocked: the choice still applies for this visit.
  }
}

/** Applies the saved scheme before Angular boots, so a dark-mode user never sees a light flash. */
export function applySavedChoice(document: Document): void {
  applyChoice(document, readChoice(document));
}
