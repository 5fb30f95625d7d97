import { HttpError } from './http-error';

/**
 * Database errors reach us wrapped (drizzle's "Failed query" error has the driver's error as its
 * cause); these helpers look through the wrapping for the driver's code.
 */
interface DriverError {
  code?: unknown;
  errno?: unknown;
  message?: unknown;
  cause?: unknown;
}

/** The error and its causes, outermost first, at most five deep (a cycle of causes cannot loop). */
function* causeChain(err: unknown): Generator<DriverError> {
  for (let e = err as DriverError | undefined, depth = 0; e && depth < 5; e = e.cause as DriverError | undefined, depth++) yield e;
}

export function dbErrorCode(err: unknown): string | undefined {
  for (const e of causeChain(err)) if (typeof e.code === 'string' && e.code) return e.code;
  return undefined;
}

/** The database went away or was restarted under us: the client may simply try again. */
const UNAVAILABLE = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_SERVER_SHUTDOWN',
  'ER_CONNECTION_KILLED',
  'ER_QUERY_INTERRUPTED',
  'ER_CON_COUNT_ERROR',
  'ER_CANT_CONNECT_TO_SERVER',
]);
const BUSY = new Set(['POOL_ACQUIRE_TIMEOUT', 'ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT', 'ER_STATEMENT_TIMEOUT']);

/** The answer for a database error that is not a bug: 503 with what to do, or 409 for a duplicate. */
export function databaseAnswer(err: unknown): HttpError | undefined {
  const code = dbErrorCode(err);
  if (!code && poolClosed(err)) {
    // The process is stopping and its pool is gone; another web process (or this one, restarted) serves the retry.
    return new HttpError(503, 'busy', 'The server is restarting. Nothing you saved is lost; try again in a few seconds.');
  }
  if (!code) return undefined;
  if (code === 'ER_DUP_ENTRY') return new HttpError(409, 'duplicate', 'That already exists.');
  if (UNAVAILABLE.has(code) || /^ER_.*(CONNECTION|SHUTDOWN)/.test(code)) {
    return new HttpError(
      503,
      'database_unavailable',
      'The database is not reachable right now. Nothing you saved is lost; try again in a minute.',
    );
  }
  if (BUSY.has(code)) {
    return new HttpError(503, 'busy', 'The server is busy with other work right now. Try again in a few seconds.');
  }
  return undefined;
}

/** The driver's refusal after pool.end(): it carries no code, only this message (also as a cause). */
function poolClosed(err: unknown): boolean {
  for (const e of causeChain(err)) if (e.message === 'Pool is closed.') return true;
  return false;
}
