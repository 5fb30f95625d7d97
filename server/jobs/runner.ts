/**
 * Drives background jobs in this process: a queue per user (at most config.MAX_JOBS_PER_USER
 * running at once, the rest queued with their position reported), progress, cancel, and the
 * final write. A handler computes without touching the results tables and returns a `commit`;
 * the runner applies it in one transaction only if the row is still 'running', so a cancelled
 * or interrupted job never has results presented as complete.
 */
import { EventEmitter } from 'node:events';
import type { JobEvent, JobEventType } from '../../shared/api/plans';
import { config } from '../config';
import { db, type Tx } from '../db';
import { logger } from '../core/logging';
import { jobDto } from './dto';
import { endJob, findJob, lockJobStatus, markRunning, updateJob, type JobRow } from './store';

export interface JobContext {
  readonly signal: AbortSignal;
  /** `extra` rides along on the progress event (a plan search's `search` report). */
  progress(fraction: number, done?: number, of?: number, extra?: Pick<JobEvent, 'search'>): void;
}

export interface JobHandler {
  /** Does the work; returns the writes that make the result visible. Throw to fail the job. */
  run(job: JobRow, ctx: JobContext): Promise<(tx: Tx) => Promise<void>>;
  /** Called (inside the ending transaction) when the job ends without success. */
  onEnd?(job: JobRow, status: 'failed' | 'cancelled' | 'interrupted', message: string, tx: Tx | typeof db): Promise<void>;
}

/** A failure whose message is meant for the user. */
export class JobFailure extends Error {}

interface Running {
  controller: AbortController;
  userId: number;
  row: JobRow;
  lastWrite: number;
  lastEmit: number;
}

const PROGRESS_WRITE_MS = 300;
const PROGRESS_EMIT_MS = 100;

class JobRunner {
  private readonly handlers = new Map<JobRow['kind'], JobHandler>();
  private readonly queue: JobRow[] = [];
  private readonly running = new Map<number, Running>();
  readonly events = new EventEmitter();

  constructor() {
    this.events.setMaxListeners(0);
  }

  register(kind: JobRow['kind'], handler: JobHandler): void {
    this.handlers.set(kind, handler);
  }

  /** 1-based position among the user's queued jobs, or null. */
  positionOf(jobId: number): number | null {
    const job = this.queue.find((j) => j.id === jobId);
    if (!job) return null;
    return this.queue.filter((j) => j.userId === job.userId && j.id <= jobId).length;
  }

  isActive(jobId: number): boolean {
    return this.running.has(jobId) || this.queue.some((j) => j.id === jobId);
  }

  emit(type: JobEventType, row: JobRow, extra: Partial<JobEvent> = {}): void {
    const event: JobEvent = { type, job: jobDto(row, this.positionOf(row.id)), ...extra };
    this.events.emit(`job:${row.id}`, event);
  }

  enqueue(row: JobRow): void {
    this.queue.push(row);
    this.emit('queued', row, { position: this.positionOf(row.id) ?? 1 });
    this.schedule();
  }

  private schedule(): void {
    const busy = new Map<number, number>();
    for (const r of this.running.values()) busy.set(r.userId, (busy.get(r.userId) ?? 0) + 1);
    const starting: JobRow[] = [];
    for (const job of this.queue) {
      const n = busy.get(job.userId) ?? 0;
      if (n >= config.MAX_JOBS_PER_USER) continue;
      busy.set(job.userId, n + 1);
      starting.push(job);
    }
    if (starting.length === 0) return;
    for (const job of starting) {
      this.queue.splice(this.queue.indexOf(job), 1);
      this.running.set(job.id, { controller: new AbortController(), userId: job.userId, row: job, lastWrite: 0, lastEmit: 0 });
    }
    // Everyone still waiting behind moved up.
    for (const job of this.queue)
      if (starting.some((s) => s.userId === job.userId)) this.emit('queued', job, { position: this.positionOf(job.id) ?? 1 });
    for (const job of starting) void this.start(job);
  }

