import { randomBytes } from 'node:crypto';
import { IncomingMessage, ServerResponse, type ClientRequest } from 'node:http';
import { Socket } from 'node:net';
import express, { type Express, type NextFunction, type Request, type Response } from 'express';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import { config } from './config';
import { apiRouter } from './api';
import { currentUser } from './auth/current-user';
import { csrfProtection } from './core/csrf';
import { errorHandler } from './core/error-handler';
import { requestLogger } from './core/logging';
import { absoluteLifetime, sessionMiddleware } from './core/session';
import { serveClient } from './client-pages';

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
