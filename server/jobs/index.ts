/** Wires the job kinds to their handlers; starts and stops this process's part of the job system. */
import { logger } from '../core/logging';
import { proofJobHandler } from '../plans/proof';
import { planJobHandler } from '../plans/service';
import { rehearsalJobHandler } from '../rehearsals/job';
import { closeEvents, startEvents } from './events';
import { registerHandler } from './handlers';
import { closePools, warmPools } from './pools';
import { closeProgress } from './progress';
import { closeQueues } from './queues';
import { jobRunner } from './runner';
import { startWorkers, stopWorkers } from './workers';

registerHandler('plan', planJobHandler);
registerHandler('rehearsal', rehearsalJobHandler);
registerHandler('proof', proofJobHandler);

export { jobRunner };

/**
 * Every process hears job events (for its SSE streams); with runWorkers it also runs jobs, and
 * its thread pools are started so the first job does not wait for them.
 */
export function startJobs(runWorkers: boolean): void {
  startEvents();
  if (!runWorkers) return;
  startWorkers();
  void warmPools().catch((err: unknown) => {
    // A stop during the warm-up ends its tasks; that is no failure.
    if (!/Terminating worker thread/.test((err as Error)?.message ?? '')) logger.warn({ err }, 'warming the worker pools failed');
  });
}

/** Hands running work back to the queue, then closes the thread pools and every Redis connection. */
export async function stopJobs(): Promise<void> {
  await stopWorkers();
  await closePools();
  await Promise.all([closeQueues(), closeEvents(), closeProgress()]);
}
