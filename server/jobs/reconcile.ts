/**
 * Keeps the queue and the job rows in step, safely from any number of processes: a job row that
 * is open but has no queue entry (Redis was unreachable when it was queued, or Redis lost its
 * data) gets its entry again; a row whose entry failed for good (and could not be marked then,
 * say the database was down) is marked failed. Entries that exist are never touched, so a
 * process that starts beside a running one leaves that one's jobs alone.
 */
import { logger } from '../core/logging';
import { endOpenJob } from './lifecycle';
import { bullId, enqueueJob, JOBS_QUEUE, queue } from './queues';
import { openJobs } from './store';

/** Rows younger than this may be between their insert and their queue entry. */
const GRACE_MS = 30_000;
const EVERY_MS = 30_000;
let timer: NodeJS.Timeout | undefined;
let busy = false;

export async function reconcileOnce(now = Date.now()): Promise<{ requeued: number; failed: number }> {
  const out = { requeued: 0, failed: 0 };
  for (const row of await openJobs()) {
    if (now - row.createdAt.getTime() < GRACE_MS) continue;
    const state = await queue(JOBS_QUEUE).getJobState(bullId(row));
    if (state === 'unknown') {
      await enqueueJob(row);
      out.requeued++;
    } else if (state === 'failed' || state === 'completed') {
      const entry = await queue(JOBS_QUEUE).getJob(bullId(row));
      const reason = entry?.failedReason ? ` (${entry.failedReason})` : '';
      if (await endOpenJob(row, 'failed', `The job could not be finished${reason}; nothing partial was kept. Run it again.`)) out.failed++;
    }
  }
  if (out.requeued || out.failed) logger.warn(out, 'job queue reconciled with the job rows');
  return out;
}

export function startReconciler(): void {
  if (timer) return;
  const tick = () => {
    if (busy) return;
    busy = true;
    reconcileOnce()
      .catch((err: unknown) => logger.warn({ err: (err as Error).message }, 'reconciling the job queue failed; trying again later'))
      .finally(() => (busy = false));
  };
  timer = setInterval(tick, EVERY_MS);
  timer.unref();
  setTimeout(tick, 1000).unref();
}

export function stopReconciler(): void {
  if (timer) clearInterval(timer);
  timer = undefined;
}
