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
 * Every chunk a page that is opened cold runs before it shows (a participant's page, the
 * projector replay): the route's lazy chunk (its `import("./chunk-….js")` in main-*.js, found by
 * the route's path) and every chunk it or main-*.js imports, however deep, less those index.html
 * already links. Linked as modulepreload, the browser asks for all of them at once instead of
 * discovering one level after another (and, for the replay, before the sign-in check answers).
 * If the build's shape ever differs, the list is empty and the page loads as before.
 */
function routeChunks(indexHtml: string, routePath: string): string[] {
  try {
    const main = readdirSync(browserDir).find((f) => /^main-[\w-]+\.js$/.test(f));
    if (!main) return [];
    const escaped = routePath.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
    const route = new RegExp(`path:["'\`]${escaped}["'\`].{0,300}?import\\(["'\`]\\./(chunk-[\\w-]+\\.js)["'\`]\\)`).exec(
      readFileSync(`${browserDir}/${main}`, 'utf8'),
    );
    if (!route?.[1]) return [];
    const seen = new Set<string>();
    const queue = [main, route[1]];
    while (queue.length) {
      const file = queue.shift()!;
      if (seen.has(file)) continue;
      seen.add(file);
      queue.push(...staticImports(file));
    }
    seen.delete(main);
    return [...seen].filter((f) => !indexHtml.includes(`"${f}"`));
  } catch {
    return [];
  }
}

const modulePreloads = (chunks: string[]) => chunks.map((f) => `<link rel="modulepreload" href="${f}">`).join('');

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

/** How long a look at the build on disk (is there a new one?) is trusted: pages do not stat files each. */
const BUILD_CHECK_MS = 1000;

/** `look()`'s answer, asked again at most once every BUILD_CHECK_MS. */
function lookedAtMostEverySecond<T>(look: () => T): () => T {
  let last: { at: number; value: T } | undefined;
  return () => {
    const now = Date.now();
    if (!last || now - last.at >= BUILD_CHECK_MS) last = { at: now, value: look() };
    return last.value;
  };
}

type RenderPage = (url: string, context: unknown) => Promise<string | null>;

/** Renders taking longer than this, or beyond this many at once, give way to the page drawn in the browser. */
export const SERVER_RENDER = { timeoutMs: 1500, maxInFlight: 4 } as const;

/**
 * The server renderer (src/server.ts as built), loaded once, on first use; null when the build
 * has none (a test's stand-in client) or it does not load. A build that replaces it while the
 * server runs is not loaded: the renderer's own modules (its chunks) stay cached under their
 * names and would be mixed with the new ones, and the old build's files are gone. Pages are then
 * drawn in the browser, from the new build, until the server restarts.
 */
