/**
 * A page's main API answer asked for as the app starts, before Angular boots, routes, checks who
 * is signed in and fetches the page's code: those steps then run while the answer travels instead
 * of before it. Only a plain successful JSON answer is kept; anything else (signed out, an error,
 * a network fault) is dropped, and the page asks again through HttpClient as usual, so its error
 * handling (sign-in redirect, messages) is unchanged. Each early answer is taken at most once.
 */

/** The API address a page's address asks for first, or null for pages that start nothing early. */
export function earlyApiFor(pathname: string): string | null {
  const replay = /^\/replay\/(\d{1,12})$/.exec(pathname);
  return replay ? `/api/rehearsals/${replay[1]}/replay` : null;
}

const started = new Map<string, Promise<unknown>>();

/** Starts the request for this address's page, if it has one (main.ts calls this first thing). */
export function startEarlyRequest(pathname: string, fetchFn: typeof fetch = globalThis.fetch?.bind(globalThis)): void {
  const url = earlyApiFor(pathname);
  if (!url || !fetchFn) return;
  const answer = fetchFn(url, { credentials: 'same-origin', headers: { Accept: 'application/json' } })
    .then((res) => (res.ok && (res.headers.get('content-type') ?? '').includes('application/json') ? res.json() : null))
    .catch(() => null);
  started.set(url, answer);
}

/** The early answer for `url` (null when none was started or it did not succeed); forgotten once taken. */
export function takeEarlyAnswer<T>(url: string): Promise<T | null> | null {
  const answer = started.get(url);
  if (!answer) return null;
  started.delete(url);
  return answer as Promise<T | null>;
}
