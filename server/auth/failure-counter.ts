import type { Store } from 'express-rate-limit';
import { initialisedStore } from './limiter-store';

/**
 * Counts failures only (a wrong password, a link that does not work) per key in a fixed window.
 * A key that has used up its failures is `blocked` until its window ends. Backed by the shared
 * limiter store factory, so the counts live wherever the rate limits live.
 */
export interface Blocked {
  blocked: boolean;
  /** Seconds until the key may try again (0 when not blocked). */
  retryAfter: number;
}

export class FailureCounter {
  private readonly store: Store;

  constructor(
    prefix: string,
    readonly limit: number,
    readonly windowMs: number,
  ) {
    this.store = initialisedStore(prefix, windowMs);
  }

  async check(key: string): Promise<Blocked> {
    const info = await this.store.get?.(key);
    if (!info || info.totalHits < this.limit) return { blocked: false, retryAfter: 0 };
    const left = info.resetTime ? info.resetTime.getTime() - Date.now() : this.windowMs;
    return { blocked: true, retryAfter: Math.max(1, Math.ceil(left / 1000)) };
  }

  async hits(key: string): Promise<number> {
    return (await this.store.get?.(key))?.totalHits ?? 0;
  }

  async fail(key: string): Promise<number> {
    return (await this.store.increment(key)).totalHits;
  }

  async clear(key: string): Promise<void> {
    await this.store.resetKey(key);
  }
}
