import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type Logger } from 'pino';
import { config } from '../config';

export const logger = pino({ level: config.NODE_ENV === 'test' ? 'warn' : config.LOG_LEVEL });

/** Long url-safe strings in paths or queries are link tokens: never log them. */
export function maskTokens(url: string): string {
  return url.replace(/[A-Za-z0-9_-]{20,}/g, '[token]');
}

type Req = IncomingMessage & { id?: string | number | object; log?: Logger; originalUrl?: string };

/** How a request is logged: only method, path (tokens masked) and id, so no cookies or tokens. */
const requestFields = (req: Req) => ({ id: req.id, method: req.method, url: maskTokens(req.originalUrl ?? req.url ?? '') });

/**
 * The request log. A line per request costs more than a fast read itself: failures, refusals and
 * slow answers are logged at info or above, ordinary fast answers only at debug (LOG_LEVEL=debug
 * shows every request); page and file requests are not logged. Every request gets an id
 * (`X-Request-Id`, quoted in 500 answers) and `req.log`, a logger that adds the request's
 * fields, made only when something is logged through it.
 */
export function requestLogger(req: Req, res: ServerResponse, next: () => void): void {
  const id = randomUUID();
  req.id = id;
  res.setHeader('X-Request-Id', id);
  let child: Logger | undefined;
  Object.defineProperty(req, 'log', {
    configurable: true,
    enumerable: false,
    get: () => (child ??= logger.child({ req: requestFields(req) })),
  });
  if (!(req.url ?? '').startsWith('/api')) return next();
  const started = Date.now();
  const done = () => {
    res.removeListener('finish', done);
    res.removeListener('close', done);
    const elapsed = Date.now() - started;
    const failed = res.statusCode >= 500;
    const level = failed ? 'error' : res.statusCode >= 400 || elapsed > 1000 ? 'info' : 'debug';
    if (!logger.isLevelEnabled(level)) return;
    const line = { req: requestFields(req), res: { statusCode: res.statusCode }, responseTime: elapsed };
    if (failed) logger[level]({ ...line, err: new Error(`failed with status code ${res.statusCode}`) }, 'request errored');
    else logger[level](line, 'request completed');
  };
  res.on('finish', done);
  res.on('close', done);
  next();
}
