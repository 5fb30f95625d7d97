/**
 * Progress of a chunked job, shared by every worker: a Redis hash of chunk -> runs done, so a
 * chunk computed twice (its first worker died) counts once, and any worker can report the total.
 */
import type { Redis } from 'ioredis';
import { newRedis, QUEUE_PREFIX } from './redis';

let conn: Redis | undefined;
const key = (jobId: number) => `${QUEUE_PREFIX}:progress:${jobId}`;

function redis(): Redis {
  conn ??= newRedis('progress');
  return conn;
}

/** Records a finished chunk and returns the runs done so far over all chunks. */
export async function recordChunkDone(jobId: number, index: number, runs: number): Promise<number> {
  const [, , values] = (await redis()
    .multi()
    .hset(key(jobId), String(index), String(runs))
    .expire(key(jobId), 7 * 24 * 3600)
    .hvals(key(jobId))
    .exec()) as [unknown, unknown, [Error | null, string[]]];
  return (values[1] ?? []).reduce((sum, v) => sum + Number(v), 0);
}

export async function clearProgress(jobId: number): Promise<void> {
  await redis()
    .del(key(jobId))
    .catch(() => undefined);
}

export async function closeProgress(): Promise<void> {
  const c = conn;
  conn = undefined;
  await c?.quit().catch(() => c.disconnect());
}
