import { randomBytes } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { IncomingMessage, ServerResponse, type ClientRequest } from 'node:http';
import { Socket } from 'node:net';
import { fileURLToPath } from 'node:url';
import express, { type Express, type NextFunction, type Request, type Response } from 'express';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import { config } from './config';
import { apiRouter } from './api';
import { currentUser } from './auth/current-user';
import { csrfCookieForPage, csrfProtection } from './core/csrf';
import { errorHandler } from './core/error-handler';
import { requestLogger } from './core/logging';
import { absoluteLifetime, sessionMiddleware } from './core/session';
import { firstStateBlock } from './participants/first-page';

const browserDir = config.CLIENT_DIR ?? fileURLToPath(new URL('../dist/ripplehall/browser', import.meta.url));

/** Builds the app (tests import this); server/main.ts only listens. */
export function createApp(): Express {
  const app = express();
  const secure = (config.PUBLIC_URL ?? '').startsWith('https://');
  app.disable('x-powered-by');
  // One proxy hop (the one in front of us): trusting every hop would let clients forge req.ip.
  app.set('trust proxy', config.TRUST_PROXY ? 1 : false);
  app.set('query parser', 'simple');

  // Every /api answer is no-store: an ETag (a hash of each body) would never be used.
  app.set('etag', false);

  // Pages get a fresh CSP nonce each (Angular stamps its run-time styles with it); API answers
  // style nothing, so they carry the same policy without a nonce, its header built once.
  const pageHeaders = securityHeaders(secure, (_req, res) => `'nonce-${(res as Response).locals['cspNonce']}'`);
  const apiHeaders = apiSecurityHeaders(secure);
  app.use((req, res, next) => {
    if (req.path.startsWith('/api/')) return apiHeaders(req, res, next);
    res.locals['cspNonce'] = randomBytes(16).toString('base64');
    pageHeaders(req, res, next);
  });
  app.use(requestLogger);
  app.use(express.json({ limit: '2mb' }));
  app.use(cookieParser());
  // Every API answer may carry personal data (accounts, people, briefings): never cache it.
  app.use('/api', noStore);
  app.use('/api', sessionMiddleware(secure), absoluteLifetime, currentUser, csrfProtection(config.SESSION_SECRET, secure));
  app.use('/api', apiRouter());
  serveClient(app);
  app.use(errorHandler);
  return app;
}

type NonceDirective = (req: IncomingMessage, res: ServerResponse) => string;

/** Helmet with the app's policy; pages pass a nonce for their styles (tests compare the API's copy with it). */
export function securityHeaders(secure: boolean, styleNonce?: NonceDirective) {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: true,
      directives: {
        'default-src': ["'self'"],
        'script-src': ["'self'"],
        'style-src': styleNonce ? ["'self'", styleNonce] : ["'self'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'"],
        'connect-src': ["'self'"],
        'object-src': ["'none'"],
        'frame-ancestors': ["'none'"],
        'form-action': ["'self'"],
        'upgrade-insecure-requests': secure ? [] : null,
      },
    },
    strictTransportSecurity: secure,
  });
}

/**
 * API answers' security headers. Without a nonce helmet's headers never depend on the request,
 * so helmet runs once, at start-up, on a response that is never sent, and each API answer gets a
 * copy of what it set (names as helmet spelled them). Helmet's one removal, X-Powered-By, has
 * nothing to remove: the app never sets it. Should helmet ever not finish at once, it runs on
 * every answer instead.
 */
export function apiSecurityHeaders(secure: boolean) {
  const helmetOnce = securityHeaders(secure);
  const req = new IncomingMessage(new Socket());
  const res = new ServerResponse(req);
  let finished = false;
  helmetOnce(req, res, (err?: unknown) => {
    finished = err === undefined;
  });
  if (!finished) return helmetOnce;
  // Every outgoing message has had getRawHeaderNames since Node 15.13; its types list it on requests only.
  const names = (res as ServerResponse & Pick<ClientRequest, 'getRawHeaderNames'>).getRawHeaderNames();
  const headers = names.map((name) => [name, res.getHeader(name)!] as const);
  return (_req: IncomingMessage, answer: ServerResponse, next: () => void) => {
    for (const [name, value] of headers) answer.setHeader(name, value);
    next();
  };
}

function noStore(_req: Request, res: Response, next: NextFunction) {
  res.set('Cache-Control', 'no-store');
  next();
}

/** Static imports of a built chunk (`from"./chunk-….js"`, `import"./chunk-….js"`). */
function staticImports(file: string): string[] {
  const text = readFileSync(`${browserDir}/${file}`, 'utf8');
  return [...text.matchAll(/(?:from|import)\s*"\.\/(chunk-[A-Z0-9]+\.js)"/g)].flatMap((m) => (m[1] ? [m[1]] : []));
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
    const main = readdirSync(browserDir).find((f) => /^main-[A-Z0-9]+\.js$/.test(f));
    if (!main) return '';
    const escaped = routePath.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
    const route = new RegExp(`path:"${escaped}".{0,300}?import\\("\\./(chunk-[A-Z0-9]+\\.js)"\\)`).exec(
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

/** Build output named by its content hash (chunk-ABCD1234.js, media/font-ABCD1234.woff2). */
const HASHED_ASSET = /-[A-Z0-9]{8}\.[a-z0-9]+$/;

/** The built Angular app, with the CSP nonce written into index.html on every request. */
function serveClient(app: Express) {
  const indexFile = `${browserDir}/index.html`;
  // Read again when the build changes it, so a rebuild never serves chunk names that are gone.
  let template: { text: string; participant: string; replay: string; mtimeMs: number } | undefined;
  const index = async (req: Request, res: Response) => {
    const mtimeMs = statSync(indexFile, { throwIfNoEntry: false })?.mtimeMs;
    if (mtimeMs === undefined) {
      res.status(503).type('text').send('The client is not built yet: run `npm start` (or `npx ng build`).');
      return;
    }
    if (template?.mtimeMs !== mtimeMs) {
      const text = readFileSync(indexFile, 'utf8');
      const withPreloads = (routePath: string) => text.replace('</head>', () => `${routePreloads(text, routePath)}</head>`);
      template = { text, participant: withPreloads('p/:token'), replay: withPreloads('replay/:rehearsalId'), mtimeMs };
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
    // A participant's own page (/p/<token>): its chunks are linked in <head>, so they are fetched
    // with the app's and not after them, and its first state is written in before </body>. The
    // page up to there goes out at once: the phone fetches the code while the state is read.
    // (Module scripts run only once the whole page is in, so the state is there before them.)
    // The page may consent or answer before any API call has set the form token.
    csrfCookieForPage(req, res);
    const page = stamp(template.participant);
    const end = page.lastIndexOf('</body>');
    res.write(page.slice(0, end));
    const block = await firstStateBlock(req, token);
    res.end(block + page.slice(end));
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
