/**
 * Where the rate limiters and the sign-in back-off keep their counters: Redis (rate-limit-redis),
 * so every web process counts the same attempts. The connection fails fast instead of queueing
 * commands for long while Redis is away; the limiters let requests through then (passOnStoreError), since
 * locking everyone out during a Redis restart would be worse than a few seconds without limits.
 * Under NODE_ENV=test each test process counts on its own (keys carry the pid), as with the
 * in-memory counters of one process.
 */
import type { Store, IncrementResponse, ClientRateLimitInfo } from 'express-rate-limit';
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

/** A RedisStore that loads its scripts again after a failure (Redis was down when it started). */
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
    } catch (err) {
      this.reload();
      throw err;
    }
  }

  override async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    try {
      return await super.get(key);
    } catch (err) {
      this.reload();
      throw err;
    }
  }
}

export function createLimiterStore(prefix: string): Store {
  const scope = config.NODE_ENV === 'test' ? `${process.pid}:` : '';
  return new LimiterStore({
    prefix: `${QUEUE_PREFIX}:rl:${scope}${prefix}:`,
    sendCommand: (command: string, ...args: string[]) => redis().call(command, ...args) as Promise<never>,
  });
}

export async function closeLimiterStore(): Promise<void> {
  const c = conn;
  conn = undefined;
  await c?.quit().catch(() => c.disconnect());
}