  private async start(job: JobRow): Promise<void> {
    const slot = this.running.get(job.id)!;
    const handler = this.handlers.get(job.kind);
    try {
      if (!handler) throw new Error(`No handler for ${job.kind} jobs`);
      if (!(await markRunning(job.id))) return;
      slot.row = { ...slot.row, status: 'running', startedAt: new Date() };
      this.emit('started', slot.row);
      const ctx: JobContext = { signal: slot.controller.signal, progress: (f, done, of, extra) => this.progress(slot, f, done, of, extra) };
      const commit = await handler.run(slot.row, ctx);
      if (slot.controller.signal.aborted) return;
      const finished = await db.transaction(async (tx) => {
        if ((await lockJobStatus(tx, job.id)) !== 'running') return false;
        await commit(tx);
        await endJob(job.id, 'done', null, tx);
        return true;
      });
      if (finished) {
        const row = (await findJob(job.id))!;
        this.emit('done', row);
      }
    } catch (err) {
      if (slot.controller.signal.aborted) return;
      const message = err instanceof JobFailure ? err.message : userMessage(err);
      if (!(err instanceof JobFailure)) logger.warn({ err, jobId: job.id }, 'background job failed');
      await this.end(slot.row, 'failed', message, handler);
    } finally {
      this.running.delete(job.id);
      this.schedule();
    }
  }

  private progress(slot: Running, fraction: number, done?: number, of?: number, extra?: Pick<JobEvent, 'search'>): void {
    if (slot.controller.signal.aborted) return;
    const f = Math.max(slot.row.progress, Math.min(1, Math.max(0, fraction)));
    slot.row = { ...slot.row, progress: f };
    const now = Date.now();
    const final = done !== undefined && of !== undefined && done >= of;
    if (now - slot.lastEmit >= PROGRESS_EMIT_MS || final) {
      slot.lastEmit = now;
      this.emit('progress', slot.row, { fraction: f, done, of, ...extra });
    }
    if (now - slot.lastWrite >= PROGRESS_WRITE_MS) {
      slot.lastWrite = now;
      void updateJob(slot.row.id, { progress: f }).catch((err: unknown) => logger.warn({ err }, 'progress write failed'));
    }
  }

  private async end(row: JobRow, status: 'failed' | 'cancelled' | 'interrupted', message: string, handler?: JobHandler): Promise<void> {
    const ended = await db.transaction(async (tx) => {
      if (!(await endJob(row.id, status, message, tx))) return false;
      await handler?.onEnd?.(row, status, message, tx);
      return true;
    });
    if (ended) {
      const fresh = (await findJob(row.id)) ?? row;
      this.emit(status, fresh, { message });
    }
  }

  /** Cancels a queued or running job; ends it as cancelled at once (late results are discarded). */
  async cancel(row: JobRow): Promise<void> {
    const waiting = this.queue.findIndex((j) => j.id === row.id);
    if (waiting >= 0) this.queue.splice(waiting, 1);
    const slot = this.running.get(row.id);
    slot?.controller.abort();
    await this.end(row, 'cancelled', 'Cancelled: no results were kept.', this.handlers.get(row.kind));
    this.schedule();
  }

  /** Ends every open job of this process as interrupted (graceful shutdown). */
  async interruptAll(message: string): Promise<void> {
    const open = [...this.queue, ...[...this.running.values()].map((r) => r.row)];
    this.queue.length = 0;
    for (const r of this.running.values()) r.controller.abort();
    for (const row of open) await this.end(row, 'interrupted', message, this.handlers.get(row.kind));
  }
}

function userMessage(err: unknown): string {
  const e = err as { name?: string; message?: string };
  if (e?.name === 'TimeLimitError' || e?.name === 'EngineError') return e.message ?? 'The computation failed.';
  return 'The job failed on our side; try again, and report it if it keeps happening.';
}

export const jobRunner = new JobRunner();
