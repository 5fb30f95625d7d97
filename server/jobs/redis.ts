/**
 * Connections to the job queue's Redis. Every connection reconnects by itself (ioredis) and its
 * errors are logged, at most once per outage, never thrown: Redis going away must not end the
 * process. Keys of one database never mix with another's (tests, demo and fault runs share a
 * Redis): they all start with the queue prefix, which names the database.
 */
import { Redis, type RedisOptions } from 'ioredis';
import { config, redisUrl } from '../config';
import { logger } from '../core/logging';

export const QUEUE_PREFIX = `ripplehall-${config.DB_NAME}`;

/** BullMQ's workers need maxRetriesPerRequest: null (commands wait for a reconnect). */
export function redisOptions(purpose: string): RedisOptions {
  return {
    maxRetriesPerRequest: null,
    connectionName: `ripplehall-${purpose}`,
    // Back off up to 2 s between reconnects, forever.
    retryStrategy: (times) => Math.min(2000, 50 * times),
  };
}

/** Logs the first error of an outage and the recovery, so a restart of Redis is two log lines. */
export function watchConnection(conn: { on(event: string, cb: (...args: unknown[]) => void): unknown }, purpose: string): void {
  let down = false;
  conn.on('error', (err) => {
    if (down) return;
    down = true;
    logger.warn({ err: (err as Error)?.message ?? err }, `Redis connection (${purpose}) lost; retrying`);
  });
  conn.on('ready', () => {
    if (!down) return;
    down = false;
    logger.info(`Redis connection (${purpose}) is back`);
  });
}

export function newRedis(purpose: string): Redis {
  const conn = new Redis(redisUrl(), redisOptions(purpose));
  watchConnection(conn, purpose);
  return conn;
}

let counters: Redis | undefined;

/**
 * The one connection of the counters in Redis: the rate limits and back-offs
 * (auth/limiter-store.ts) and the heavy-write slots (core/heavy-writes.ts). Unlike the queue's
 * connections, a command fails after one reconnect attempt while Redis is away, so the counters
 * can fail open instead of holding up the request.
 */
export function counterRedis(): Redis {
  if (!counters) {
    counters = new Redis(redisUrl(), {
      connectionName: 'ripplehall-rate-limits',
      // Queued while connecting, failed after one reconnect attempt while Redis is away.
      maxRetriesPerRequest: 1,
      retryStrategy: (times) => Math.min(2000, 50 * times),
    });
    watchConnection(counters, 'rate limits');
  }
  return counters;
}

/** The Redis key prefix of a counter (scoped per test process under NODE_ENV=test). */
export function counterKeyPrefix(prefix: string): string {
  const scope = config.NODE_ENV === 'test' ? `${config.RATE_LIMIT_SCOPE ?? process.pid}:` : '';
  return `${QUEUE_PREFIX}:rl:${scope}${prefix}:`;
}

export async function closeCounterRedis(): Promise<void> {
  const c = counters;
  counters = undefined;
  await c?.quit().catch(() => c.disconnect());
}

/** Rejects after ms: for calls that must not wait for Redis forever (an HTTP answer, say). */
export function within<T>(ms: number, what: string, work: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const limit = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not answer within ${ms} ms`)), ms);
  });
  return Promise.race([work, limit]).finally(() => clearTimeout(timer));
}
