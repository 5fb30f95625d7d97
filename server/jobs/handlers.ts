/**
 * What a kind of background job provides, and the registry the workers look handlers up in.
 * A handler computes without touching the results tables and returns a `commit`; the worker
 * applies it in one transaction only if the row is still 'running', so a cancelled job never has
 * results presented as complete.
 */
import type { JobEvent } from '../../shared/api/plans';
import type { Conn, Tx } from '../db';
import type { JobRow } from './store';

/** Applies a job's results; may return work to do once they are committed (queueing a follow-up job). */
export type Commit = (tx: Tx) => Promise<void | (() => Promise<void>)>;
export type EndStatus = 'failed' | 'cancelled' | 'interrupted';

export interface JobContext {
  readonly signal: AbortSignal;
  /** Raised when the user asks a running job to stop and keep what it has (plan searches). */
  readonly stopEarly: AbortSignal;
  /** `extra` rides along on the progress event (a plan search's `search` report). */
  progress(fraction: number, done?: number, of?: number, extra?: Pick<JobEvent, 'search'>): void;
}

interface EndHook {
  /** Called (inside the ending transaction) when the job ends without success. */
  onEnd?(job: JobRow, status: EndStatus, message: string, tx: Conn): Promise<void>;
}

/** A job computed in one piece by one worker (plans). Throw JobFailure to fail it for good. */
export interface JobHandler extends EndHook {
  run(job: JobRow, ctx: JobContext): Promise<Commit>;
}

export interface ChunkRange {
  readonly from: number;
  readonly to: number;
}

/**
 * A job cut into chunks that any worker may compute (rehearsals). The chunks depend only on the
 * job, never on how many workers there are; `merge` gets every chunk's result in chunk order.
 */
export interface ChunkedJobHandler extends EndHook {
  chunks(job: JobRow): Promise<ChunkRange[]>;
  runChunk(job: JobRow, range: ChunkRange, signal: AbortSignal): Promise<string>;
  merge(job: JobRow, results: readonly string[]): Promise<Commit>;
}

/** A failure whose message is meant for the user; the job is not tried again. */
export class JobFailure extends Error {}

const handlers = new Map<JobRow['kind'], JobHandler | ChunkedJobHandler>();

export function registerHandler(kind: JobRow['kind'], handler: JobHandler | ChunkedJobHandler): void {
  handlers.set(kind, handler);
}

export function handlerOf(kind: JobRow['kind']): JobHandler | ChunkedJobHandler | undefined {
  return handlers.get(kind);
}

export function isChunked(h: JobHandler | ChunkedJobHandler): h is ChunkedJobHandler {
  return 'runChunk' in h;
}
