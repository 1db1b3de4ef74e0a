/** How long the preview waits after the last edit, so typing "120" generates once, not thrice. */
export const PREVIEW_DEBOUNCE_MS = 120;
