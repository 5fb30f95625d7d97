/**
 * Server-sent events for one job: the current state first (so a late subscriber sees `done` at
 * once), then every change; a `: heartbeat` comment every 15 s; the stream ends after a final event
 * or when the client goes away.
 */
import type { Request, Response } from 'express';
import type { JobEvent, JobEventType } from '../../shared/api/plans';
import { jobDto } from './dto';
import { jobRunner } from './runner';
import { findJob, type JobRow } from './store';

export const HEARTBEAT_MS = 15_000;
const FINAL: readonly JobEventType[] = ['done', 'failed', 'cancelled', 'interrupted'];

function currentEvent(row: JobRow): JobEvent {
  const position = jobRunner.positionOf(row.id);
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
  const send = (event: JobEvent) => {
    if (closed) return;
    res.write(`event: ${event.type}\ndata: ${JSON.stringify(event)}\n\n`);
    if (FINAL.includes(event.type)) finish();
  };
  const channel = `job:${jobId}`;
  const heartbeat = setInterval(() => !closed && res.write(': heartbeat\n\n'), HEARTBEAT_MS);
  function finish() {
    if (closed) return;
    closed = true;
    clearInterval(heartbeat);
    jobRunner.events.off(channel, send);
    res.end();
  }
  // Subscribe before reading the row, so no change between the read and the subscription is lost.
  jobRunner.events.on(channel, send);
  req.on('close', finish);
  res.write('retry: 3000\n\n');
  const row = await findJob(jobId);
  if (!row) return finish();
  send(currentEvent(row));
}
