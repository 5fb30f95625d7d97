/**
 * The worker side: BullMQ workers for whole jobs and for rehearsal chunks, in any number of
 * processes on any number of machines. A job is admitted when its user has a free slot (else put
 * off and woken when one frees), runs with progress and cancel, and ends with one conditional
 * write. A worker that dies stops renewing its lock; BullMQ's stalled-job check hands the entry
 * to another worker, which resumes it (nothing is marked interrupted by a process that merely
 * starts). Shutdown stops this process's work and hands it back to the queue before the database
 * pool is closed.
 */
import { DelayedError, UnrecoverableError, WaitingChildrenError, Worker, type Job } from 'bullmq';
import { config } from '../config';
import { logger } from '../core/logging';
import { onCancel } from './events';
import { handlerOf, isChunked, JobFailure, type ChunkedJobHandler, type JobHandler } from './handlers';
import { emitJob, endOpenJob, finishJob, withDbRetry } from './lifecycle';
import { CHUNKS_QUEUE, chunkId, connection, entryOptions, JOBS_QUEUE, queue, wakeUser, type ChunkData, type JobData } from './queues';
import { recordChunkDone, clearProgress } from './progress';
import { startReconciler, stopReconciler } from './reconcile';
import { admitJob, findJob, raiseProgress, type JobRow } from './store';
import { QUEUE_PREFIX, watchConnection } from './redis';

/** How long a job put off for a full user queue waits before it checks again (it is also woken). */
const PUT_OFF_MS = 2000;
const SHUTDOWN = 'shutdown';

const running = new Map<number, Set<AbortController>>();
const workers: Worker[] = [];
let stopCancels: (() => void) | undefined;
let stopping = false;

function track(jobId: number): AbortController {
  const c = new AbortController();
  if (!running.has(jobId)) running.set(jobId, new Set());
  running.get(jobId)!.add(c);
  return c;
}

function untrack(jobId: number, c: AbortController): void {
  running.get(jobId)?.delete(c);
  if (running.get(jobId)?.size === 0) running.delete(jobId);
}

/** Gives the entry back to the queue untouched (no try used up): another worker takes it. */
async function handBack(bull: Job, token: string | undefined, delayMs = 0): Promise<never> {
  await bull.moveToDelayed(Date.now() + delayMs, token);
  throw new DelayedError();
}

async function processJob(bull: Job<JobData>, token?: string): Promise<unknown> {
  const { jobId } = bull.data;
  const row = await findJob(jobId);
  const handler = row && handlerOf(row.kind);
  if (!row || !handler) return null;
  if (isChunked(handler) && bull.data.step === 'merge') return merge(bull, row, handler);
  if (stopping) return handBack(bull, token);
  const admission = await admitJob(jobId, config.MAX_JOBS_PER_USER);
  if (admission === 'ended') return null;
  if (admission === 'wait') return handBack(bull, token, PUT_OFF_MS);
  const fresh = (await findJob(jobId))!;
  if (admission === 'admitted') await emitJob('started', fresh);
  if (isChunked(handler)) return addChunks(bull, token, fresh, handler);
  return runWhole(bull, token, fresh, handler);
}

async function runWhole(bull: Job<JobData>, token: string | undefined, row: JobRow, handler: JobHandler): Promise<unknown> {
  const control = track(row.id);
  let lastEmit = 0;
  let lastWrite = 0;
  let progress = row.progress;
  try {
    const commit = await handler.run(row, {
      signal: control.signal,
      progress: (fraction, done, of, extra) => {
        if (control.signal.aborted) return;
        progress = Math.max(progress, Math.min(1, Math.max(0, fraction)));
        const now = Date.now();
        if (now - lastEmit >= 100) {
          lastEmit = now;
          void emitJob('progress', { ...row, progress }, { fraction: progress, done, of, ...extra });
        }
        if (now - lastWrite >= 300) {
          lastWrite = now;
          void raiseProgress(row.id, progress).catch(() => undefined);
        }
      },
    });
    if (control.signal.aborted) return afterAbort(bull, token, control);
    if (await finishJob(row, commit)) void wakeUser(row.userId);
    return null;
  } catch (err) {
    if (control.signal.aborted) return afterAbort(bull, token, control);
    return failOrRetry(row, err);
  } finally {
    untrack(row.id, control);
  }
}

/** Shutdown hands the entry back; a cancel just ends it (the canceller already ended the row). */
async function afterAbort(bull: Job, token: string | undefined, control: AbortController): Promise<{ index?: number; result: null }> {
  if (control.signal.reason === SHUTDOWN) return handBack(bull, token);
  return { index: (bull.data as Partial<ChunkData>).index, result: null };
}

/** A user-facing failure ends the job now; anything else (a database fault) is tried again by BullMQ. */
async function failOrRetry(row: JobRow, err: unknown): Promise<null> {
  if (err instanceof JobFailure) {
    await endOpenJob(row, 'failed', err.message);
    void wakeUser(row.userId);
    return null;
  }
  const e = err as { name?: string; message?: string };
  if (e?.name === 'TimeLimitError' || e?.name === 'EngineError') {
    await endOpenJob(row, 'failed', e.message ?? 'The computation failed.');
    void wakeUser(row.userId);
    return null;
  }
  throw err;
}

