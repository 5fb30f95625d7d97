/**
 * Ends what a fault test process opened itself (the database pool, the rate-limit Redis client
 * the app's modules create), then exits if anything else still holds the process open, naming it:
 * the fault run stops Redis and MariaDB afterwards, and a client still retrying must not hang it.
 */
import { closeLimiterStore } from '../../server/auth/limiter-store';
import { pool } from '../../server/db';

export async function closeFaultTest(): Promise<void> {
  await Promise.allSettled([pool.end(), closeLimiterStore()]);
  setTimeout(() => {
    console.error(`fault test: still open 3 s after its end (${process.getActiveResourcesInfo().join(', ')}); exiting`);
    process.exit(process.exitCode ?? 0);
  }, 3000).unref();
}
