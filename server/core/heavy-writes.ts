import type { NextFunction, Request, Response } from 'express';
import { config } from '../config';
import { HttpError } from './http-error';

/**
 * Heavy writes (edit batches, imports, rooms created with content) each hold a database
 * connection and row locks for a while. One account may run at most MAX_HEAVY_WRITES_PER_USER
 * of them at once (per web process), so no single user can occupy the pool that everyone else's
 * requests need. The slot is freed when the answer is sent or the client goes away.
 *
 * `res.locals.clientGone` is an AbortSignal that fires when the client disconnects before the
 * answer: heavy writes check it before they commit, so an abandoned batch is rolled back.
 */
const running = new Map<number, number>();

export function heavyWrite(req: Request, res: Response, next: NextFunction): void {
  const userId = req.user?.id;
  if (userId === undefined) return next();
  const now = running.get(userId) ?? 0;
  if (now >= config.MAX_HEAVY_WRITES_PER_USER) {
    res.set('Retry-After', '2');
    return next(
      new HttpError(
        429,
        'busy_writing',
        `You already have ${now} large change${now === 1 ? '' : 's'} (imports or edit batches) being saved. Wait for ${now === 1 ? 'it' : 'them'} to finish, then send this one again.`,
      ),
    );
  }
  running.set(userId, now + 1);
  const gone = new AbortController();
  res.locals['clientGone'] = gone.signal;
  let freed = false;
  res.on('close', () => {
    if (!res.writableFinished) gone.abort();
    if (freed) return;
    freed = true;
    const left = (running.get(userId) ?? 1) - 1;
    if (left > 0) running.set(userId, left);
    else running.delete(userId);
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
