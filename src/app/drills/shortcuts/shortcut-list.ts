/** One keyboard shortcut of the drill page, as the help list shows it. */
export interface Shortcut {
  /** Keys as printed on the keyboard, one `<kbd>` each ("Shift", "↑"). */
  readonly keys: readonly string[];
  readonly does: string;
}

export interface ShortcutGroup {
  readonly where: string;
  readonly shortcuts: readonly Shortcut[];
}

/**
 * The keys the drill page answers (see playback-keys.ts and the score's arrow keys). Kept here,
 * beside the help that lists them, so a new key means one more line in one place.
 */
export const DRILL_SHORTCUTS: readonly ShortcutGroup[] = [
  {
    where: 'Anywhere on the page (not while typing in a field)',
    shortcuts: [
      { keys: ['Space'], does: 'Play or stop' },
      { keys: ['↑'], does: 'Tempo up 1 BPM' },
      { keys: ['↓'], does: 'Tempo down 1 BPM' },
      { keys: ['Shift', '↑'], does: 'Tempo up 5 BPM' },
      { keys: ['Shift', '↓'], does: 'Tempo down 5 BPM' },
      { keys: ['1 … 9'], does: 'Mute or unmute voice 1 to 9, in the order listed' },
      { keys: ['Shift', '1 … 9'], does: 'Solo voice 1 to 9' },
      { keys: ['?'], does: 'Show this list' },
    ],
  },
  {
    where: 'On the score (click it or Tab to it first)',
    shortcuts: [
      { keys: ['→'], does: 'Pick the next beat: Play starts there' },
      { keys: ['←'], does: 'Pick the previous beat' },
      { keys: ['Esc'], does: 'Clear the picked beat: Play starts at the top' },
    ],
  },
];

/** Whether a key event asks for the shortcut list ("?", with or without Shift). */
export function asksForShortcuts(
  event: Pick<KeyboardEvent, 'key' | 'ctrlKey' | 'altKey' | 'metaKey'>,
): boolean {
  return event.key === '?' && !event.ctrlKey && !event.altKey && !event.metaKey;
}
