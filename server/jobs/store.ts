/** Data access for job rows (the truth about every background job). */
import { and, asc, eq, inArray } from 'drizzle-orm';
import { jobs, plans } from '../../db/schema/plans';
import { db, type Tx } from '../db';

export type JobRow = typeof jobs.$inferSelect;
export type NewJob = typeof jobs.$inferInsert;

export async function insertJob(values: NewJob, tx: Tx | typeof db = db): Promise<number> {
  const [{ id }] = await tx.insert(jobs).values(values).$returningId();
  return id;
}

export async function findJob(id: number, tx: Tx | typeof db = db): Promise<JobRow | undefined> {
  const [row] = await tx.select().from(jobs).where(eq(jobs.id, id));
  return row;
}

export async function findJobByKey(userId: number, key: string, tx: Tx | typeof db = db): Promise<JobRow | undefined> {
  const [row] = await tx
    .select()
    .from(jobs)
    .where(and(eq(jobs.userId, userId), eq(jobs.idempotencyKey, key)));
  return row;
}

export async function clearJobKey(id: number, tx: Tx | typeof db = db): Promise<void> {
  await tx.update(jobs).set({ idempotencyKey: null }).where(eq(jobs.id, id));
}

export async function updateJob(id: number, patch: Partial<NewJob>, tx: Tx | typeof db = db): Promise<void> {
  await tx.update(jobs).set(patch).where(eq(jobs.id, id));
}

/** queued -> running; false when the job was cancelled meanwhile. */
export async function markRunning(id: number): Promise<boolean> {
  const [res] = await db
    .update(jobs)
    .set({ status: 'running', startedAt: new Date() })
    .where(and(eq(jobs.id, id), eq(jobs.status, 'queued')));
  return res.affectedRows === 1;
}

/** Ends a job that is still open (queued or running); false when it had already ended. */
export async function endJob(
  id: number,
  status: 'done' | 'failed' | 'cancelled' | 'interrupted',
  message: string | null,
  tx: Tx | typeof db = db,
): Promise<boolean> {
  const [res] = await tx
    .update(jobs)
    .set({ status, message, finishedAt: new Date(), ...(status === 'done' ? { progress: 1 } : {}) })
    .where(and(eq(jobs.id, id), inArray(jobs.status, ['queued', 'running'])));
  return res.affectedRows === 1;
}

/** Locks the row inside a transaction and reports its status (the final write checks it). */
export async function lockJobStatus(tx: Tx, id: number): Promise<JobRow['status'] | undefined> {
  const [row] = await tx.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, id)).for('update');
  return row?.status;
}

export async function queuedJobsOf(userId: number): Promise<JobRow[]> {
  return db
    .select()
    .from(jobs)
    .where(and(eq(jobs.userId, userId), eq(jobs.status, 'queued')))
    .orderBy(asc(jobs.id));
}

export const INTERRUPTED_MESSAGE = 'The server stopped while this job was open; nothing partial was kept. Run it again.';

/**
 * Start-up recovery: every job still queued or running belonged to a process that is gone. They
 * become interrupted (results are only ever written together with 'done', so none are half there),
 * and plans still computing become interrupted too. Returns the number of jobs marked.
 */
export async function recoverOpenJobs(): Promise<number> {
  const [res] = await db
    .update(jobs)
    .set({ status: 'interrupted', message: INTERRUPTED_MESSAGE, finishedAt: new Date() })
    .where(inArray(jobs.status, ['queued', 'running']));
  await db.update(plans).set({ status: 'interrupted', error: INTERRUPTED_MESSAGE }).where(eq(plans.status, 'computing'));
  return res.affectedRows;
}
