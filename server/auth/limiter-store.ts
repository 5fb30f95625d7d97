import { MemoryStore, type Options, type Store } from 'express-rate-limit';

/**
 * The one place that makes the counter stores behind every rate limit and back-off
 * (server/auth/rate-limits.ts, server/auth/failure-counter.ts). Each caller gets its own store;
 * `prefix` names the counter so a shared store (for example Redis through rate-limit-redis)
 * keeps them apart. In memory by default: counters hold for one process.
 */
export function createLimiterStore(prefix: string): Store {
  void prefix;
  return new MemoryStore();
}

/** A store ready for direct use (outside a rateLimit middleware, which calls init itself). */
export function initialisedStore(prefix: string, windowMs: number): Store {
  const store = createLimiterStore(prefix);
  void store.init?.({ windowMs } as Options);
  return store;
}
