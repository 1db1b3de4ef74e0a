/**
 * How long a refusal of the card (a message beside a field) waits for the next keystroke before
 * it shows, so typing "120" does not flash a message about tempo 1. A drill the engine could make
 * shows at once: the engine runs off the page's main thread, so there is no typing to protect.
 */
export const PROBLEM_DELAY_MS = 400;
