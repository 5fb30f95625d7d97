/**
 * The one place that makes the counter stores behind every rate limit and back-off
 * (server/auth/rate-limits.ts, server/auth/failure-counter.ts). Each caller gets its own store;
 * `prefix` names the counter. The counters live in Redis (rate-limit-redis), so every web
 * process counts the same attempts. While Redis is away the stores fail open (nothing counted,
 * nobody blocked) instead of failing the request: locking everyone out during a Redis restart
 * would be worse than a few seconds without limits. Under NODE_ENV=test each test process counts
 * on its own (keys carry the pid, or RATE_LIMIT_SCOPE for test processes that share counters).
 */
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import { Redis } from 'ioredis';
import { RedisStore } from 'rate-limit-redis';
import { config, redisUrl } from '../config';
import { QUEUE_PREFIX, watchConnection } from '../jobs/redis';

let conn: Redis | undefined;

function redis(): Redis {
  if (!conn) {
    conn = new Redis(redisUrl(), {
      connectionName: 'ripplehall-rate-limits',
      // Queued while connecting, failed after one reconnect attempt while Redis is away.
      maxRetriesPerRequest: 1,
      retryStrategy: (times) => Math.min(2000, 50 * times),
    });
    watchConnection(conn, 'rate limits');
  }
  return conn;
}

/** A RedisStore that fails open and loads its scripts again after a failure. */
class LimiterStore extends RedisStore {
  override async init(options: Parameters<RedisStore['init']>[0]): Promise<void> {
    await super.init(options).catch(() => undefined);
  }

  private reload(): void {
    this.incrementScriptSha = this.loadIncrementScript();
    this.getScriptSha = this.loadGetScript();
    this.incrementScriptSha.catch(() => undefined);
    this.getScriptSha.catch(() => undefined);
  }

  override async increment(key: string): Promise<IncrementResponse> {
    try {
      return await super.increment(key);
    } catch {
      this.reload();
      return { totalHits: 0, resetTime: undefined };
    }
  }

  override async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    try {
      // A missing key comes back from ioredis as null, which rate-limit-redis reads as NaN hits.
      const info = await super.get(key);
      return info && Number.isFinite(info.totalHits) ? info : undefined;
    } catch {
      this.reload();
      return undefined;
    }
  }

  override async decrement(key: string): Promise<void> {
    await super.decrement(key).catch(() => undefined);
  }

  override async resetKey(key: string): Promise<void> {
    await super.resetKey(key).catch(() => undefined);
  }
}

/** The Redis key prefix of a counter (scoped per test process under NODE_ENV=test). */
export function counterKeyPrefix(prefix: string): string {
  const scope = config.NODE_ENV === 'test' ? `${config.RATE_LIMIT_SCOPE ?? process.pid}:` : '';
  return `${QUEUE_PREFIX}:rl:${scope}${prefix}:`;
}

/** The connection the counters use, for counters of another shape (server/core/heavy-writes.ts). */
export const counterRedis = redis;

export function createLimiterStore(prefix: string): Store {
  return new LimiterStore({
    prefix: counterKeyPrefix(prefix),
    sendCommand: (command: string, ...args: string[]) => redis().call(command, ...args) as Promise<never>,
  });
}

/** A store ready for direct use (outside a rateLimit middleware, which calls init itself). */
export function initialisedStore(prefix: string, windowMs: number): Store {
  const store = createLimiterStore(prefix);
  void store.init?.({ windowMs } as Options);
  return store;
}

export async function closeLimiterStore(): Promise<void> {
  const c = conn;
  conn = undefined;
  await c?.quit().catch(() => c.disconnect());
}
