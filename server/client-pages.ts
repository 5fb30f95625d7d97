import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import express, { type Express, type Request, type Response } from 'express';
import { config } from './config';
import { csrfCookieForPage } from './core/csrf';
import { logger } from './core/logging';
import { firstState, firstStateBlock } from './participants/first-page';

const browserDir = config.CLIENT_DIR ?? fileURLToPath(new URL('../dist/ripplehall/browser', import.meta.url));
/** `ng build` puts the server renderer beside the browser files (src/server.ts). */
const rendererFile = join(dirname(browserDir), 'server', 'server.mjs');

/** Static imports of a built chunk (`from"./chunk-….js"`, `import"./chunk-….js"`, either quote). */
function staticImports(file: string): string[] {
  const text = readFileSync(`${browserDir}/${file}`, 'utf8');
  return [...text.matchAll(/(?:from|import)\s*["'`]\.\/(chunk-[\w-]+\.js)["'`]/g)].flatMap((m) => (m[1] ? [m[1]] : []));
}

/**
 * modulepreload links for everything a page that is opened cold runs before it shows (a
 * participant's page, the projector replay): the route's lazy chunk (its `import("./chunk-….js")`
 * in main-*.js, found by the route's path) and every chunk it or main-*.js imports, however deep,
 * less those index.html already links. The browser then asks for all of them at once instead of
 * discovering one level after another (and, for the replay, before the sign-in check answers).
 * If the build's shape ever differs, no link is added and the page loads as before.
 */
function routePreloads(indexHtml: string, routePath: string): string {
  try {
    const main = readdirSync(browserDir).find((f) => /^main-[\w-]+\.js$/.test(f));
    if (!main) return '';
    const escaped = routePath.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
    const route = new RegExp(`path:["'\`]${escaped}["'\`].{0,300}?import\\(["'\`]\\./(chunk-[\\w-]+\\.js)["'\`]\\)`).exec(
      readFileSync(`${browserDir}/${main}`, 'utf8'),
    );
    if (!route?.[1]) return '';
    const seen = new Set<string>();
    const queue = [main, route[1]];
    while (queue.length) {
      const file = queue.shift()!;
      if (seen.has(file)) continue;
      seen.add(file);
      queue.push(...staticImports(file));
    }
    seen.delete(main);
    return [...seen]
      .filter((f) => !indexHtml.includes(`"${f}"`))
      .map((f) => `<link rel="modulepreload" href="${f}">`)
      .join('');
  } catch {
    return '';
  }
}

/**
 * preload links for the text fonts the page's stylesheet names (woff2): a phone then fetches them
 * beside the stylesheet, not once it has been read and the page laid out, and the first paint,
 * which waits a moment for its fonts, comes sooner. Icons are not preloaded (the phone pages show none).
 */
function fontPreloads(indexHtml: string): string {
  try {
    const css = /<link rel="stylesheet" href="(styles-[\w-]+\.css)"/.exec(indexHtml)?.[1];
    if (!css) return '';
    const text = readFileSync(`${browserDir}/${css}`, 'utf8');
    const fonts = [...new Set([...text.matchAll(/url\("?\.?\/?(media\/source-sans-[\w-]+\.woff2)"?\)/g)].map((m) => m[1]))];
    return fonts.map((f) => `<link rel="preload" href="${f}" as="font" type="font/woff2" crossorigin>`).join('');
  } catch {
    return '';
  }
}

/** Build output named by its content hash (chunk-ABCD1234.js, media/font-ABCD1234.woff2). */
const HASHED_ASSET = /-[\w-]{8}\.[a-z0-9]+$/;

/** The page template: index.html, or index.csr.html in a build that also has the server renderer. */
function indexFile(): { path: string; mtimeMs: number } | undefined {
  for (const name of ['index.html', 'index.csr.html']) {
    const path = `${browserDir}/${name}`;
    const mtimeMs = statSync(path, { throwIfNoEntry: false })?.mtimeMs;
    if (mtimeMs !== undefined) return { path, mtimeMs };
  }
  return undefined;
}

type RenderPage = (url: string, context: unknown) => Promise<string | null>;

/** Renders taking longer than this, or beyond this many at once, give way to the page drawn in the browser. */
export const SERVER_RENDER = { timeoutMs: 1500, maxInFlight: 4 } as const;

/**
 * The server renderer (src/server.ts as built), loaded on first use and again when a build
 * replaces it; null when the build has none (a test's stand-in client) or it does not load.
 */
function serverRenderer() {
  let loaded: { mtimeMs: number; render: Promise<RenderPage | null> } | undefined;
  let inFlight = 0;
  const load = (): Promise<RenderPage | null> | null => {
    const mtimeMs = statSync(rendererFile, { throwIfNoEntry: false })?.mtimeMs;
    if (mtimeMs === undefined) return null;
    if (loaded?.mtimeMs !== mtimeMs) {
      const url = `${pathToFileURL(rendererFile).href}?v=${mtimeMs}`;
      const render = import(url).then(
        (m: { renderPage?: RenderPage }) => m.renderPage ?? null,
        (err: unknown) => {
          logger.warn({ err }, 'the server renderer did not load: participant pages are drawn in the browser');
          return null;
        },
      );
      loaded = { mtimeMs, render };
    }
    return loaded.render;
  };
  /** The page drawn with `context`, or null (no renderer, busy, failed or too slow): the caller sends the plain page. */
  const draw = async (path: string, context: unknown): Promise<string | null> => {
    const render = await load();
    if (!render || inFlight >= SERVER_RENDER.maxInFlight) return null;
    inFlight++;
    let timer: NodeJS.Timeout | undefined;
    try {
      const late = new Promise<null>((resolve) => (timer = setTimeout(() => resolve(null), SERVER_RENDER.timeoutMs)));
      return await Promise.race([render(`http://localhost${path}`, context), late]);
    } catch (err) {
      logger.warn({ err }, 'a participant page could not be drawn on the server: it is drawn in the browser');
      return null;
    } finally {
      clearTimeout(timer);
      inFlight--;
    }
  };
  return Object.assign(draw, { warm: async () => void (await load()) });
}

type Templates = { text: string; participant: string; participantPreloads: string; replay: string; mtimeMs: number };

/** The page templates of the build in place, read again when a rebuild changes them (so chunk names that are gone are never served). */
function templates() {
  let cached: Templates | undefined;
  return (): Templates | undefined => {
    const file = indexFile();
    if (!file) return undefined;
    if (cached?.mtimeMs !== file.mtimeMs) {
      const text = readFileSync(file.path, 'utf8');
      const participantPreloads = fontPreloads(text) + routePreloads(text, 'p/:token');
      const withPreloads = (html: string, preloads: string) => html.replace('</head>', () => `${preloads}</head>`);
      cached = {
        text,
        participant: withPreloads(text, participantPreloads),
        participantPreloads,
        replay: withPreloads(text, routePreloads(text, 'replay/:rehearsalId')),
        mtimeMs: file.mtimeMs,
      };
    }
    return cached;
  };
}

/**
 * A page drawn on the server runs the app only after its first frame (public/paint-first.js):
 * the browser would otherwise run the app's code, already fetched, before it first paints, and
 * the drawn page would show no sooner than one drawn in the browser. The code is still fetched
 * at once (modulepreload). Unchanged if the page has no app script in the expected form.
 */
export function startAfterFirstPaint(html: string): string {
  return html.replace(
    /<script src="(main-[\w-]+\.js)" type="module"><\/script>/,
    (_, main: string) => `<link rel="modulepreload" href="${main}"><script src="paint-first.js?main=${main}" type="module"></script>`,
  );
}

/** The built Angular app, with the CSP nonce written into each page on every request. */
export function serveClient(app: Express) {
  const current = templates();
  const drawn = serverRenderer();
  // Loaded now, not by the first phone: loading takes about half a second.
  void drawn.warm();
  const index = async (req: Request, res: Response) => {
    const template = current();
    if (!template) {
      res.status(503).type('text').send('The client is not built yet: run `npm start` (or `npx ng build`).');
      return;
    }
    const nonce = res.locals['cspNonce'] as string;
    const stamp = (html: string) =>
      html.replace('<app-root', `<app-root ngCspNonce="${nonce}"`).replaceAll('<style', `<style nonce="${nonce}"`);
    res.type('html').set('Cache-Control', 'no-store');
    const token = /^\/p\/([A-Za-z0-9_-]{20,})$/.exec(req.path)?.[1];
    if (!token) {
      // The projector replay is opened cold (a new tab or window): its code is linked in <head>.
      res.send(stamp(/^\/replay\/\d+$/.test(req.path) ? template.replay : template.text));
      return;
    }
    // A participant's own page (/p/<token>). The page may consent or answer before any API call
    // has set the form token.
    csrfCookieForPage(req, res);
    const state = await firstState(req, token);
    // Drawn on the server when it can be: the phone shows the greeting and the notice as soon as
    // the page is in, and the app takes that page over once its code has run.
    const html = state ? await drawn(req.path, { path: req.path, firstState: state }) : null;
    // Either way its first state is written in before </body>, so the app starts from it.
    const page = stamp(
      html ? startAfterFirstPaint(html.replace('</head>', () => `${template.participantPreloads}</head>`)) : template.participant,
    );
    const end = page.lastIndexOf('</body>');
    res.send(page.slice(0, end) + firstStateBlock(state) + page.slice(end));
  };
  app.get('/', index);
  // Hashed files never change under their name: a phone that opens its link again (for its
  // results, say) reuses them without asking. Anything else is checked again after an hour.
  app.use(
    express.static(browserDir, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, path) => {
        if (HASHED_ASSET.test(path)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
      },
    }),
  );
  app.get('/{*splat}', index);
}