async function addChunks(bull: Job<JobData>, token: string | undefined, row: JobRow, handler: ChunkedJobHandler): Promise<unknown> {
  let ranges;
  try {
    ranges = await handler.chunks(row);
  } catch (err) {
    return failOrRetry(row, err);
  }
  const parent = { id: bull.id!, queue: bull.queueQualifiedName };
  const of = ranges.at(-1)?.to ?? 0;
  await queue(CHUNKS_QUEUE).addBulk(
    ranges.map((r, index) => ({
      name: 'chunk',
      data: { jobId: row.id, index, from: r.from, to: r.to, of } satisfies ChunkData,
      opts: { ...entryOptions(), jobId: chunkId(bull.id!, index), parent, failParentOnFailure: true },
    })),
  );
  await bull.updateData({ ...bull.data, step: 'merge', chunks: ranges.length });
  if (await bull.moveToWaitingChildren(token!)) throw new WaitingChildrenError();
  return merge(bull, row, handler);
}

async function merge(bull: Job<JobData>, row: JobRow, handler: ChunkedJobHandler): Promise<unknown> {
  if (row.status !== 'running') return null;
  const values = Object.values(await bull.getChildrenValues<{ index: number; result: string | null } | null>());
  const results: string[] = [];
  for (const v of values) if (v && v.result !== null) results[v.index] = v.result;
  const expected = bull.data.chunks ?? 0;
  const complete = results.length === expected && results.every((r) => typeof r === 'string');
  if (!complete) {
    // A chunk skipped its work because the job had ended meanwhile.
    const now = await findJob(row.id);
    if (now?.status !== 'running') return null;
    throw new Error(`rehearsal ${row.id}: ${expected} chunks expected, ${results.filter(Boolean).length} results found`);
  }
  try {
    const commit = await handler.merge(row, results);
    if (await finishJob(row, commit)) void wakeUser(row.userId);
    await clearProgress(row.id);
    return null;
  } catch (err) {
    return failOrRetry(row, err);
  }
}

async function processChunk(bull: Job<ChunkData>, token?: string): Promise<unknown> {
  const { jobId, index, from, to, of } = bull.data;
  const row = await findJob(jobId);
  const handler = row && handlerOf(row.kind);
  if (!row || !handler || !isChunked(handler) || row.status !== 'running') return { index, result: null };
  if (stopping) return handBack(bull, token);
  const control = track(jobId);
  try {
    const result = await handler.runChunk(row, { from, to }, control.signal);
    if (control.signal.aborted) return afterAbort(bull, token, control);
    const done = await recordChunkDone(jobId, index, to - from);
    const fraction = Math.min(1, done / of);
    void emitJob('progress', { ...row, progress: fraction }, { fraction, done, of });
    void raiseProgress(jobId, fraction).catch(() => undefined);
    return { index, result };
  } catch (err) {
    if (control.signal.aborted) return afterAbort(bull, token, control);
    const e = err as { name?: string };
    if (err instanceof JobFailure || e?.name === 'EngineError') throw new UnrecoverableError((err as Error).message);
    throw err;
  } finally {
    untrack(jobId, control);
  }
}

/** The last try of an entry failed: the job row says so, in words the user can act on. */
async function onFinalFailure(bull: Job<JobData | ChunkData> | undefined, err: Error): Promise<void> {
  if (!bull) return;
  const attempts = bull.opts.attempts ?? 1;
  const final = err instanceof UnrecoverableError || err.name === 'UnrecoverableError' || bull.attemptsMade >= attempts;
  if (!final || err instanceof DelayedError || err instanceof WaitingChildrenError) return;
  const jobId = bull.data.jobId;
  logger.error({ err: err.message, jobId, entry: bull.id }, 'background job gave up');
  const message =
    err.name === 'UnrecoverableError'
      ? err.message
      : `The job failed on our side after ${attempts} tries (the database or the job queue kept failing); nothing partial was kept. Run it again.`;
  try {
    await withDbRetry('marking a job failed', async () => {
      const row = await findJob(jobId);
      if (row && (row.status === 'queued' || row.status === 'running')) {
        await endOpenJob(row, 'failed', message);
        void wakeUser(row.userId);
      }
    });
  } catch (e) {
    logger.error({ err: (e as Error).message, jobId }, 'could not mark the job failed; the reconciler will');
  }
}

function makeWorker<T>(name: string, processor: (job: Job<T>, token?: string) => Promise<unknown>, concurrency: number): Worker {
  const lockDuration = config.JOB_LOCK_SECONDS * 1000;
  const w = new Worker(name, processor, {
    connection: connection(`worker-${name}`),
    prefix: QUEUE_PREFIX,
    concurrency,
    lockDuration,
    stalledInterval: lockDuration,
    maxStalledCount: config.JOB_ATTEMPTS,
  });
  watchConnection(w, `worker ${name}`);
  w.on('failed', (job, err) => void onFinalFailure(job as Job<JobData | ChunkData> | undefined, err));
  return w;
}

export function startWorkers(): void {
  if (workers.length) return;
  stopping = false;
  stopCancels = onCancel((jobId) => {
    for (const c of running.get(jobId) ?? []) c.abort('cancelled');
  });
  workers.push(makeWorker<JobData>(JOBS_QUEUE, processJob, config.WORKERS * 2));
  workers.push(makeWorker<ChunkData>(CHUNKS_QUEUE, processChunk, config.WORKERS));
  startReconciler();
}

/** Stops taking work, hands running work back to the queue, and waits until nothing of it can still write. */
export async function stopWorkers(): Promise<void> {
  stopping = true;
  stopReconciler();
  stopCancels?.();
  for (const set of running.values()) for (const c of set) c.abort(SHUTDOWN);
  const all = workers.splice(0);
  await Promise.all(all.map((w) => w.close().catch((err: unknown) => logger.warn({ err }, 'closing a worker failed'))));
}
