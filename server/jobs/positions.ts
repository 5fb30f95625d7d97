/**
 * Where a queued job stands in its user's queue, from the job rows (so every web process gives
 * the same answer): 1 is next. A user runs at most config.MAX_JOBS_PER_USER jobs at once; queued
 * jobs that fit in the free slots are about to start and also count as next.
 */
import { config } from '../config';
import { queueCounts, type JobRow } from './store';

export async function queuePosition(row: Pick<JobRow, 'id' | 'userId' | 'status'>): Promise<number | null> {
  if (row.status !== 'queued') return null;
  const { running, upTo } = await queueCounts(row.userId, row.id);
  return Math.max(1, upTo - Math.max(0, config.MAX_JOBS_PER_USER - running));
}

/** Positions of the queued jobs among rows (one query per queued job; lists hold few of them). */
export async function queuePositions(rows: readonly Pick<JobRow, 'id' | 'userId' | 'status'>[]): Promise<Map<number, number>> {
  const out = new Map<number, number>();
  for (const row of rows) {
    const p = await queuePosition(row);
    if (p !== null) out.set(row.id, p);
  }
  return out;
}
