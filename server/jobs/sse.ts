/**
 * Server-sent events for one job: the current state first (so a late subscriber sees `done` at
 * once), then every change, whichever process's worker made it (Redis pub/sub, events.ts); a `: heartbeat` comment every 15 s; the stream ends after a final event
 * or when the client goes away.
 */
import type { Request, Response } from 'express';
import type { JobEvent, JobEventType } from '../../shared/api/plans';
import { jobDto } from './dto';
import { onJobEvent } from './events';
import { queuePosition } from './positions';
import { findJob, type JobRow } from './store';

export const HEARTBEAT_MS = 15_000;
const FINAL: readonly JobEventType[] = ['done', 'failed', 'cancelled', 'interrupted'];

async function currentEvent(row: JobRow): Promise<JobEvent> {
  const position = await queuePosition(row);
  const job = jobDto(row, position);
  switch (row.status) {
    case 'queued':
      return { type: 'queued', job, position: position ?? 1 };
    case 'running':
      return { type: 'progress', job, fraction: row.progress };
    default:
      return { type: row.status, job, ...(row.message ? { message: row.message } : {}) };
  }
}

export async function streamJob(req: Request, res: Response, jobId: number): Promise<void> {
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  let closed = false;
  // Workers report chunks out of order: progress only ever moves forward on one stream.
  let shown = -1;
  const send = (event: JobEvent) => {
    if (closed) return;
    if (event.type === 'progress') {
      if ((event.fraction ?? 0) < shown) return;
      shown = event.fraction ?? 0;
    }
    res.write(`event: ${event.type}\ndata: ${JSON.stringify(event)}\n\n`);
    if (FINAL.includes(event.type)) finish();
  };
  const heartbeat = setInterval(() => !closed && res.write(': heartbeat\n\n'), HEARTBEAT_MS);
  function finish() {
    if (closed) return;
    closed = true;
    clearInterval(heartbeat);
    unsubscribe();
    res.end();
  }
  // Subscribe before reading the row, so no change between the read and the subscription is lost.
  const unsubscribe = onJobEvent(jobId, send);
  req.on('close', finish);
  res.write('retry: 3000\n\n');
  const row = await findJob(jobId);
  if (!row) return finish();
  send(await currentEvent(row));
}
