/**
 * Keyboard shortcuts of the playback panel, decided from the key event alone so they can be
 * tested without a page: space plays or stops, arrows change the tempo (Shift: by 5), digit keys
 * 1–9 mute voice n (Shift: solo).
 */

export type PlaybackKeyAction =
  | { readonly kind: 'togglePlay' }
  | { readonly kind: 'tempo'; readonly by: number }
  | { readonly kind: 'mute' | 'solo'; readonly voiceIndex: number };

/** What a key event needs to expose (a `KeyboardEvent` does). */
export interface KeyLike {
  readonly key: string;
  readonly code: string;
  readonly shiftKey: boolean;
  readonly ctrlKey: boolean;
  readonly altKey: boolean;
  readonly metaKey: boolean;
  readonly target: EventTarget | null;
}

const TYPING_INPUTS = new Set([
  'text',
  'number',
  'search',
  'email',
  'password',
  'url',
  'tel',
  'range',
]);

/** Whether keys typed here belong to the field (text, numbers, sliders, editable content). */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!(target instanceof Element)) return false;
  if (target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true;
  if (target instanceof HTMLInputElement) return TYPING_INPUTS.has(target.type);
  return target.closest('[contenteditable=""], [contenteditable="true"]') !== null;
}

/** Controls where space already means "press this". */
function isPressable(target: EventTarget | null): boolean {
  return (
    target instanceof Element &&
    target.closest(
      'button, a[href], [role="button"], [role="switch"], [role="checkbox"], [role="radio"], input',
    ) !== null
  );
}

/** Widgets that use the arrow keys themselves. */
function usesArrows(target: EventTarget | null): boolean {
  return (
    target instanceof Element &&
    target.closest(
      '[role="radiogroup"], [role="listbox"], [role="menu"], [role="tablist"], [role="slider"], [role="grid"]',
    ) !== null
  );
}

const DIGIT = /^(?:Digit|Numpad)([1-9])$/;

/** The panel action for a key, or `null` to leave the key alone. */
export function playbackKeyAction(event: KeyLike): PlaybackKeyAction | null {
  if (event.ctrlKey || event.altKey || event.metaKey || isTypingTarget(event.target)) return null;
  if (event.key === ' ' || event.code === 'Space') {
    return isPressable(event.target) ? null : { kind: 'togglePlay' };
  }
  if (event.key === 'ArrowUp' || event.key === 'ArrowDown') {
    if (usesArrows(event.target)) return null;
    const by = (event.shiftKey ? 5 : 1) * (event.key === 'ArrowUp' ? 1 : -1);
    return { kind: 'tempo', by };
  }
  const digit = DIGIT.exec(event.code);
  if (digit?.[1] !== undefined) {
    return { kind: event.shiftKey ? 'solo' : 'mute', voiceIndex: Number(digit[1]) - 1 };
  }
  return null;
}
