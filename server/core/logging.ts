import { randomUUID } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import { pinoHttp, startTime } from 'pino-http';
import { pino } from 'pino';
import { config } from '../config';

export const logger = pino({ level: config.NODE_ENV === 'test' ? 'warn' : config.LOG_LEVEL });

/** Long url-safe strings in paths or queries are link tokens: never log them. */
export function maskTokens(url: string): string {
  return url.replace(/[A-Za-z0-9_-]{20,}/g, '[token]');
}

export const requestLogger = pinoHttp({
  logger,
  genReqId: (req, res) => {
    const id = randomUUID();
    res.setHeader('X-Request-Id', id);
    return id;
  },
  serializers: {
    // Only method, path and ids: no headers, so no cookies or tokens.
    req: (req: IncomingMessage & { id?: string }) => ({ id: req.id, method: req.method, url: maskTokens(req.url ?? '') }),
    res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
  },
  autoLogging: { ignore: (req) => !(req.url ?? '').startsWith('/api') },
  // A line per request costs more than a fast read itself: log failures, refusals and slow
  // answers at info; ordinary fast answers only at debug (LOG_LEVEL=debug shows every request).
  customLogLevel: (_req, res, err) => {
    if (err || res.statusCode >= 500) return 'error';
    if (res.statusCode >= 400) return 'info';
    const started = (res as { [startTime]?: number })[startTime];
    return started !== undefined && Date.now() - started > 1000 ? 'info' : 'debug';
  },
});
