/**
 * The face the services use for background jobs (web side): queue, position, cancel. The job
 * kinds' handler types come from handlers.ts; the workers that run them are in workers.ts.
 */
import { cancelJob, enqueueJob, stopJobEarly } from './queues';
import { queuePosition } from './positions';

export * from './handlers';

export const jobRunner = {
  /** Puts a new job row on the queue; it runs on whichever worker is free. */
  enqueue: enqueueJob,
  /** 1-based position among the user's waiting jobs, or null when it is not queued. */
  positionOf: queuePosition,
  /** Ends a queued or running job as cancelled at once; its worker stops and late results are dropped. */
  cancel: cancelJob,
  /** A running plan search stops and keeps its best plan (ends 'done'); any other job is cancelled. */
  stopEarly: stopJobEarly,
};
