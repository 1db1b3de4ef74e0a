import { loadMusicFonts } from './score/music-fonts';

/**
 * A drill page opened cold waits on a chain: the app boots, the guard asks who is signed in, the
 * shell's chunks load, then the drill page's, then the preset request. Started from `main.ts`
 * before Angular boots, the chunks and the preset request all run at once instead; the page then
 * finds them done.
 */

/** `/drills/<cardId>`, the one path this applies to (not `/drills` itself). */
const DRILL_PATH = /^\/drills\/([^/]+)\/?$/;

let early: { readonly id: string; readonly body: Promise<unknown> } | null = null;

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

/**
 * On a drill page URL, start loading the page's code, the engraver, its fonts and the preset at
 * once. A failure is not reported here: the page's own import or load fails too and shows it.
 */
export function prefetchDrillPage(pathname: string): void {
  const id = drillCardId(pathname);
  if (id === null) return;
  const ignore = (): undefined => undefined;
  void import('../shell/shell').catch(ignore);
  void import('./drill-page').catch(ignore);
  void import('../../../shared/notation/render-vexflow').catch(ignore);
  void loadMusicFonts().catch(ignore);
  startEarlyPreset(id);
}

/** Request the preset `id` now; `takeEarlyPreset` hands the answer to the page. */
export function startEarlyPreset(id: string): void {
  const body = fetch(`/api/presets/${encodeURIComponent(id)}`, {
    credentials: 'same-origin',
    headers: { Accept: 'application/json' },
  }).then((res) => (res.ok ? res.json() : null));
  // Unread until the page asks; a network failure must not surface as an unhandled rejection
  // (the page then makes the request itself and reports it).
  body.catch(() => undefined);
  early = { id, body };
}

/**
 * The preset response fetched before the app booted, once, if it is for `id` and succeeded;
 * otherwise null, and the caller makes the request itself (so errors go the usual way).
 */
export async function takeEarlyPreset(id: string): Promise<unknown> {
  const taken = early;
  early = null;
  if (taken === null || taken.id !== id) return null;
  try {
    return await taken.body;
  } catch {
    return null;
  }
}

/** Whether an early preset request for `id` is waiting to be taken. */
export function hasEarlyPreset(id: string): boolean {
  return early?.id === id;
}
