import { AngularAppEngine } from '@angular/ssr';

/**
 * The server-side renderer, built by `ng build` into dist/ripplehall/server/server.mjs and loaded
 * by the Express server (server/client-pages.ts). It renders one page for a request; the data
 * the page needs travels in `context` (read with REQUEST_CONTEXT), so rendering asks no API.
 * Express calls it with its own address (http://localhost/…), never the visitor's Host header.
 */
const engine = new AngularAppEngine({ allowedHosts: ['localhost'] });

/** The page as drawn on the server, or null when it was not (an unknown route, a page left to the browser). */
export async function renderPage(url: string, context: unknown): Promise<string | null> {
  const response = await engine.handle(new Request(url), context);
  if (!response || response.status !== 200) return null;
  const html = await response.text();
  return html.includes('ng-server-context="ssr"') ? html : null;
}
