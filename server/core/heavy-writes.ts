import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { counterKeyPrefix, counterRedis } from '../jobs/redis';
import { config } from '../config';
import { HttpError } from './http-error';

/**
 * Heavy writes (edit batches, imports, rooms created with content) each hold a database
 * connection and row locks for a while. One account may run at most MAX_HEAVY_WRITES_PER_USER
 * of them at once over all web processes, so no single user can occupy the pool that everyone
 * else's requests need. The slots live in Redis beside the rate-limit counters: a sorted set per
 * account of slot tokens scored by their start, taken and counted in one script; a slot older
 * than SLOT_TTL_MS (a process that died mid-write) no longer counts. The slot is freed when the
 * answer is sent or the client goes away. While Redis is away the slots fail open, as the rate
 * limits do.
 *
 * `res.locals.clientGone` is an AbortSignal that fires when the client disconnects before the
 * answer: heavy writes check it before they commit, so an abandoned batch is rolled back.
 */
const SLOT_TTL_MS = 10 * 60 * 1000;
const TAKE_SLOT = `
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', ARGV[1] - ARGV[2])
local n = redis.call('ZCARD', KEYS[1])
if n >= tonumber(ARGV[3]) then return n end
redis.call('ZADD', KEYS[1], ARGV[1], ARGV[4])
redis.call('PEXPIRE', KEYS[1], ARGV[2])
return -1`;

/** Takes a slot for `token`: -1 when taken, else the number of writes already running. */
async function takeSlot(key: string, token: string): Promise<number> {
  try {
    const r = await counterRedis().eval(TAKE_SLOT, 1, key, Date.now(), SLOT_TTL_MS, config.MAX_HEAVY_WRITES_PER_USER, token);
    return Number(r);
  } catch {
    return -1;
  }
}

export async function heavyWrite(req: Request, res: Response, next: NextFunction): Promise<void> {
  const userId = req.user?.id;
  if (userId === undefined) return next();
  const key = `${counterKeyPrefix('heavy-writes')}${userId}`;
  const token = randomUUID();
  const now = await takeSlot(key, token);
  if (now >= 0) {
    res.set('Retry-After', '2');
    return next(
      new HttpError(
        429,
        'busy_writing',
        `You already have ${now} large change${now === 1 ? '' : 's'} (imports or edit batches) being saved. Wait for ${now === 1 ? 'it' : 'them'} to finish, then send this one again.`,
      ),
    );
  }
  const gone = new AbortController();
  res.locals['clientGone'] = gone.signal;
  let freed = false;
  res.on('close', () => {
    if (!res.writableFinished) gone.abort();
    if (freed) return;
    freed = true;
    counterRedis()
      .zrem(key, token)
      .catch(() => undefined); // it expires by itself
  });
  next();
}

/** The signal set by heavyWrite (never aborted if the route has none). */
export function clientGoneSignal(res: Response): AbortSignal {
  return (res.locals['clientGone'] as AbortSignal | undefined) ?? new AbortController().signal;
}

/** Thrown inside a transaction to roll back the work of a client that left. */
export class ClientGoneError extends HttpError {
  constructor() {
    super(499, 'client_gone', 'The client went away before the change was saved; nothing was saved.');
  }
}

export function assertClientThere(signal: AbortSignal | undefined): void {
  if (signal?.aborted) throw new ClientGoneError();
}
