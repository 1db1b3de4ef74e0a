/**
 * The engine's version, recorded in every drill. Bump it whenever the same card and seed could
 * produce a different drill (golden files under tests/golden are then regenerated).
 */
export const ENGINE_VERSION = '2.7';
