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
import { RedisStore } from 'rate-limit-redis';
import { closeCounterRedis, counterKeyPrefix, counterRedis } from '../jobs/redis';

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

export function createLimiterStore(prefix: string): Store {
  return new LimiterStore({
    prefix: counterKeyPrefix(prefix),
    sendCommand: (command: string, ...args: string[]) => counterRedis().call(command, ...args) as Promise<never>,
  });
}

/** A store ready for direct use (outside a rateLimit middleware, which calls init itself). */
export function initialisedStore(prefix: string, windowMs: number): Store {
  const store = createLimiterStore(prefix);
  void store.init?.({ windowMs } as Options);
  return store;
}

/** Closes the counters' connection (shared with the heavy-write slots). */
export async function closeLimiterStore(): Promise<void> {
  await closeCounterRedis();
}
