import { RenderMode, type ServerRoute } from '@angular/ssr';

/**
 * Only a participant's own page is drawn on the server: a phone opening its link shows the
 * greeting and the notice as soon as the page arrives, and the app takes it over (hydration)
 * once its code has run. Every other page is drawn in the browser, as before.
 */
export const serverRoutes: ServerRoute[] = [
  { path: 'p/:token', renderMode: RenderMode.Server },
  { path: '**', renderMode: RenderMode.Client },
];
