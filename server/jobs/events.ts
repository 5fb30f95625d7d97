/**
 * Job events and cancel signals between processes, over Redis pub/sub: any worker publishes, every
 * web process hears and feeds its SSE streams; a cancel (or a stop that keeps the best result)
 * asked in any web process reaches the worker running the job. In-process listeners subscribe by job id. Redis being down loses live
 * events only (the job row in MariaDB stays the truth; a stream opened later starts from it).
 */
import { EventEmitter } from 'node:events';
import type { Redis } from 'ioredis';
import type { JobEvent } from '../../shared/api/plans';
import { logger } from '../core/logging';
import { newRedis, QUEUE_PREFIX } from './redis';

const EVENTS = `${QUEUE_PREFIX}:job-events`;
const CANCELS = `${QUEUE_PREFIX}:job-cancels`;
const STOPS = `${QUEUE_PREFIX}:job-stops`;

const local = new EventEmitter();
local.setMaxListeners(0);
let pub: Redis | undefined;
let sub: Redis | undefined;

function publisher(): Redis {
  pub ??= newRedis('events-out');
  return pub;
}

/** Subscribes this process once (idempotent); listeners may be added before it is ready. */
export function startEvents(): void {
  if (sub) return;
  sub = newRedis('events-in');
  sub.on('message', (channel: string, text: string) => {
    try {
      if (channel === EVENTS) {
        const event = JSON.parse(text) as JobEvent;
        local.emit(`job:${event.job.id}`, event);
      } else if (channel === CANCELS) local.emit('cancel', Number(text));
      else if (channel === STOPS) local.emit('stop', Number(text));
    } catch (err) {
      logger.warn({ err }, 'unreadable job event');
    }
  });
  // ioredis subscribes again after every reconnect.
  void sub.subscribe(EVENTS, CANCELS, STOPS).catch((err: unknown) => logger.warn({ err }, 'subscribing to job events failed'));
}

export function publishJobEvent(event: JobEvent): void {
  publisher()
    .publish(EVENTS, JSON.stringify(event))
    .catch((err: unknown) => logger.warn({ err, jobId: event.job.id }, 'publishing a job event failed'));
}

export function onJobEvent(jobId: number, listener: (event: JobEvent) => void): () => void {
  startEvents();
  local.on(`job:${jobId}`, listener);
  return () => local.off(`job:${jobId}`, listener);
}

export function publishCancel(jobId: number): void {
  publisher()
    .publish(CANCELS, String(jobId))
    .catch((err: unknown) => logger.warn({ err, jobId }, 'publishing a cancel failed'));
}

export function onCancel(listener: (jobId: number) => void): () => void {
  startEvents();
  local.on('cancel', listener);
  return () => local.off('cancel', listener);
}

/** Asks the worker running the job to stop early and keep its best result (plan searches). */
export function publishStop(jobId: number): void {
  publisher()
    .publish(STOPS, String(jobId))
    .catch((err: unknown) => logger.warn({ err, jobId }, 'publishing a stop failed'));
}

export function onStop(listener: (jobId: number) => void): () => void {
  startEvents();
  local.on('stop', listener);
  return () => local.off('stop', listener);
}

export async function closeEvents(): Promise<void> {
  const conns = [pub, sub].filter((c): c is Redis => c !== undefined);
  pub = undefined;
  sub = undefined;
  await Promise.all(conns.map(async (c) => c.quit().catch(() => c.disconnect())));
}
