/**
 * The session check (`GET /api/auth/me`) started before Angular boots. Every signed-in page waits
 * for it in its guard; asked from `main.ts` it runs beside the page's code instead of after the
 * app has booted. `AuthSession` takes the answer once.
 */

/** What the early request got: the status and, when it was JSON, the body. */
export interface EarlySessionAnswer {
  readonly status: number;
  readonly body: unknown;
}

let early: Promise<EarlySessionAnswer | null> | null = null;

/** Ask the server who is signed in now; `takeEarlySession` hands the answer over. */
export function startEarlySession(url: string): void {
  early = fetch(url, { credentials: 'same-origin', headers: { Accept: 'application/json' } }).then(
    async (res) => ({ status: res.status, body: res.ok ? await res.json() : null }),
    // A network failure is left to the app's own request, which reports it the usual way.
    () => null,
  );
}

/**
 * The early answer, once, or null when none was started (the caller then asks at once, in the
 * same turn, as it always did); an early request that failed on the network answers null.
 */
export function takeEarlySession(): Promise<EarlySessionAnswer | null> | null {
  const taken = early;
  early = null;
  return taken === null ? null : taken.catch(() => null);
}
