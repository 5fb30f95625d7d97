/**
 * The writes that end a job and the events that tell about it, shared by the workers and by
 * cancel in the web processes. Every end is conditional on the row still being open, so whoever
 * comes second (a cancel racing the final write, two workers after a stall) changes nothing.
 */
import type { JobEvent, JobEventType } from '../../shared/api/plans';
import { db } from '../db';
import { logger } from '../core/logging';
import { jobDto } from './dto';
import { publishJobEvent } from './events';
import { handlerOf, type Commit, type EndStatus } from './handlers';
import { queuePosition } from './positions';
import { endJob, findJob, lockJobStatus, type JobRow } from './store';

export async function emitJob(type: JobEventType, row: JobRow, extra: Partial<JobEvent> = {}): Promise<void> {
  const position = type === 'queued' ? await queuePosition(row).catch(() => null) : null;
  publishJobEvent({ type, job: jobDto(row, position), ...(type === 'queued' ? { position: position ?? 1 } : {}), ...extra });
}

/** Ends an open job without success (and its plan, through the handler); false when it had ended already. */
export async function endOpenJob(row: JobRow, status: EndStatus, message: string): Promise<boolean> {
  const handler = handlerOf(row.kind);
  const ended = await db.transaction(async (tx) => {
    if (!(await endJob(row.id, status, message, tx))) return false;
    await handler?.onEnd?.(row, status, message, tx);
    return true;
  });
  if (ended) await emitJob(status, (await findJob(row.id)) ?? row, { message });
  return ended;
}

/** Applies the results and marks the job done, only if it is still running. */
export async function finishJob(row: JobRow, commit: Commit): Promise<boolean> {
  let then: (() => Promise<void>) | undefined;
  const finished = await db.transaction(async (tx) => {
    if ((await lockJobStatus(row.id, tx)) !== 'running') return false;
    then = (await commit(tx)) ?? undefined;
    await endJob(row.id, 'done', null, tx);
    return true;
  });
  if (finished) await emitJob('done', (await findJob(row.id)) ?? row);
  if (finished && then) await then().catch((err: unknown) => logger.warn({ err, jobId: row.id }, 'work after a finished job failed'));
  return finished;
}

/** MariaDB (or the network to it) went away: worth trying again, unlike a bad statement. */
export function isConnectionFault(err: unknown): boolean {
  const seen = new Set<unknown>();
  for (
    let e = err as { code?: string; errno?: number; cause?: unknown; message?: string } | undefined;
    e && !seen.has(e);
    e = e.cause as typeof e
  ) {
    seen.add(e);
    const code = String(e.code ?? '');
    if (
      /^(ECONNREFUSED|ECONNRESET|EPIPE|ETIMEDOUT|EHOSTUNREACH|PROTOCOL_CONNECTION_LOST|PROTOCOL_SEQUENCE_TIMEOUT|ER_SERVER_SHUTDOWN|ER_CON_COUNT_ERROR|ER_LOCK_DEADLOCK|ER_LOCK_WAIT_TIMEOUT)$/.test(
        code,
      )
    )
      return true;
    if ([1213, 1205, 1053, 2002, 2006, 2013].includes(Number(e.errno))) return true;
    if (/closed state|Connection lost|connect ECONNREFUSED/i.test(e.message ?? '')) return true;
  }
  return false;
}

/**
 * Runs a write until it succeeds or the deadline passes, waiting longer between tries (the
 * database may be restarting). Other errors are thrown at once.
 */
export async function withDbRetry<T>(what: string, work: () => Promise<T>, deadlineMs = 120_000): Promise<T> {
  const until = Date.now() + deadlineMs;
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if (!isConnectionFault(err) || Date.now() > until) throw err;
      if (attempt === 1) logger.warn({ err: (err as Error).message }, `${what}: the database is not answering; trying again`);
      await new Promise((r) => setTimeout(r, Math.min(5000, 200 * attempt)));
    }
  }
}
