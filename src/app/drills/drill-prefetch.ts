import { AUTH_ME_URL } from '../core/auth-session';
import { startEarlySession } from '../core/early-session';
import { loadMusicFonts } from './score/music-fonts';
import { MAX_SEED_LENGTH } from './seed-problem';

/**
 * A drill page opened cold waits on a chain: the app boots, the guard asks who is signed in, the
 * shell's chunks load, then the drill page's, then the preset and its drill. Started from
 * `main.ts` before Angular boots, the chunks and the requests all run at once instead; the page
 * then finds them done.
 */

/** `/drills/<cardId>`, the one path this applies to (not `/drills` itself). */
const DRILL_PATH = /^\/drills\/([^/]+)\/?$/;

/** Answers of requests started before the app booted, by URL, each taken once. */
const early = new Map<string, Promise<unknown>>();

/** The card id a drill page URL names, or null for any other path. */
export function drillCardId(pathname: string): string | null {
  const match = DRILL_PATH.exec(pathname);
  if (!match) return null;
  try {
    return decodeURIComponent(match[1]!);
  } catch {
    // A malformed escape: the page itself reports the unknown card.
    return null;
  }
}

/** The seed a drill page uses for a `?seed=` value (trimmed and cut as the page does), or null. */
export function drillSeed(search: string): string | null {
  const seed = new URLSearchParams(search).get('seed');
  return seed?.trim().slice(0, MAX_SEED_LENGTH) || null;
}

/** Where the server answers a preset's drill at a seed. */
export function presetDrillUrl(id: string, seed: string): string {
  return `/api/presets/${encodeURIComponent(id)}/drill?seed=${encodeURIComponent(seed)}`;
}

/**
 * On a drill page URL, start the session check and loading the page's code, the engraver, its
 * fonts, the preset and (with a seed in the URL) its drill at once. A failure is not reported
 * here: the page's own import or request fails too and shows it.
 */
export function prefetchDrillPage(pathname: string, search = ''): void {
  const id = drillCardId(pathname);
  if (id === null) return;
  const ignore = (): undefined => undefined;
  // The signed-in guard's question, asked now rather than once the router has booted.
  startEarlySession(AUTH_ME_URL);
  const seed = drillSeed(search);
  if (seed !== null) startEarlyDrill(id, seed);
  startEarlyPreset(id);
  void import('../shell/shell').catch(ignore);
  void import('./drill-page').catch(ignore);
  void import('../../../shared/notation/render-vexflow').catch(ignore);
  void loadMusicFonts().catch(ignore);
}

/** Request the preset `id` now; `takeEarlyPreset` hands the answer to the page. */
export function startEarlyPreset(id: string): void {
  startEarly(`/api/presets/${encodeURIComponent(id)}`);
}

/** Request the drill of preset `id` at `seed` now; `takeEarlyDrill` hands the answer over. */
export function startEarlyDrill(id: string, seed: string): void {
  startEarly(presetDrillUrl(id, seed));
}

/**
 * The preset response fetched before the app booted, once, if it is for `id` and succeeded;
 * otherwise null, and the caller makes the request itself (so errors go the usual way).
 */
export function takeEarlyPreset(id: string): Promise<unknown> {
  return takeEarly(`/api/presets/${encodeURIComponent(id)}`);
}

/** The early drill response for `id` at `seed`, once, if it succeeded; otherwise null. */
export function takeEarlyDrill(id: string, seed: string): Promise<unknown> {
  return takeEarly(presetDrillUrl(id, seed));
}

/** Whether an early preset request for `id` is waiting to be taken. */
export function hasEarlyPreset(id: string): boolean {
  return early.has(`/api/presets/${encodeURIComponent(id)}`);
}

/** Whether an early drill request for `id` at `seed` is waiting to be taken. */
export function hasEarlyDrill(id: string, seed: string): boolean {
  return early.has(presetDrillUrl(id, seed));
}

function startEarly(url: string): void {
  const body = fetch(url, {
    credentials: 'same-origin',
    headers: { Accept: 'application/json' },
  }).then((res) => (res.ok ? res.json() : null));
  // Unread until the page asks; a network failure must not surface as an unhandled rejection
  // (the page then makes the request itself and reports it).
  body.catch(() => undefined);
  early.set(url, body);
}

async function takeEarly(url: string): Promise<unknown> {
  const taken = early.get(url);
  early.delete(url);
  if (taken === undefined) return null;
  try {
    return await taken;
  } catch {
    return null;
  }
}
