import { Injectable } from '@angular/core';
import type { PreloadingStrategy, Route } from '@angular/router';
import { type Observable, of } from 'rxjs';

/**
 * Once a facilitator's page (or the sign-in page) is shown, the other pages' code is fetched in
 * the background, so the next click does not wait for a cold chunk. A participant's pages (/p/…)
 * preload nothing: a phone on a slow network fetches only what its own page needs.
 */
@Injectable({ providedIn: 'root' })
export class FacilitatorPreload implements PreloadingStrategy {
  preload(route: Route, load: () => Observable<unknown>): Observable<unknown> {
    if (route.path === 'p' || route.path?.startsWith('p/') || /^\/p(\/|$)/.test(globalThis.location?.pathname ?? '')) return of(null);
    return load();
  }
}
