/**
 * The BullMQ queues (Redis): `jobs` holds plans and rehearsals, `chunks` the pieces of
 * rehearsals. A queue entry carries only the job row's id; the row in MariaDB is the truth.
 * Entry ids are derived from the rows (bullId), so adding the same job twice adds it once.
 */
import { Job, Queue, type ConnectionOptions, type JobsOptions } from 'bullmq';
import { config, redisUrl } from '../config';
import { logger } from '../core/logging';
import { publishCancel, publishStop } from './events';
import { emitJob, endOpenJob } from './lifecycle';
import { findJob, openJobsOf, type JobRow } from './store';
import { QUEUE_PREFIX, redisOptions, watchConnection, within } from './redis';

export interface JobData {
  jobId: number;
  /** Rehearsals: 'merge' once the chunks were added. */
  step?: 'start' | 'merge';
  chunks?: number;
}

export interface ChunkData {
  jobId: number;
  index: number;
  from: number;
  to: number;
  /** Total runs of the rehearsal (for progress). */
  of: number;
}

export const JOBS_QUEUE = 'jobs';
export const CHUNKS_QUEUE = 'chunks';

/**
 * Entry ids come from the row's id and creation time: adding a job twice adds it once, and a
 * database recreated with the same ids (tests, a restore) never meets the entries of the old one.
 */
export const bullId = (row: Pick<JobRow, 'id' | 'createdAt'>) => `job-${row.id}-${row.createdAt.getTime()}`;
export const chunkId = (parentEntryId: string, index: number) => `${parentEntryId}-chunk-${index}`;

export function connection(purpose: string): ConnectionOptions {
  const { maxRetriesPerRequest, connectionName, retryStrategy } = redisOptions(purpose);
  return { url: redisUrl(), maxRetriesPerRequest, connectionName, retryStrategy: retryStrategy as (times: number) => number };
}

/** Retries with growing waits: a database or Redis restart is ridden out, a real bug is not retried forever. */
export function entryOptions(): JobsOptions {
  return {
    attempts: config.JOB_ATTEMPTS,
    backoff: { type: 'exponential', delay: 500 },
    removeOnComplete: { age: 3600, count: 1000 },
    removeOnFail: { age: 7 * 24 * 3600 },
  };
}

const queues = new Map<string, Queue>();

export function queue(name: string): Queue {
  let q = queues.get(name);
  if (!q) {
    q = new Queue(name, { connection: connection(`queue-${name}`), prefix: QUEUE_PREFIX });
    watchConnection(q, `queue ${name}`);
    queues.set(name, q);
  }
  return q;
}

/**
 * Adds the job's entry. When Redis does not answer in time the row stays queued and the
 * reconciler of a worker adds the entry once Redis is back, so the request still succeeds.
 */
export async function enqueueJob(row: JobRow): Promise<void> {
  const data: JobData = { jobId: row.id, step: 'start' };
  try {
    // Background proofs wait behind every job a person asked for (BullMQ serves entries without a priority first).
    const priority = row.kind === 'proof' ? { priority: 10 } : {};
    await within(3000, 'The job queue', queue(JOBS_QUEUE).add(row.kind, data, { ...entryOptions(), ...priority, jobId: bullId(row) }));
  } catch (err) {
    logger.warn({ err: (err as Error).message, jobId: row.id }, 'queueing a job failed; it is queued again when Redis answers');
  }
  await emitJob('queued', row);
}

/** Moves the user's waiting jobs up: a slot was freed, so the ones put off try again now. */
export async function wakeUser(userId: number): Promise<void> {
  try {
    for (const row of await openJobsOf(userId)) {
      if (row.status !== 'queued') continue;
      const entry = await Job.fromId(queue(JOBS_QUEUE), bullId(row));
      if (entry && (await entry.isDelayed())) await entry.promote().catch(() => undefined);
      await emitJob('queued', row);
    }
  } catch (err) {
    logger.warn({ err: (err as Error).message, userId }, 'moving waiting jobs up failed; they start on their next check');
  }
}

/**
 * A running plan stops its search and ends as usual with the best plan found so far (its warning
 * says it was stopped, with the proven gap); anything else is cancelled.
 */
export async function stopJobEarly(row: JobRow): Promise<void> {
  if ((row.kind !== 'plan' && row.kind !== 'proof') || row.status !== 'running') return cancelJob(row);
  publishStop(row.id);
}

export async function cancelJob(row: JobRow): Promise<void> {
  publishCancel(row.id);
  await endOpenJob(row, 'cancelled', 'Cancelled: no results were kept.');
  const fresh = (await findJob(row.id)) ?? row;
  void wakeUser(fresh.userId);
  // A waiting entry is dropped; a running one ends itself when its worker hears the cancel.
  void queue(JOBS_QUEUE)
    .remove(bullId(row))
    .catch(() => undefined);
}

export async function closeQueues(): Promise<void> {
  const all = [...queues.values()];
  queues.clear();
  await Promise.all(all.map((q) => q.close().catch(() => undefined)));
}
