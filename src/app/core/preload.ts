import { isPlatformServer } from '@angular/common';
import { inject, Injectable, PLATFORM_ID } from '@angular/core';
import type { PreloadingStrategy, Route } from '@angular/router';
import { type Observable, of, switchMap, timer } from 'rxjs';

/**
 * How long the projector replay lets its first frames go before the other pages' code is
 * fetched and run: that work would otherwise land on the main thread just as the replay draws.
 */
export const REPLAY_PRELOAD_DELAY_MS = 3000;

/**
 * Once a facilitator's page (or the sign-in page) is shown, the other pages' code is fetched in
 * the background, so the next click does not wait for a cold chunk. A participant's pages (/p/…)
 * preload nothing: a phone on a slow network fetches only what its own page needs. Opened on the
 * projector replay, the preloading waits REPLAY_PRELOAD_DELAY_MS.
 */
@Injectable({ providedIn: 'root' })
export class FacilitatorPreload implements PreloadingStrategy {
  private readonly onServer = isPlatformServer(inject(PLATFORM_ID));

  preload(route: Route, load: () => Observable<unknown>): Observable<unknown> {
    if (this.onServer) return of(null);
    const path = globalThis.location?.pathname ?? '';
    if (route.path === 'p' || route.path?.startsWith('p/') || /^\/p(\/|$)/.test(path)) return of(null);
    if (/^\/replay\//.test(path)) return timer(REPLAY_PRELOAD_DELAY_MS).pipe(switchMap(() => load()));
    return load();
  }
}