function serverRenderer() {
  let loaded: { mtimeMs: number; render: Promise<RenderPage | null> } | undefined;
  let replaced = false;
  let inFlight = 0;
  const rendererMtime = lookedAtMostEverySecond(() => statSync(rendererFile, { throwIfNoEntry: false })?.mtimeMs);
  const load = (): Promise<RenderPage | null> | null => {
    const mtimeMs = rendererMtime();
    if (mtimeMs === undefined || replaced) return null;
    if (loaded && loaded.mtimeMs !== mtimeMs) {
      replaced = true;
      logger.warn('a new build is in place: participant pages are drawn in the browser until the server restarts');
      return null;
    }
    if (!loaded) {
      const render = import(pathToFileURL(rendererFile).href).then(
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
    // A render cannot be stopped: one that was given up on still counts until it really ends, so
    // slow renders never pile up past maxInFlight.
    inFlight++;
    const rendering = Promise.resolve()
      .then(() => render(`http://localhost${path}`, context))
      .finally(() => inFlight--);
    let timer: NodeJS.Timeout | undefined;
    try {
      const late = new Promise<null>((resolve) => (timer = setTimeout(() => resolve(null), SERVER_RENDER.timeoutMs)));
      return await Promise.race([rendering, late]);
    } catch (err) {
      logger.warn({ err }, 'a participant page could not be drawn on the server: it is drawn in the browser');
      return null;
    } finally {
      clearTimeout(timer);
    }
  };
  return Object.assign(draw, { warm: async () => void (await load()) });
}

/** The stylesheet index.html links (its file name and text), if it is in the expected form. */
function stylesheet(indexHtml: string): { href: string; text: string } | undefined {
  try {
    const href = /<link rel="stylesheet" href="(styles-[\w-]+\.css)">/.exec(indexHtml)?.[1];
    if (!href) return undefined;
    const text = readFileSync(`${browserDir}/${href}`, 'utf8');
    // Written into a <style> element, which would end at "</style".
    return /<\/style/i.test(text) ? undefined : { href, text };
  } catch {
    return undefined;
  }
}

type Templates = {
  text: string;
  /** A participant's page drawn in the browser, its code and fonts linked in <head>. */
  participant: string;
  /** What a participant's page drawn on the server needs beside it. */
  drawn: { fonts: string; chunks: string[]; stylesheet: { href: string; text: string } | undefined };
  replay: string;
  mtimeMs: number;
};

/** The page templates of the build in place, read again when a rebuild changes them (so chunk names that are gone are never served). */
function templates() {
  let cached: Templates | undefined;
  const file = lookedAtMostEverySecond(indexFile);
  return (): Templates | undefined => {
    const index = file();
    if (!index) return undefined;
    if (cached?.mtimeMs !== index.mtimeMs) {
      const text = readFileSync(index.path, 'utf8');
      const fonts = fontPreloads(text);
      const chunks = routeChunks(text, 'p/:token');
      const withPreloads = (html: string, preloads: string) => html.replace('</head>', () => `${preloads}</head>`);
      cached = {
        text,
        participant: withPreloads(text, fonts + modulePreloads(chunks)),
        drawn: { fonts, chunks, stylesheet: stylesheet(text) },
        replay: withPreloads(text, modulePreloads(routeChunks(text, 'replay/:rehearsalId'))),
        mtimeMs: index.mtimeMs,
      };
    }
    return cached;
  };
}

/**
 * A participant's page as the server drew it, made to show on the phone's first frame:
 * - nothing in it waits for code: the drawn page's modulepreload links are taken out, since
 *   Chrome compiles modules it has been told to preload before it paints (about 100 to 190 ms
 *   here on a phone-sized page), and its stylesheet (10 kB) is written in, so no request stands
 *   between the page and its first paint;
 * - the app starts one frame after the page is shown (at most 250 ms later), through
 *   public/paint-first.js, which then links every chunk the page runs (those the page linked and
 *   the route's, `drawn.chunks`) so they are asked for at once, and imports main-*.js;
 * - the text fonts are preloaded, so the page changes to them soon after it shows.
 * Anything not in the expected form is left as it is (the page still works, only later).
 */
export function drawnPage(html: string, drawn: Templates['drawn']): string {
  // The links the page came with (index.html's own, the renderer's) join the route's list.
  const chunks = new Set<string>();
  let page = html.replace(/<link rel="modulepreload" href="([^"]*)">/g, (_, href: string) => {
    if (/^chunk-[\w-]+\.js$/.test(href)) chunks.add(href);
    return '';
  });
  for (const chunk of drawn.chunks) chunks.add(chunk);
  const { stylesheet } = drawn;
  if (stylesheet) page = page.replace(`<link rel="stylesheet" href="${stylesheet.href}">`, () => `<style>${stylesheet.text}</style>`);
  page = page.replace('</head>', () => `${drawn.fonts}</head>`);
  return page.replace(/<script src="(main-[\w-]+\.js)" type="module"><\/script>/, (_, main: string) => {
    const code = chunks.size ? `&amp;code=${[...chunks].join(',')}` : '';
    return `<script src="paint-first.js?main=${main}${code}" type="module"></script>`;
  });
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
    const page = stamp(html ? drawnPage(html, template.drawn) : template.participant);
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
