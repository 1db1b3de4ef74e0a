import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { COLOR_SCHEME_KEY, ThemePreference, applySavedChoice } from './theme-preference';

describe('ThemePreference', () => {
  const root = document.documentElement.classList;

  beforeEach(() => {
    localStorage.clear();
    root.remove('tensile-light', 'tensile-dark');
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  });
  afterEach(() => localStorage.clear());

  it('follows the system until toggled, then pins and remembers the opposite scheme', () => {
    const theme = TestBed.inject(ThemePreference);
    expect(theme.choice()).toBe('system');
    TestBed.tick();
    expect(root.contains('tensile-dark') || root.contains('tensile-light')).toBe(false);

    const before = theme.effective();
    theme.toggle();
    TestBed.tick();
    const after = before === 'dark' ? 'light' : 'dark';
    expect(theme.effective()).toBe(after);
    expect(root.contains(`tensile-${after}`)).toBe(true);
    expect(localStorage.getItem(COLOR_SCHEME_KEY)).toBe(after);
  });

  it('applies a saved scheme before the app boots', () => {
    localStorage.setItem(COLOR_SCHEME_KEY, 'dark');
    applySavedChoice(document);
    expect(root.contains('tensile-dark')).toBe(true);
    expect(TestBed.inject(ThemePreference).choice()).toBe('dark');
  });

  it('ignores a tampered stored value', () => {
    localStorage.setItem(COLOR_SCHEME_KEY, 'sepia');
    expect(TestBed.inject(ThemePreference).choice()).toBe('system');
  });
});
