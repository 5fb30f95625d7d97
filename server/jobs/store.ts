/** Data access for job rows (the truth about every background job). */
import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';
import { users } from '../../db/schema/accounts';
import { jobs, plans, rehearsals } from '../../db/schema/plans';
import { db, type Conn, type Tx } from '../db';
import { firstOf } from '../../shared/checked';

export type JobRow = typeof jobs.$inferSelect;
export type NewJob = typeof jobs.$inferInsert;

export async function insertJob(values: NewJob, tx: Conn = db): Promise<number> {
  const { id } = firstOf(await tx.insert(jobs).values(values).$returningId(), 'new job id');
  return id;
}

export async function findJob(id: number, tx: Conn = db): Promise<JobRow | undefined> {
  const [row] = await tx.select().from(jobs).where(eq(jobs.id, id));
  return row;
}

export async function findJobByKey(userId: number, key: string, tx: Conn = db): Promise<JobRow | undefined> {
  const [row] = await tx
    .select()
    .from(jobs)
    .where(and(eq(jobs.userId, userId), eq(jobs.idempotencyKey, key)));
  return row;
}

export async function clearJobKey(id: number, tx: Conn = db): Promise<void> {
  await tx.update(jobs).set({ idempotencyKey: null }).where(eq(jobs.id, id));
}

export async function updateJob(id: number, patch: Partial<NewJob>, tx: Conn = db): Promise<void> {
  await tx.update(jobs).set(patch).where(eq(jobs.id, id));
}

/** Ends a job that is still open (queued or running); false when it had already ended. */
export async function endJob(
  id: number,
  status: 'done' | 'failed' | 'cancelled' | 'interrupted',
  message: string | null,
  tx: Conn = db,
): Promise<boolean> {
  const [res] = await tx
    .update(jobs)
    .set({ status, message, finishedAt: new Date(), ...(status === 'done' ? { progress: 1 } : {}) })
    .where(and(eq(jobs.id, id), inArray(jobs.status, ['queued', 'running'])));
  return res.affectedRows === 1;
}

/** Locks the row inside a transaction and reports its status (the final write checks it). */
export async function lockJobStatus(id: number, tx: Tx): Promise<JobRow['status'] | undefined> {
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

/** Progress only grows (two workers may report chunks out of order). */
export async function raiseProgress(id: number, fraction: number): Promise<void> {
  await db
    .update(jobs)
    .set({ progress: sql`GREATEST(${jobs.progress}, ${fraction})` })
    .where(and(eq(jobs.id, id), eq(jobs.status, 'running')));
}

export type Admission = 'admitted' | 'resumed' | 'wait' | 'ended';

/**
 * queued -> running when the user has a free slot (config.MAX_JOBS_PER_USER), first come first
 * served per user. The user's row is locked as a mutex, so two workers never admit past the limit.
 * 'resumed': the job was already running (its worker died and the queue handed it to another one).
 * Background proofs ('proof') come last: they wait for every other job of the user, and other jobs
 * do not count them (a running proof is asked to stop when the user starts a plan).
 */
export async function admitJob(id: number, maxRunning: number): Promise<Admission> {
  return db.transaction(async (tx) => {
    const [job] = await tx.select({ status: jobs.status, userId: jobs.userId, kind: jobs.kind }).from(jobs).where(eq(jobs.id, id));
    if (!job) return 'ended';
    if (job.status === 'running') return 'resumed';
    if (job.status !== 'queued') return 'ended';
    await tx.select({ id: users.id }).from(users).where(eq(users.id, job.userId)).for('update');
    const proof = job.kind === 'proof';
    const [row] = await tx
      .select({
        running: sql<number>`SUM(${jobs.status} = 'running')`,
        before: proof
          ? sql<number>`SUM(${jobs.status} = 'queued' AND (${jobs.kind} <> 'proof' OR ${jobs.id} < ${id}))`
          : sql<number>`SUM(${jobs.status} = 'queued' AND ${jobs.id} < ${id})`,
      })
      .from(jobs)
      .where(and(eq(jobs.userId, job.userId), inArray(jobs.status, ['queued', 'running']), proof ? undefined : ne(jobs.kind, 'proof')));
    if (Number(row?.running ?? 0) + Number(row?.before ?? 0) >= maxRunning) return 'wait';
    const [res] = await tx
      .update(jobs)
      .set({ status: 'running', startedAt: new Date() })
      .where(and(eq(jobs.id, id), eq(jobs.status, 'queued')));
    return res.affectedRows === 1 ? 'admitted' : 'ended';
  });
}

/** Counts for the queue position of a queued job: the user's running jobs and queued ones up to it. */
export async function queueCounts(userId: number, jobId: number): Promise<{ running: number; upTo: number }> {
  const [row] = await db
    .select({
      running: sql<number>`SUM(${jobs.status} = 'running')`,
      upTo: sql<number>`SUM(${jobs.status} = 'queued' AND ${jobs.id} <= ${jobId})`,
    })
    .from(jobs)
    .where(and(eq(jobs.userId, userId), inArray(jobs.status, ['queued', 'running'])));
  return { running: Number(row?.running ?? 0), upTo: Number(row?.upTo ?? 0) };
}

/** The user's open jobs (queued or running), oldest first. */
export async function openJobsOf(userId: number): Promise<JobRow[]> {
  return db
    .select()
    .from(jobs)
    .where(and(eq(jobs.userId, userId), inArray(jobs.status, ['queued', 'running'])))
    .orderBy(asc(jobs.id));
}

/** Every open job, oldest first (the queue reconciler checks each has its queue entry). */
export async function openJobs(limit = 1000): Promise<JobRow[]> {
  return db
    .select()
    .from(jobs)
    .where(inArray(jobs.status, ['queued', 'running']))
    .orderBy(asc(jobs.id))
    .limit(limit);
}

/**
 * What a user has open now: jobs queued or running, and the cascades of those that are rehearsals.
 * Background proofs count only with `withProofs` (they never block what the user asks for).
 */
export async function openLoadOf(userId: number, withProofs = false, tx: Conn = db): Promise<{ jobs: number; cascades: number }> {
  const [row] = await tx
    .select({ jobs: sql<number>`COUNT(*)`, cascades: sql<number>`COALESCE(SUM(${rehearsals.runs}), 0)` })
    .from(jobs)
    .leftJoin(rehearsals, eq(rehearsals.id, jobs.rehearsalId))
    .where(and(eq(jobs.userId, userId), inArray(jobs.status, ['queued', 'running']), withProofs ? undefined : ne(jobs.kind, 'proof')));
  return { jobs: Number(row?.jobs ?? 0), cascades: Number(row?.cascades ?? 0) };
}

/** Plans a user keeps stored. */
export async function plansStoredBy(userId: number): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`COUNT(*)` })
    .from(plans)
    .where(eq(plans.createdBy, userId));
  return Number(row?.n ?? 0);
}
